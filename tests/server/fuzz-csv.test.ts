/**
 * Property-based tests of both CSV readers: server/services/csv-read.ts (uploads, AppError
 * 'bad_file' naming line and column) and server/cli/csv.ts (the CLI, CliInputError naming the row).
 *
 * 1. Files built from a model (header names with quotes, commas, unicode; finite numbers written
 *    round-trip; LF or CRLF; optional BOM) are read back exactly.
 * 2. The same files with one known defect (ragged row, non-numeric or empty cell, NaN/Infinity,
 *    no header, empty or repeated column name, unterminated quote) are refused by both readers
 *    with the reader's own error, at the defect's line.
 * 3. Arbitrary text mixing commas, quotes, CR/LF, BOMs and numbers: the readers either return a
 *    consistent all-finite table or throw their own error; never anything else.
 * The seed is fixed and printed (FUZZ_SEED=... to change it).
 */
import fc from 'fast-check';
import { AppError } from '@/server/errors';
import { CliInputError } from '@/server/cli/args';
import { parseNumericCsv } from '@/server/cli/csv';
import { readNumericTable } from '@/server/services/csv-read';
import { FUZZ_SEED } from './fuzz-support';

const RUNS = Number(process.env.FUZZ_RUNS ?? 300);
const opts = { minRows: 1, maxRows: 10_000 };

beforeAll(() => {
  console.log(`fuzz-csv: seed ${FUZZ_SEED}, ${RUNS} runs per property`);
});

