/** Plain-text tables for terminal output: numbers right-aligned, words left-aligned. */

export type Align = 'left' | 'right';

/** Formats rows under a header with two spaces between columns. */
export function formatTable(header: string[], rows: string[][], align?: Align[]): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((row) => (row[c] ?? '').length)));
  const pad = (cell: string, c: number): string =>
    (align?.[c] ?? 'left') === 'right' ? cell.padStart(widths[c]!) : cell.padEnd(widths[c]!);
  const line = (cells: string[]): string => cells.map((cell, c) => pad(cell, c)).join('  ').trimEnd();
  const rule = widths.map((w) => '-'.repeat(w)).join('  ');
  return [line(header), rule, ...rows.map(line)].join('\n') + '\n';
}

/** A number with a fixed count of significant digits for tables (full precision goes to CSV/JSON). */
export function formatShort(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-3) return value.toExponential(digits - 1);
  return Number(value.toPrecision(digits)).toString();
}

/** JSON with non-finite numbers written as null and typed arrays as plain arrays. */
export function toJson(value: unknown): string {
  return (
    JSON.stringify(
      value,
      (_key, v: unknown) => {
        if (typeof v === 'number' && !Number.isFinite(v)) return null;
        if (ArrayBuffer.isView(v) && !(v instanceof DataView)) return Array.from(v as unknown as ArrayLike<number>);
        return v;
      },
      2,
    ) + '\n'
  );
}
