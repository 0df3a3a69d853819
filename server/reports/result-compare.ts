/**
 * Line-by-line comparison of stored results with recomputed ones. A value is
 * - identical: the same double (Object.is; NaN equals NaN), or the same text / flag;
 * - within tolerance: both finite and |a − b| ≤ tol · max(1, |a|, |b|) (relative for large
 *   values, absolute near zero);
 * - changed: otherwise. A non-finite value against a different one, a flag or a text that differs,
 *   or a value present on one side only is "not comparable": changed with a null difference,
 *   which ranks above every finite difference.
 */
export type Verdict = 'identical' | 'within-tolerance' | 'changed';
export type Leaf = number | string | boolean | null;

export interface LineComparison {
  values: number;
  verdict: Verdict;
  /** Largest |difference|, null when the worst value is not comparable. */
  maxDifference: number | null;
  /** Index (curves) or path (trees) of the worst value; null when nothing differs. */
  at: number | string | null;
  stored: Leaf;
  recomputed: Leaf;
}

const RANK: Record<Verdict, number> = { identical: 0, 'within-tolerance': 1, changed: 2 };

function compareLeaf(a: Leaf | undefined, b: Leaf | undefined, tol: number): { verdict: Verdict; difference: number | null } {
  if (typeof a === 'number' && typeof b === 'number') {
    if (Object.is(a, b)) return { verdict: 'identical', difference: 0 };
    if (!Number.isFinite(a) || !Number.isFinite(b)) return { verdict: 'changed', difference: null };
    const d = Math.abs(a - b);
    return { verdict: d <= tol * Math.max(1, Math.abs(a), Math.abs(b)) ? 'within-tolerance' : 'changed', difference: d };
  }
  return a === b ? { verdict: 'identical', difference: 0 } : { verdict: 'changed', difference: null };
}

/** Whether (verdict, difference) is worse than the current worst. */
function worse(v: Verdict, d: number | null, w: LineComparison): boolean {
  if (RANK[v] !== RANK[w.verdict]) return RANK[v] > RANK[w.verdict];
  if (v === 'identical') return false;
  if (w.maxDifference === null) return false;
  return d === null || d > w.maxDifference;
}

function compareMany(pairs: Iterable<[number | string, Leaf | undefined, Leaf | undefined]>, tol: number): LineComparison {
  const out: LineComparison = { values: 0, verdict: 'identical', maxDifference: 0, at: null, stored: null, recomputed: null };
  for (const [at, a, b] of pairs) {
    out.values++;
    const c = compareLeaf(a, b, tol);
    if (worse(c.verdict, c.difference, out)) Object.assign(out, { verdict: c.verdict, maxDifference: c.difference, at, stored: a ?? null, recomputed: b ?? null });
  }
  return out;
}

/** Compares two arrays value by value (a length mismatch makes the extra values not comparable). */
export function compareArrays(stored: ArrayLike<number>, now: ArrayLike<number>, tol: number): LineComparison {
  const n = Math.max(stored.length, now.length);
  function* pairs(): Generator<[number, Leaf | undefined, Leaf | undefined]> {
    for (let i = 0; i < n; i++) yield [i, i < stored.length ? stored[i]! : undefined, i < now.length ? now[i]! : undefined];
  }
  return compareMany(pairs(), tol);
}

/** The leaves of a JSON value by path ("criteria.0.observed"). */
export function leaves(value: unknown, prefix = '', out = new Map<string, Leaf>()): Map<string, Leaf> {
  if (value === null || typeof value !== 'object') out.set(prefix, value === undefined ? null : (value as Leaf));
  else if (Array.isArray(value)) value.forEach((v, i) => leaves(v, prefix ? `${prefix}.${i}` : String(i), out));
  else for (const [k, v] of Object.entries(value)) leaves(v, prefix ? `${prefix}.${k}` : k, out);
  return out;
}

/**
 * Compares two JSON values leaf by leaf (both sides' paths; with storedPathsOnly, the stored side's
 * paths only, for figures a newer engine adds — but a stored tree that is absent entirely still counts).
 */
export function compareTrees(stored: unknown, now: unknown, tol: number, opts: { storedPathsOnly?: boolean } = {}): LineComparison {
  const a = leaves(stored);
  const b = leaves(now);
  const only = opts.storedPathsOnly && stored !== null && stored !== undefined;
  const paths = [...new Set([...a.keys(), ...(only ? [] : b.keys())])].sort();
  return compareMany(paths.map((p) => [p, a.get(p), b.get(p)] as [string, Leaf | undefined, Leaf | undefined]), tol);
}
