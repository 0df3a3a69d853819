/**
 * What the system editor shows as one types, computed in the browser by the shared engine: the
 * exact FRF on a frequency grid that resolves every peak, the facts of each mode and the
 * anti-resonances. Pure; returns the engine's complaint instead of throwing.
 */
import { buildSystem, parseSystemSpec, type LinearSystem } from '@/shared/engine/systems';
import { EngineInputError } from '@/shared/engine/errors';
import type { ComplexArray, ModeFacts } from '@/shared/engine/types';
import { engineRule } from './form-rules';

export type SystemPreview =
  | { ok: true; unit: string; frequenciesHz: Float64Array; frf: ComplexArray; modes: ModeFacts[]; antiResonancesHz: number[] }
  | { ok: false; field: string; message: string };

/**
 * Frequency lines for a plot of modes at `naturalHz` with half-power bandwidths `bandwidthHz`: a
 * geometric grid from a tenth of the lowest mode to four times the highest, plus 81 lines across
 * ±10 half-power bandwidths of each mode, so a lightly damped peak is drawn at its height.
 */
export function previewGrid(naturalHz: readonly number[], bandwidthHz: readonly number[], points = 1200): Float64Array {
  const low = Math.min(...naturalHz) / 10;
  const high = Math.max(...naturalHz) * 4;
  const lines: number[] = [];
  const ratio = Math.pow(high / low, 1 / (points - 1));
  for (let i = 0; i < points; i++) lines.push(low * Math.pow(ratio, i));
  naturalHz.forEach((fn, r) => {
    const b = Math.max(bandwidthHz[r], fn * 1e-6);
    for (let j = -40; j <= 40; j++) {
      const f = fn + (j / 4) * b;
      if (f > low && f < high) lines.push(f);
    }
  });
  lines.sort((a, b) => a - b);
  return Float64Array.from(lines.filter((f, i) => i === 0 || f > lines[i - 1]));
}

/** The preview of a system definition, or the first field the engine refuses. */
export function previewSystem(definition: unknown): SystemPreview {
  let system: LinearSystem;
  try {
    system = buildSystem(parseSystemSpec(definition));
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, field: err.field, message: `${err.field.replace(/^system\.?/, '') || 'system'}: ${engineRule(err)}` };
    return { ok: false, field: '', message: err instanceof Error ? err.message : 'The system could not be built.' };
  }
  const modes = system.modes;
  const frequenciesHz = previewGrid(
    modes.map((m) => m.naturalFrequencyHz),
    modes.map((m) => m.halfPowerBandwidthHz),
  );
  return { ok: true, unit: system.unit, frequenciesHz, frf: system.frf(frequenciesHz), modes, antiResonancesHz: system.antiResonancesHz };
}
