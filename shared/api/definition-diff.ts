/**
 * Field-by-field differences between two versions of a definition: both are flattened to dotted
 * paths ("tolerances.magnitudeDb", "modes.1.dampingRatio") with their leaf values, then compared.
 * Pure; used by every version history.
 */

export type Leaf = string | number | boolean | null;

export interface FieldChange {
  path: string;
  before: Leaf | undefined;
  after: Leaf | undefined;
  kind: 'added' | 'removed' | 'changed';
}

/** Leaves of a JSON value by dotted path; an empty array or object is a leaf of its own ("[]", "{}"). */
export function flatten(value: unknown, prefix = '', out = new Map<string, Leaf>()): Map<string, Leaf> {
  if (value === undefined) return out;
  if (value === null || typeof value !== 'object') {
    out.set(prefix, value as Leaf);
    return out;
  }
  const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
  if (entries.length === 0) {
    out.set(prefix, Array.isArray(value) ? '[]' : '{}');
    return out;
  }
  for (const [key, v] of entries) flatten(v, prefix ? `${prefix}.${key}` : key, out);
  return out;
}

/** Every path whose value differs, in the order of `after` then the removed ones. */
export function diffDefinitions(before: unknown, after: unknown): FieldChange[] {
  const a = flatten(before);
  const b = flatten(after);
  const changes: FieldChange[] = [];
  for (const [path, v] of b) {
    if (!a.has(path)) changes.push({ path, before: undefined, after: v, kind: 'added' });
    else if (!Object.is(a.get(path), v)) changes.push({ path, before: a.get(path), after: v, kind: 'changed' });
  }
  for (const [path, v] of a) if (!b.has(path)) changes.push({ path, before: v, after: undefined, kind: 'removed' });
  return changes;
}

/** A leaf as text for the table: strings quoted only when empty. */
export function leafText(v: Leaf | undefined): string {
  if (v === undefined) return '—';
  if (v === null) return 'null';
  if (typeof v === 'string') return v === '' ? '""' : v;
  return String(v);
}
