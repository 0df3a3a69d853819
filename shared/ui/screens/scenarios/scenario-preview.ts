/**
 * The scenario editor's preview, computed in the browser by the shared engine for one seed: the
 * force and response over a short stretch at the start of the record, and the exact FRF the
 * estimates are scored against. Long records are simulated shortened (the stretch shown is then
 * from a shorter synthesis, and the preview says so); the exports and studies use the full record.
 */
import { EngineInputError } from '@/shared/engine/errors';
import { resolveScenario, simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';
import type { ComplexArray } from '@/shared/engine/types';
import { engineRule } from '@/shared/ui/screens/systems/form-rules';
import { previewGrid } from '@/shared/ui/screens/systems/system-preview';

/** Largest record the preview simulates (samples); with a cubic spring, fewer (time stepping). */
export const PREVIEW_MAX_SAMPLES = 2 ** 17;
export const PREVIEW_MAX_SAMPLES_NONLINEAR = 2 ** 14;
/** Samples of the stretch drawn. */
export const STRETCH_SAMPLES = 2048;

export type ScenarioPreview =
  | {
      ok: true;
      sampleRateHz: number;
      recordSamples: number;
      simulatedSamples: number;
      timeS: Float64Array;
      input: Float64Array;
      output: Float64Array;
      outputUnit: string;
      frfUnit: string;
      exact: { frequenciesHz: Float64Array; frf: ComplexArray };
      excitationBand: { lowHz: number; highHz: number } | null;
      warnings: string[];
      referenceNote?: string;
      millis: number;
    }
  | { ok: false; field: string; message: string };

function complaint(err: unknown): ScenarioPreview {
  if (err instanceof EngineInputError) return { ok: false, field: err.field, message: `${err.field}: ${engineRule(err)}` };
  return { ok: false, field: '', message: err instanceof Error ? err.message : 'The scenario could not be simulated.' };
}

export function previewScenario(definition: unknown, seed = 1, clock: () => number = () => Date.now()): ScenarioPreview {
  const started = clock();
  try {
    // The name does not change the records; an unnamed draft is still previewed.
    const named = definition && typeof definition === 'object' && !(definition as { name?: unknown }).name ? { ...definition, name: 'Draft' } : definition;
    const { scenario, plan } = resolveScenario(named);
    const fs = plan.sampleRateHz;
    const cap = scenario.errors.cubicStiffness ? PREVIEW_MAX_SAMPLES_NONLINEAR : PREVIEW_MAX_SAMPLES;
    const shortened = plan.recordSamples > cap;
    const input: ScenarioInput = shortened ? { ...scenario, acquisition: { ...scenario.acquisition, durationS: cap / fs } } : scenario;
    const record = simulateScenario(input, seed);
    const n = Math.min(STRETCH_SAMPLES, record.input.length);
    const timeS = Float64Array.from({ length: n }, (_, i) => i / fs);
    const system = record.reference;
    const grid = previewGrid(
      system.modes.map((m) => m.naturalFrequencyHz),
      system.modes.map((m) => m.halfPowerBandwidthHz),
    ).filter((f) => f < fs / 2);
    const e = scenario.excitation;
    const warnings = [...record.report.warnings];
    if (shortened) {
      warnings.unshift(`preview simulated over ${cap} of the record's ${plan.recordSamples} samples; exports and studies use the whole record`);
    }
    return {
      ok: true,
      sampleRateHz: fs,
      recordSamples: plan.recordSamples,
      simulatedSamples: record.input.length,
      timeS,
      input: record.input.slice(0, n),
      output: record.output.slice(0, n),
      outputUnit: record.outputUnit,
      frfUnit: system.unit,
      exact: { frequenciesHz: grid, frf: system.frf(grid) },
      excitationBand: e.kind === 'impact' ? null : { ...e.band },
      warnings,
      referenceNote: record.referenceNote,
      millis: clock() - started,
    };
  } catch (err) {
    return complaint(err);
  }
}
