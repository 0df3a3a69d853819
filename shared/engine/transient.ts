/**
 * Windows and triggering for transient (impact, burst) records. Common practice in modal testing;
 * the definitions are Plumbline's own:
 * - force window on the input: unity over the first M = round(forceWindowFraction·N) samples, then
 *   a half-cosine taper over T = max(1, round(M/8)) samples, zero after;
 * - exponential window on the response: 1 up to the trigger sample p (the pretrigger), then
 *   `w = exp(−(t − t_p)/τ)`, τ = exponentialDecayFraction·(N/fs). It adds a known damping
 *   `ζ_add = 1/(ω·τ)` to every mode (common practice, quoted from memory);
 * - trigger: the first sample with |x| ≥ triggerLevelFraction·max|x| opens a block that starts
 *   `pretrigger` samples before it; the search for the next block resumes after the block's end.
 */
import { EngineInputError } from './errors';

/** Force window of length n: unity on round(fraction·n) samples, short cosine taper, zeros. */
export function forceWindow(n: number, fraction: number): Float64Array {
  if (!(fraction > 0 && fraction <= 1)) {
    throw new EngineInputError('transient.forceWindowFraction', fraction, 'must be in (0, 1]');
  }
  const w = new Float64Array(n);
  const unity = Math.max(1, Math.round(fraction * n));
  const taper = Math.min(n - unity, Math.max(1, Math.round(unity / 8)));
  for (let i = 0; i < unity; i++) w[i] = 1;
  for (let i = 0; i < taper; i++) w[unity + i] = 0.5 * (1 + Math.cos((Math.PI * (i + 1)) / (taper + 1)));
  return w;
}

/** Exponential window of length n: 1 before `startSample`, exp(−(i − start)/(fs·τ)) from it on. */
export function exponentialWindow(n: number, sampleRateHz: number, tauS: number, startSample: number): Float64Array {
  if (!(tauS > 0) || !Number.isFinite(tauS)) {
    throw new EngineInputError('transient.exponentialDecayFraction', tauS, 'must give a decay time > 0');
  }
  const w = new Float64Array(n);
  const perSample = 1 / (sampleRateHz * tauS);
  for (let i = 0; i < n; i++) w[i] = i < startSample ? 1 : Math.exp(-(i - startSample) * perSample);
  return w;
}

/** The damping ratio an exponential window of decay time τ adds at frequency f: 1/(2πf·τ). */
export function addedDampingRatio(fHz: number, tauS: number): number {
  return 1 / (2 * Math.PI * fHz * tauS);
}

export interface TriggeredBlocks {
  starts: number[];
  warnings: string[];
}

/**
 * Block starts found by a level trigger on `x` (module doc). At most `maxBlocks` blocks (all that
 * fit when undefined). A trigger closer than `pretrigger` samples to the record start gives a
 * block starting at sample 0, with a warning.
 */
export function triggeredBlockStarts(
  x: Float64Array,
  blockLength: number,
  levelFraction: number,
  pretrigger: number,
  maxBlocks?: number,
): TriggeredBlocks {
  let peak = 0;
  for (let i = 0; i < x.length; i++) peak = Math.max(peak, Math.abs(x[i]));
  if (peak === 0) throw new EngineInputError('record.input', 'all zeros', 'gives nothing to trigger on');
  const level = levelFraction * peak;
  const starts: number[] = [];
  const warnings: string[] = [];
  let from = 0;
  while (maxBlocks === undefined || starts.length < maxBlocks) {
    let hit = from;
    while (hit < x.length && Math.abs(x[hit]) < level) hit++;
    if (hit >= x.length) break;
    let start = hit - pretrigger;
    if (start < 0) {
      warnings.push(`trigger at sample ${hit} leaves only ${hit} of ${pretrigger} pretrigger samples; block starts at 0`);
      start = 0;
    }
    if (start + blockLength > x.length) break;
    starts.push(start);
    from = start + blockLength;
  }
  if (starts.length === 0) {
    throw new EngineInputError(
      'transient.triggerLevelFraction',
      levelFraction,
      `finds no trigger followed by a full block of ${blockLength} samples`,
    );
  }
  if (maxBlocks !== undefined && starts.length < maxBlocks) {
    warnings.push(`averages=${maxBlocks} asked for, but only ${starts.length} triggered blocks fit; ${starts.length} averaged`);
  }
  return { starts, warnings };
}
