/**
 * A scenario in words, for a validation report: the known-answer system, the acquisition, the
 * excitation and each error source that is on (the recipe's settings: shared/api/settings-summary).
 * Units always stated; damping as % of critical.
 */
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
