/**
 * Paging, sorting and name filtering of lab lists, done in SQL so that a long list never travels
 * whole. Sort keys are whitelisted per list (a key maps to a column); ties break on the id so the
 * order is total and pages never overlap.
 */
import type { Knex } from 'knex';

export interface ListQuery {
  limit: number;
  offset: number;
  /** A key of the list's sort map. */
  sort: string;
  order: 'asc' | 'desc';
  q?: string;
}

/** `LIKE` pattern matching `q` anywhere, with % _ and \ taken literally (ESCAPE '\'). */
export function containsPattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** Applies filter (on `nameColumn`), sort and paging; returns the page and the filtered total. */
export async function pageOf<T>(
  base: Knex.QueryBuilder,
  query: ListQuery,
  opts: { sortColumns: Record<string, string>; nameColumn: string; idColumn: string; select: string[] },
): Promise<{ rows: T[]; total: number }> {
  const filtered = base.clone();
  if (query.q) filtered.whereRaw(`${opts.nameColumn} like ? escape '\\'`, [containsPattern(query.q)]);
  const countRow = (await filtered.clone().clearSelect().count({ n: '*' }).first()) as { n: number | string } | undefined;
  const column = opts.sortColumns[query.sort];
  if (!column) throw new Error(`sort key ${query.sort} is not in the list's sort map`);
  const dir = query.order === 'desc' ? 'desc' : 'asc';
  const rows = (await filtered
    .select(opts.select)
    // Sort expressions come from the whitelist above, never from the request.
    .orderByRaw(`${column} ${dir}, ${opts.idColumn} ${dir}`)
    .limit(query.limit)
    .offset(query.offset)) as T[];
  return { rows, total: Number(countRow?.n ?? 0) };
}
