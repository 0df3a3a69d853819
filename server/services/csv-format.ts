/**
 * CSV writing for exports (RFC 4180: comma separated, CRLF line ends, a cell holding a comma,
 * quote or line break is quoted with inner quotes doubled).
 *
 * Formula injection: a spreadsheet runs a text cell that starts with = + - @ (and, in some
 * programs, a tab or carriage return) as a formula. Such text cells get a leading apostrophe,
 * which spreadsheets show as plain text (the OWASP "CSV Injection" guidance). Numbers are written
 * as numbers, in the shortest text that reads back to the same double (`String(x)`), so a
 * negative number stays a number; NaN and ±Infinity are written as empty cells.
 */

export type CsvCell = string | number | boolean | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;

/** One cell as CSV text (see the module doc for the escaping rules). */
export function formatCsvCell(cell: CsvCell): string {
  if (cell === null || cell === undefined) return '';
  // A non-finite number (an undefined score) is an empty cell: "-Infinity" would read as a formula.
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
  if (typeof cell === 'boolean') return cell ? 'true' : 'false';
  const text = FORMULA_START.test(cell) ? `'${cell}` : cell;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A whole CSV document: header row, then the rows, CRLF after every row. */
export function formatCsv(header: readonly string[], rows: Iterable<readonly CsvCell[]>): string {
  const lines = [header.map(formatCsvCell).join(',')];
  for (const row of rows) lines.push(row.map(formatCsvCell).join(','));
  return lines.join('\r\n') + '\r\n';
}
