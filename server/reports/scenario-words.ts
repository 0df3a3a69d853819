/**
 * A scenario and a recipe in words, for a validation report: the known-answer system, the
 * acquisition, the excitation, each error source that is on, and the acceptance criteria.
 * Units always stated; damping as % of critical.
 */
import type { Recipe } from '@/shared/engine/recipe';
import type { Scenario } from '@/shared/engine/scenario';
import { buildSystem } from '@/shared/engine/systems';

const n = (v: number, digits = 4) => Number(v.toPrecision(digits)).toString();
const levelWords = (l: { rmsN: number } | { peakN: number }) => ('rmsN' in l ? `${n(l.rmsN)} N RMS` : `${n(l.peakN)} N peak`);

export function systemWords(s: Scenario): string {
  const sys = buildSystem(s.system);
  const modes = sys.modes.map((m) => `${n(m.naturalFrequencyHz)} Hz at ${n(100 * m.dampingRatio, 3)} %`).join(', ');
  const kind = s.system.kind === 'sdof' ? 'single degree of freedom' : s.system.kind === 'modal' ? 'modal model' : 'lumped masses, springs and dampers';
  return `${kind}; ${sys.quantity} in ${sys.unit}; ${sys.modes.length} mode(s): ${modes}`;
}

export function acquisitionWords(s: Scenario): string {
  const samples = Math.round(s.acquisition.sampleRateHz * s.acquisition.durationS);
  const start = s.acquisition.start ?? (['burst-random', 'impact'].includes(s.excitation.kind) ? 'from-rest' : 'steady-state');
  return `sample rate ${n(s.acquisition.sampleRateHz, 6)} Hz, record ${n(s.acquisition.durationS)} s (${samples} samples), ${start}`;
}

export function excitationWords(s: Scenario): string {
  const e = s.excitation;
  if (e.kind === 'impact') {
    const bounce = e.doubleHit ? `, second hit after ${n(e.doubleHit.delayS)} s at ${n(e.doubleHit.amplitudeRatio)} of the first` : '';
    return `impact: half-sine pulse ${n(e.pulseDurationS * 1000)} ms every ${n(e.periodS)} s, ${levelWords(e.level)}${bounce}`;
  }
  const band = `${n(e.band.lowHz)}–${n(e.band.highHz)} Hz`;
  const extra =
    e.kind === 'burst-random' ? `, bursts of ${n(e.burstFraction * 100)} % of ${n(e.blockLengthS)} s blocks`
      : e.kind === 'chirp' ? `, ${e.sweep} sweep every ${n(e.periodS)} s`
        : 'periodS' in e ? `, period ${n(e.periodS)} s` : '';
  return `${e.kind}, ${band}${extra}, ${levelWords(e.level)}`;
}

type Noise = NonNullable<Scenario['errors']['inputNoise']>;
const noiseWords = (x: Noise, unit: string) =>
  'snrDb' in x ? `SNR ${n(x.snrDb)} dB${x.bandHz ? ` over ${n(x.bandHz.lowHz)}–${n(x.bandHz.highHz)} Hz` : ''}` : `PSD ${n(x.psd)} ${unit}²/Hz`;

export function errorSourceWords(s: Scenario): string[] {
  const e = s.errors;
  const out: string[] = [];
  if (e.inputNoise) out.push(`noise on the force channel: ${noiseWords(e.inputNoise, 'N')}`);
  if (e.outputNoise) out.push(`noise on the response channel: ${noiseWords(e.outputNoise, 'unit')}`);
  if (e.delayS) out.push(`response delayed by ${n(e.delayS * 1000)} ms against the force`);
  if (e.gainMismatch !== undefined && e.gainMismatch !== 1) out.push(`response channel gain ${n(e.gainMismatch)} (ratio)`);
  if (e.phaseMismatchDeg) out.push(`response channel phase error ${n(e.phaseMismatchDeg)} degrees`);
  if (e.quantisation) out.push(`ADC ${e.quantisation.bits} bits, ranges ${e.quantisation.inputFullScale} / ${e.quantisation.outputFullScale}`);
  if (e.cubicStiffness) out.push(`cubic stiffness k3 = ${n(e.cubicStiffness.k3NPerM3)} N/m³ on spring ${e.cubicStiffness.springIndex}`);
  if (e.clipping) out.push(`clipping${e.clipping.inputLimitN ? ` force at ±${n(e.clipping.inputLimitN)} N` : ''}${e.clipping.outputLimit ? ` response at ±${n(e.clipping.outputLimit)}` : ''}`);
  return out.length ? out : ['none (clean signals: only leakage and averaging from the recipe itself)'];
}

/** The recipe's acceptance tolerances as the criteria a study judges (scores/criteria.ts). */
export function acceptanceWords(r: Recipe): { label: string; limit: string }[] {
  const t = r.tolerances;
  const out: { label: string; limit: string }[] = [];
  if (t.magnitudeDb !== undefined) {
    out.push({ label: 'magnitude bias: max over lines of |mean magnitude error|', limit: `≤ ${n(t.magnitudeDb)} dB` });
    out.push({ label: 'magnitude error, 95th percentile over seeds, worst line', limit: `≤ ${n(t.magnitudeDb)} dB` });
  }
  if (t.phaseDeg !== undefined) out.push({ label: 'phase error, 95th percentile over seeds, worst line', limit: `≤ ${n(t.phaseDeg)} degrees` });
  if (t.complexRelative !== undefined) out.push({ label: 'complex relative error |H_est − H|/|H|, 95th percentile, worst line', limit: `≤ ${n(t.complexRelative)}` });
  if (t.resonanceFrequencyPercent !== undefined) out.push({ label: 'resonance frequency error, 95th percentile, worst mode', limit: `≤ ${n(t.resonanceFrequencyPercent)} %` });
  if (t.dampingPercent !== undefined) out.push({ label: 'damping error, 95th percentile, worst mode', limit: `≤ ${n(t.dampingPercent)} %` });
  if (t.coveragePercent !== undefined) out.push({ label: 'coverage of the 95 % magnitude confidence band', limit: `≥ ${n(t.coveragePercent)} %` });
  if (t.minCoherence !== undefined) out.push({ label: 'coherence, 5th percentile over seeds, worst line', limit: `≥ ${n(t.minCoherence)}` });
  return out;
}

export function recipeWords(r: Recipe): string[] {
  const block = r.blockLength !== undefined ? `block ${r.blockLength} samples` : `resolution ${n(r.frequencyResolutionHz!)} Hz`;
  const lines = [
    `${block}, ${r.window} window, overlap ${n(r.overlap * 100)} %, averages ${r.averages ?? 'all'}`,
    `estimator ${r.estimator}${r.hvWeight ? ` (weight ${n(r.hvWeight)})` : ''}, detrend ${r.detrend}, ${r.scaling} scaling`,
    `band of interest ${n(r.band.lowHz)}–${n(r.band.highHz)} Hz`,
  ];
  if (r.transient) {
    const t = r.transient;
    lines.push(`transient: force window ${n(t.forceWindowFraction * 100)} % of the block, exponential decay ${n(t.exponentialDecayFraction)}, trigger ${n(t.triggerLevelFraction * 100)} %, pretrigger ${n(t.pretriggerFraction * 100)} %`);
  }
  return lines;
}
