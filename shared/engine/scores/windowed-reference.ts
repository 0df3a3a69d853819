/**
 * The exact FRF "as seen through" an exponential window, for scoring transient (impact) records.
 *
 * Multiplying a response by exp(−a·t) (a = 1/τ, from the trigger on) turns its Laplace transform
 * Y(s) into Y(s + a) (the shift theorem). For an impact whose force lasts a short time after the
 * trigger, the windowed estimate is therefore H(jω + a): every pole λ_r moves to λ_r − a with the
 * same residue, which adds the damping ζ_add ≈ a/ω_n = 1/(ω_n·τ) to each mode (common practice in
 * modal testing, quoted from memory). For mobility and accelerance the factor (jω)^p becomes
 * (jω + a)^p. Scoring against this FRF shows what the processing did apart from the known,
 * deliberate window effect; the plain comparison (against H itself) is reported beside it.
 */
import type { ComplexArray, FrfQuantity, ModeFacts } from '../types';
import { EngineInputError } from '../errors';
import { modeFactsFromPole } from '../systems/facts';
import { modalReceptance, type ModalTerms } from '../systems/modal';

export interface WindowedReference {
  decayRatePerS: number;
  frf(fHz: Float64Array): ComplexArray;
  /** The shifted modes (natural frequency |λ − a|, damping −Re(λ − a)/|λ − a|), ascending. */
  modes: ModeFacts[];
}

/** The exact FRF and modes under an exponential window of decay time `tauS` (module doc). */
export function exponentialWindowReference(terms: ModalTerms, quantity: FrfQuantity, tauS: number): WindowedReference {
  if (!(tauS > 0) || !Number.isFinite(tauS)) throw new EngineInputError('tauS', tauS, 'must be a finite time > 0');
  const a = 1 / tauS;
  const shifted: ModalTerms = {
    poles: terms.poles.map(([re, im]) => [re - a, im]),
    residues: terms.residues,
  };
  const p = quantity === 'receptance' ? 0 : quantity === 'mobility' ? 1 : 2;
  const frf = (fHz: Float64Array): ComplexArray => {
    const h = modalReceptance(shifted, fHz);
    for (let i = 0; i < fHz.length && p > 0; i++) {
      // (a + jω)^p · H
      const w = 2 * Math.PI * fHz[i];
      let fr = a;
      let fi = w;
      if (p === 2) [fr, fi] = [a * a - w * w, 2 * a * w];
      const re = h.re[i];
      const im = h.im[i];
      h.re[i] = fr * re - fi * im;
      h.im[i] = fr * im + fi * re;
    }
    return h;
  };
  const modes = shifted.poles.map(modeFactsFromPole).sort((x, y) => x.naturalFrequencyHz - y.naturalFrequencyHz);
  return { decayRatePerS: a, frf, modes };
}
