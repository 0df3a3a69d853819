/**
 * Reading an uploaded CSV file into numeric columns: a header row of column names, then one row
 * of numbers per sample or frequency line. Every problem is a 400 naming the line (1 = the header)
 * and the column, so the lab can fix its file: `line 7, column "output": "1,2e" is not a number`.
 */
import Papa from 'papaparse';
import { AppError } from '../errors';

export interface NumericTable {
  /** Column names as in the header (trimmed). */
  columns: string[];
  data: Map<string, Float64Array>;
  rows: number;
}

/** At most this many characters of a name from the file are echoed back in a message. */
const ECHO_CHARS = 40;
/** At most this many column names are listed in a message (a header may have 200 000). */
const ECHO_COLUMNS = 12;

/** A name from the file, cut to ECHO_CHARS so a message never grows with the file. */
export const echo = (name: string) => (name.length > ECHO_CHARS ? `${name.slice(0, ECHO_CHARS)}…` : name);

/** "a", "b", … and N more: the header's names as a message lists them. */
export function listColumns(columns: string[]): string {
  const shown = columns.slice(0, ECHO_COLUMNS).map((c) => `"${echo(c)}"`).join(', ');
  return columns.length > ECHO_COLUMNS ? `${shown} and ${columns.length - ECHO_COLUMNS} more` : shown;
}

/** A 400 for a bad file, with where it went wrong in `details` (names from the file cut short). */
export function badFile(message: string, place: { line?: number; column?: string } = {}): AppError {
  const where = place.column === undefined ? place : { ...place, column: echo(place.column) };
  const at = [where.line !== undefined ? `line ${where.line}` : '', where.column ? `column "${where.column}"` : '']
    .filter(Boolean)
    .join(', ');
  return new AppError(400, 'bad_file', at ? `${at}: ${message}` : message, where);
}

/** Parses CSV text (comma, semicolon or tab separated, detected) with a header row. */
export function readNumericTable(text: string, opts: { maxRows: number; minRows: number }): NumericTable {
  if (text.includes('\u0000')) throw badFile('the file is not a text CSV file (it holds NUL bytes)');
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const fatal = parsed.errors.find((e) => e.type !== 'Delimiter');
  if (fatal) throw badFile(fatal.message, { line: (fatal.row ?? 0) + 1 });
  const records = parsed.data;
  // Drop blank records at the end only; a blank line in the middle is reported below.
  let last = records.length;
  while (last > 0 && isBlank(records[last - 1])) last--;
  if (last === 0) throw badFile('the file is empty');
  const columns = records[0].map((c) => c.trim());
  const seen = new Set<string>();
  columns.forEach((name, i) => {
    if (name === '') throw badFile(`column ${i + 1} has no name in the header row`, { line: 1 });
    if (seen.has(name)) throw badFile(`column "${echo(name)}" appears twice in the header row`, { line: 1 });
    if (!Number.isNaN(Number(name))) throw badFile(`the first row must be a header of column names, found the number ${echo(name)}`, { line: 1 });
    seen.add(name);
  });
  const rows = last - 1;
  if (rows < opts.minRows) throw badFile(`needs at least ${opts.minRows} data rows, found ${rows}`);
  if (rows > opts.maxRows) throw badFile(`holds ${rows} data rows, more than the ${opts.maxRows} allowed`);
  const arrays = columns.map(() => new Float64Array(rows));
  for (let r = 0; r < rows; r++) {
    const record = records[r + 1];
    const line = r + 2;
    if (record.length !== columns.length) {
      throw badFile(`has ${record.length} cells, the header has ${columns.length}`, { line });
    }
    for (let c = 0; c < columns.length; c++) {
      const cell = record[c].trim();
      const value = cell === '' ? NaN : Number(cell);
      if (!Number.isFinite(value)) {
        throw badFile(cell === '' ? 'the cell is empty' : `"${cell.slice(0, 40)}" is not a finite number`, { line, column: columns[c] });
      }
      arrays[c][r] = value;
    }
  }
  return { columns, data: new Map(columns.map((name, i) => [name, arrays[i]])), rows };
}

/** The named column, or a 400 listing the columns the file has. */
export function column(table: NumericTable, name: string): Float64Array {
  const found = table.data.get(name);
  if (!found) throw badFile(`no column "${echo(name)}"; the header has ${listColumns(table.columns)}`, { line: 1 });
  return found;
}

/**
 * Values whose squares and products stay finite and above the denormal range in float64
 * (about 1e±308): a channel whose largest magnitude lies outside [1e-150, 1e150], or is zero,
 * cannot give a spectrum, so the upload is refused naming the column.
 */
export const USABLE_MAGNITUDE = { min: 1e-150, max: 1e150 };

export function requireUsableChannel(values: Float64Array, name: string): void {
  let peak = 0;
  for (let i = 0; i < values.length; i++) peak = Math.max(peak, Math.abs(values[i]));
  if (peak === 0) throw badFile('every value is zero, so no spectrum can be formed', { column: name });
  if (peak > USABLE_MAGNITUDE.max) throw badFile(`values reach ${peak.toPrecision(3)}; above ${USABLE_MAGNITUDE.max} the spectra overflow. Rescale the column`, { column: name });
  if (peak < USABLE_MAGNITUDE.min) throw badFile(`every value is below ${USABLE_MAGNITUDE.min} in size; the spectra would underflow. Rescale the column`, { column: name });
}

function isBlank(record: string[] | undefined): boolean {
  return !record || record.every((c) => c.trim() === '');
}