/** RFC 4180 quoting: a field with a comma, quote, CR or LF is quoted and its quotes doubled. */
const quote = (cell: string) => (/[",\r\n]/.test(cell) || cell !== cell.trim() ? `"${cell.replace(/"/g, '""')}"` : cell);

const nameArb = fc
  .oneof(
    fc.stringMatching(/^[a-z][a-z0-9_ ]{0,11}$/),
    fc.constantFrom('force (N)', 'accel, m/s²', 'he said "x"', 'שלום', '📈 out', 'e\u0301', 'line\nbreak', '<script>', "'; DROP TABLE x; --"),
  )
  .filter((n) => n.trim() !== '' && Number.isNaN(Number(n.trim())));

interface Model {
  names: string[];
  rows: number[][];
  eol: string;
  bom: boolean;
}

const modelArb: fc.Arbitrary<Model> = fc
  .uniqueArray(nameArb, { minLength: 1, maxLength: 4, selector: (n) => n.trim() })
  .chain((names) =>
    fc.record({
      names: fc.constant(names),
      rows: fc.array(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { minLength: names.length, maxLength: names.length }), { minLength: 1, maxLength: 20 }),
      eol: fc.constantFrom('\n', '\r\n'),
      bom: fc.boolean(),
    }),
  );

const render = (m: { names: string[]; cells: string[][]; eol: string; bom: boolean }) =>
  (m.bom ? '\uFEFF' : '') + [m.names.map(quote).join(','), ...m.cells.map((r) => r.join(','))].join(m.eol) + m.eol;

/** Round-trip text of a double, keeping the sign of zero (String(-0) is "0"). */
const num = (x: number) => (Object.is(x, -0) ? '-0' : String(x));
const cellsOf = (m: Model) => m.rows.map((r) => r.map(num));

describe('a well-formed file is read back exactly', () => {
  it('by both readers', () => {
    fc.assert(
      fc.property(modelArb, (m) => {
        const text = render({ ...m, cells: cellsOf(m) });
        const upload = readNumericTable(text, opts);
        const cli = parseNumericCsv(text, 'fuzz');
        const names = m.names.map((n) => n.trim());
        expect(upload.columns).toEqual(names);
        expect(cli.columns).toEqual(names);
        expect(upload.rows).toBe(m.rows.length);
        names.forEach((n, c) => {
          const expected = Float64Array.from(m.rows.map((r) => r[c]!));
          expect(upload.data.get(n)).toEqual(expected);
          expect(cli.data[n]).toEqual(expected);
        });
      }),
      { numRuns: RUNS, seed: FUZZ_SEED },
    );
  });
});

type Defect = 'empty-row' | 'ragged-short' | 'ragged-long' | 'text' | 'empty' | 'nan' | 'infinity' | 'comma-decimal' | 'no-header' | 'empty-name' | 'repeated-name' | 'open-quote';
const defectArb = fc.constantFrom<Defect>('empty-row', 'ragged-short', 'ragged-long', 'text', 'empty', 'nan', 'infinity', 'comma-decimal', 'no-header', 'empty-name', 'repeated-name', 'open-quote');

/** A model file with one defect, and the 1-based line where it is. */
function withDefect(m: Model, defect: Defect, pick: number): { text: string; line: number } {
  const names = [...m.names];
  const cells = cellsOf(m);
  const r = pick % cells.length;
  const c = pick % names.length;
  let line = r + 2;
  switch (defect) {
    case 'ragged-short': cells[r] = names.length > 1 ? cells[r]!.slice(1) : [...cells[r]!, '1']; break;
    // A row of empty cells (",,"): a missing sample, not a blank line. One column: see 'empty'.
    // Both readers drop such rows at the end (spreadsheets write them), so it goes before the last.
    case 'empty-row': { const at = cells.length > 1 ? r % (cells.length - 1) : 0; cells[at] = names.map(() => (names.length > 1 ? '' : '""')); line = at + 2; break; }
    case 'ragged-long': cells[r] = [...cells[r]!, '1']; break;
    case 'text': cells[r]![c] = 'abc'; break;
    // One column: an empty last cell would be a blank last line (dropped), so put it in row 1.
    case 'empty': if (names.length > 1) cells[r]![c] = ''; else { cells[0]![0] = '""'; line = 2; } break;
    case 'nan': cells[r]![c] = 'NaN'; break;
    case 'infinity': cells[r]![c] = '-Infinity'; break;
    case 'comma-decimal': cells[r]![c] = '"1,5"'; break;
    case 'no-header': return { text: render({ ...m, names: m.rows[0]!.map(num), cells: cells.slice(1).length ? cells.slice(1) : cells }), line: 1 };
    case 'empty-name': names[c] = ' '; line = 1; break;
    case 'repeated-name': names.push(names[0]!); for (const row of cells) row.push('0'); line = 1; break;
    case 'open-quote': cells[r]![c] = `"${cells[r]![c]}`; break;
  }
  return { text: render({ ...m, names, cells }), line };
}

function thrown(fn: () => unknown): unknown {
  try {
    fn();
  } catch (err) {
    return err;
  }
  return undefined;
}

describe('a file with one defect is refused at its line', () => {
  it('by the upload reader (AppError bad_file, line in details)', () => {
    fc.assert(
      fc.property(modelArb, defectArb, fc.nat(), (m, defect, pick) => {
        const { text, line } = withDefect(m, defect, pick);
        const err = thrown(() => readNumericTable(text, opts));
        expect(err).toBeInstanceOf(AppError);
        expect((err as AppError).code).toBe('bad_file');
        expect((err as AppError).status).toBe(400);
        // An unterminated quote swallows the rest of the file: papaparse reports where it opened.
        // A one-column, one-row file whose cell is empty is a blank line: refused as too few rows.
        const trailingBlank = (defect === 'empty' && m.names.length === 1 && m.rows.length === 1) || (defect === 'empty-row' && m.rows.length === 1);
        if (trailingBlank) expect((err as AppError).message).toMatch(/data rows/);
        else if (defect !== 'open-quote') expect((err as AppError).details).toMatchObject({ line });
        else expect((err as AppError).message).toMatch(/^line \d+/);
      }),
      { numRuns: RUNS, seed: FUZZ_SEED },
    );
  });

  it('by the CLI reader (CliInputError naming the row)', () => {
    fc.assert(
      fc.property(modelArb, defectArb, fc.nat(), (m, defect, pick) => {
        // One column: an empty cell is a blank line, which the CLI skips by design (server/cli/csv.ts).
        fc.pre(!((defect === 'empty' || defect === 'empty-row') && m.names.length === 1));
        const { text, line } = withDefect(m, defect, pick);
        const err = thrown(() => parseNumericCsv(text, 'fuzz'));
        expect(err).toBeInstanceOf(CliInputError);
        const trailingBlank = (defect === 'empty' && m.names.length === 1 && m.rows.length === 1) || (defect === 'empty-row' && m.rows.length === 1);
        if (line > 1 && defect !== 'open-quote' && !trailingBlank) expect((err as Error).message).toContain(`row ${line}`);
      }),
      { numRuns: RUNS, seed: FUZZ_SEED },
    );
  });
});

const pieces = fc.constantFrom(',', ';', '\t', '"', '""', '\r', '\n', '\r\n', '\uFEFF', ' ', '1', '-2.5e3', '0x1F', 'NaN', 'Infinity', 'a', 'time_s', 'é', '\u0000', '');
const messyText = fc.oneof(fc.array(pieces, { maxLength: 60 }).map((p) => p.join('')), fc.string({ unit: 'binary', maxLength: 200 }));

describe('arbitrary text', () => {
  it('is either a consistent all-finite table or the reader\'s own error', () => {
    fc.assert(
      fc.property(messyText, (text) => {
        for (const [read, ErrorType] of [
          [() => { const t = readNumericTable(text, opts); return { columns: t.columns, cols: t.columns.map((n) => t.data.get(n)!), rows: t.rows }; }, AppError],
          [() => { const t = parseNumericCsv(text, 'fuzz'); return { columns: t.columns, cols: t.columns.map((n) => t.data[n]!), rows: t.rowCount }; }, CliInputError],
        ] as const) {
          let table: ReturnType<typeof read> | undefined;
          try {
            table = read();
          } catch (err) {
            expect(err).toBeInstanceOf(ErrorType);
            continue;
          }
          expect(table.rows).toBeGreaterThanOrEqual(1);
          expect(new Set(table.columns).size).toBe(table.columns.length);
          for (const name of table.columns) expect(name.trim()).not.toBe('');
          for (const col of table.cols) {
            expect(col.length).toBe(table.rows);
            expect(col.every(Number.isFinite)).toBe(true);
          }
        }
      }),
      { numRuns: RUNS * 2, seed: FUZZ_SEED },
    );
  });
});
