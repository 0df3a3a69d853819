/**
 * CSV in and out for the CLI. Reading: a header row, then one numeric row per sample or line
 * (comma separated; blank lines skipped, and rows of empty cells at the end), parsed with
 * papaparse. Writing: numbers in the shortest text that reads back to the same double
 * (`String(x)`, round-trip exact, up to 17 significant digits); non-finite values are written as
 * `NaN`, `Infinity` or `-Infinity`.
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { CliInputError } from './args';

/** A numeric table: the header's column names and one Float64Array per column. */
export interface NumericTable {
  columns: string[];
  data: Record<string, Float64Array>;
  rowCount: number;
}

/**
 * Reads a CSV file with a header row. Every cell must be a finite number, unless
 * `allowNonFinite` lets through the `NaN`, `Infinity` and `-Infinity` this module writes (an
 * estimate has them where a spectrum is zero, e.g. at 0 Hz after mean removal).
 */
export function readNumericCsv(path: string, what: string, allowNonFinite = false): NumericTable {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new CliInputError(`${what}: cannot read "${path}" (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  return parseNumericCsv(text, `${what} "${path}"`, allowNonFinite);
}

const NON_FINITE = new Set(['NaN', 'Infinity', '-Infinity']);

/** Parses CSV text with a header row into numeric columns; `where` names the source in errors. */
export function parseNumericCsv(text: string, where: string, allowNonFinite = false): NumericTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const fatal = parsed.errors.find((e) => e.type !== 'Delimiter');
  if (fatal) throw new CliInputError(`${where}: CSV error on row ${(fatal.row ?? 0) + 1}: ${fatal.message}`);
  // Skip blank lines, and rows of empty cells (",,") only at the end (spreadsheets write them):
  // inside the data such a row is a missing sample, refused below, not dropped as papaparse's
  // 'greedy' mode would.
  const rows = parsed.data.filter((row) => !(row.length === 1 && row[0]!.trim() === ''));
  while (rows.length > 0 && rows[rows.length - 1]!.every((cell) => cell.trim() === '')) rows.pop();
  if (rows.length < 2) throw new CliInputError(`${where}: needs a header row and at least one data row`);
  const columns = rows[0]!.map((name) => name.trim());
  const seen = new Set<string>();
  for (const name of columns) {
    if (name === '') throw new CliInputError(`${where}: empty column name in the header row`);
    if (seen.has(name)) throw new CliInputError(`${where}: column "${name}" appears twice in the header row`);
    // A file without its header would otherwise lose its first sample as column names.
    if (!Number.isNaN(Number(name))) throw new CliInputError(`${where}: row 1 must be a header of column names, found the number ${name}`);
    seen.add(name);
  }
  const rowCount = rows.length - 1;
  const data: Record<string, Float64Array> = {};
  for (const name of columns) data[name] = new Float64Array(rowCount);
  for (let r = 0; r < rowCount; r++) {
    const row = rows[r + 1]!;
    if (row.length !== columns.length) {
      throw new CliInputError(`${where}: row ${r + 2} has ${row.length} cells, the header has ${columns.length}`);
    }
    for (let c = 0; c < columns.length; c++) {
      const cell = row[c]!.trim();
      const value = cell === '' ? Number.NaN : Number(cell);
      if (!Number.isFinite(value) && !(allowNonFinite && NON_FINITE.has(cell))) {
        throw new CliInputError(`${where}: row ${r + 2}, column "${columns[c]}": "${cell}" is not a finite number`);
      }
      data[columns[c]!]![r] = value;
    }
  }
  return { columns, data, rowCount };
}

/** The named column of a table, or a clear error listing the columns there are. */
export function requireColumn(table: NumericTable, name: string, where: string): Float64Array {
  const column = table.data[name];
  if (!column) {
    throw new CliInputError(`${where}: no column "${name}" (columns: ${table.columns.join(', ')})`);
  }
  return column;
}

/** Shortest round-trip text of a double (same as `repr` in Python for finite values). */
export function formatNumber(value: number): string {
  return String(value);
}

/** Formats columns as CSV text with a header row; all columns must have the same length. */
export function formatCsv(columns: string[], data: ArrayLike<number>[]): string {
  if (columns.length !== data.length) throw new Error('formatCsv: one data array per column');
  const n = data.length > 0 ? data[0]!.length : 0;
  for (const column of data) if (column.length !== n) throw new Error('formatCsv: columns differ in length');
  const lines = new Array<string>(n + 1);
  lines[0] = columns.join(',');
  const cells = new Array<string>(columns.length);
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < data.length; c++) cells[c] = formatNumber(data[c]![r]!);
    lines[r + 1] = cells.join(',');
  }
  return lines.join('\n') + '\n';
}
