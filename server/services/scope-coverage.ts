/**
 * Does the evidence cover the declared scope? Checked on the scenarios of the evidence studies
 * (their known-answer systems, excitations and bands) against the recipe and the scope:
 * 1. the scope's band lies inside the recipe's band (the recipe is scored only there);
 * 2. every excitation kind of the scope is used by at least one scenario;
 * 3. the excitation bands of the scenarios whose kind is in the scope together cover the scope's
 *    band (an impact counts as exciting 0 … 1/T for a half-sine pulse of duration T: a rule of
 *    thumb, common practice in impact testing, no single published source);
 * 4. at least one mode of those scenarios' systems lies inside the scope's band;
 * 5. those in-band modes reach both ends of the scope's damping range (lightest ≤ min,
 *    heaviest ≥ max): a recipe shown on 1 % damping says nothing about 0.5 %.
 * The structure type is the lab's own label and is not checked numerically.
 */
import type { Coverage, Scope } from '@/shared/api/approval';
import type { Recipe } from '@/shared/engine/recipe';
import type { Scenario } from '@/shared/engine/scenario';
import { buildSystem } from '@/shared/engine/systems';

const RELATIVE_SLACK = 1e-9;
const atMost = (a: number, b: number) => a <= b + RELATIVE_SLACK * Math.max(1, Math.abs(b));
const fmt = (v: number) => Number(v.toPrecision(6)).toString();

/** The band a scenario's excitation puts energy into, Hz. */
export function excitedBand(s: Scenario): { lowHz: number; highHz: number } {
  const e = s.excitation;
  if (e.kind === 'impact') return { lowHz: 0, highHz: Math.min(1 / e.pulseDurationS, s.acquisition.sampleRateHz / 2) };
  return { lowHz: e.band.lowHz, highHz: e.band.highHz };
}

/** Whether the union of intervals covers [low, high]; the first gap if not. */
function unionCovers(intervals: { lowHz: number; highHz: number }[], low: number, high: number): { ok: boolean; gapFromHz?: number } {
  let reach = low;
  for (const b of [...intervals].sort((a, c) => a.lowHz - c.lowHz)) {
    if (!atMost(b.lowHz, reach)) break;
    reach = Math.max(reach, b.highHz);
    if (atMost(high, reach)) return { ok: true };
  }
  return atMost(high, reach) ? { ok: true } : { ok: false, gapFromHz: reach };
}

export function scopeCoverage(scope: Scope, recipe: Recipe, scenarios: { name: string; scenario: Scenario }[]): Coverage {
  const checks: Coverage['checks'] = [];
  const { lowHz, highHz } = scope.band;
  const inRecipe = atMost(recipe.band.lowHz, lowHz) && atMost(highHz, recipe.band.highHz);
  checks.push({
    id: 'band-in-recipe',
    ok: inRecipe,
    detail: `scope band ${fmt(lowHz)}–${fmt(highHz)} Hz ${inRecipe ? 'lies inside' : 'is not inside'} the recipe's band ${fmt(recipe.band.lowHz)}–${fmt(recipe.band.highHz)} Hz`,
  });

  const kinds = new Set<string>(scope.excitations);
  for (const kind of scope.excitations) {
    const users = scenarios.filter((s) => s.scenario.excitation.kind === kind).map((s) => s.name);
    checks.push({
      id: `excitation:${kind}`,
      ok: users.length > 0,
      detail: users.length ? `${kind} excitation is used by ${users.map((n) => `"${n}"`).join(', ')}` : `no evidence scenario uses ${kind} excitation`,
    });
  }

  const relevant = scenarios.filter((s) => kinds.has(s.scenario.excitation.kind));
  const union = unionCovers(relevant.map((s) => excitedBand(s.scenario)), lowHz, highHz);
  checks.push({
    id: 'band-excited',
    ok: union.ok,
    detail: union.ok
      ? `the scenarios' excitation bands cover ${fmt(lowHz)}–${fmt(highHz)} Hz`
      : `no scenario of the scope's excitations excites the band from ${fmt(union.gapFromHz ?? lowHz)} Hz up to ${fmt(highHz)} Hz`,
  });

  const modes = relevant.flatMap((s) => buildSystem(s.scenario.system).modes.map((m) => ({ scenario: s.name, hz: m.naturalFrequencyHz, percent: 100 * m.dampingRatio })));
  const inBand = modes.filter((m) => atMost(lowHz, m.hz) && atMost(m.hz, highHz));
  checks.push({
    id: 'modes-in-band',
    ok: inBand.length > 0,
    detail: inBand.length
      ? `${inBand.length} mode(s) inside the band, ${fmt(Math.min(...inBand.map((m) => m.hz)))}–${fmt(Math.max(...inBand.map((m) => m.hz)))} Hz`
      : `no mode of the evidence systems lies inside ${fmt(lowHz)}–${fmt(highHz)} Hz`,
  });
  if (inBand.length) {
    const lightest = Math.min(...inBand.map((m) => m.percent));
    const heaviest = Math.max(...inBand.map((m) => m.percent));
    const { min, max } = scope.dampingPercent;
    const ok = atMost(lightest, min) && atMost(max, heaviest);
    checks.push({
      id: 'damping-range',
      ok,
      detail: `in-band modes span ${fmt(lightest)}–${fmt(heaviest)} % damping; the scope asks for ${fmt(min)}–${fmt(max)} %${ok ? '' : ' (the evidence must reach both ends)'}`,
    });
  } else {
    checks.push({ id: 'damping-range', ok: false, detail: 'no in-band mode, so no damping is covered' });
  }
  return { covered: checks.every((c) => c.ok), checks };
}
