/**
 * What changed between two revisions of a report, in words a reader of the report understands:
 * the standard's status, the recipe version's state, the evidence check, the engine version, each
 * study whose results differ, each settings row that differs, and any other section by its name.
 */
import type { ReportContent } from '@/shared/api/approval';
import { canonicalJson } from '../services/audit';

const same = (a: unknown, b: unknown) => canonicalJson(a ?? null) === canonicalJson(b ?? null);

const SECTION_WORDS: Partial<Record<keyof ReportContent, string>> = {
  title: 'the title',
  lab: "the lab's name or report footer",
  purpose: 'the purpose',
  scope: 'the scope',
  justification: 'the justification of failed criteria',
  signature: 'the signature',
  reproducibility: 'the reproducibility statement',
  cautions: 'the cautions',
  kind: 'the kind of report',
};

function standardChanges(a: ReportContent['standard'], b: ReportContent['standard']): string[] {
  if (same(a, b)) return [];
  if (!a || !b) return ['the standard it reports on'];
  const out: string[] = [];
  if (a.status !== b.status) out.push(`standard status: ${a.status} → ${b.status}`);
  if (a.supersededBy !== b.supersededBy) out.push(`superseded by: ${a.supersededBy ?? 'nothing'} → ${b.supersededBy ?? 'nothing'}`);
  if (a.reviewDueAt !== b.reviewDueAt || a.effectiveAt !== b.effectiveAt || a.supersedes !== b.supersedes) out.push("the standard's dates or predecessor");
  return out.length ? out : ["the standard's record"];
}

function studyChanges(a: ReportContent['studies'], b: ReportContent['studies']): string[] {
  if (same(a, b)) return [];
  const before = new Map(a.map((s) => [s.id, s]));
  const out: string[] = [];
  for (const s of b) {
    const old = before.get(s.id);
    if (!old) out.push(`study "${s.name}" added to the evidence`);
    else if (!same(old, s)) out.push(`results of study "${s.name}"`);
    before.delete(s.id);
  }
  for (const s of before.values()) out.push(`study "${s.name}" removed from the evidence`);
  return out;
}

function settingsChanges(a: ReportContent['settings'], b: ReportContent['settings']): string[] {
  if (same(a, b)) return [];
  const before = new Map((a?.rows ?? []).map((r) => [r.id, r]));
  const out: string[] = [];
  for (const r of b?.rows ?? []) {
    const old = before.get(r.id);
    if (!old) out.push(`settings: ${r.label} added`);
    else if (!same(old, r)) out.push(`settings: ${r.label} ${old.value} → ${r.value}${r.unit ? ` ${r.unit}` : ''}`);
    before.delete(r.id);
  }
  for (const r of before.values()) out.push(`settings: ${r.label} removed`);
  return out.length ? out : ['the settings summary'];
}

/** The changes from `before` (null: a revision recorded before contents were stored) to `after`. */
export function reportChanges(before: ReportContent | null, after: ReportContent): string[] {
  if (!before) return ['content changed (the revision before was recorded without its content, so the difference cannot be listed)'];
  const out: string[] = [];
  if (before.recipe.state !== after.recipe.state) out.push(`recipe version state: ${before.recipe.state.replace('_', ' ')} → ${after.recipe.state.replace('_', ' ')}`);
  else if (!same(before.recipe, after.recipe)) out.push('the recipe version');
  out.push(...standardChanges(before.standard, after.standard));
  if (!same(before.evidenceCheck, after.evidenceCheck)) {
    const words = (c: ReportContent['evidenceCheck']) => (c ? (c.matchesSignature ? 'matches the signature' : 'does not match the signature') : 'none');
    out.push(`evidence check: ${words(before.evidenceCheck)} → ${words(after.evidenceCheck)}`);
  }
  const engineMoved = before.engineVersion !== after.engineVersion;
  if (engineMoved) out.push(`engine version: ${before.engineVersion} → ${after.engineVersion}`);
  out.push(...studyChanges(before.studies, after.studies));
  out.push(...settingsChanges(before.settings, after.settings));
  for (const [key, words] of Object.entries(SECTION_WORDS) as [keyof ReportContent, string][]) {
    if (key === 'reproducibility' && engineMoved) continue; // it names the engine version
    if (!same(before[key], after[key])) out.push(words);
  }
  return out.length ? out : ['the layout of the content'];
}
