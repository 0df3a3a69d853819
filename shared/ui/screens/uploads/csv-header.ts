/** The column names of a CSV file, from its first line (quoted names allowed), read in the browser. */
export function headerColumns(firstLine: string): string[] {
  const out: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < firstLine.length; i++) {
    const ch = firstLine[i];
    if (quoted) {
      if (ch === '"' && firstLine[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',' || ch === ';' || ch === '\t') {
      out.push(cell.trim());
      cell = '';
    } else cell += ch;
  }
  out.push(cell.trim());
  return out.filter((c) => c !== '');
}

/** Reads the first line of a file (at most 64 KiB of it). */
export async function readHeader(file: Blob): Promise<string[]> {
  const text = await file.slice(0, 65536).text();
  const first = text.replace(/^\uFEFF/, '').split(/\r?\n/).find((line) => line.trim() !== '' && !line.startsWith('#')) ?? '';
  return headerColumns(first);
}

/** The column to preselect: the expected name if the file has it, else the n-th column. */
export function guessColumn(columns: string[], wanted: string, fallbackIndex: number): string | undefined {
  return columns.find((c) => c.toLowerCase() === wanted) ?? columns[fallbackIndex];
}
