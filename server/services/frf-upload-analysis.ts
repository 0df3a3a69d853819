/**
 * An FRF that a lab's own acquisition software produced (from Plumbline's exported signals),
 * scored against the scenario's exact FRF at the file's own frequency lines.
 *
 * File columns: `frequency_hz` with either `h_re`, `h_im` (real and imaginary parts) or
 * `magnitude_db`, `phase_deg` (20·log10 |H| with |H| in the FRF's SI unit, and the phase in
 * degrees), so Ĥ = 10^(magnitude_db/20)·exp(j·phase_deg·π/180). Frequencies rise strictly.
 */
import { scoreFrf } from '@/shared/engine/scores/line-scores';
import { buildSystem, type SystemSpec } from '@/shared/engine/systems';
import { badFile, column, listColumns, USABLE_MAGNITUDE, type NumericTable } from './csv-read';
import { checkedByEngine } from './engine-input';
import { toJsonArray } from './time-data-analysis';

export interface UploadedFrf {
  frequenciesHz: Float64Array;
  re: Float64Array;
  im: Float64Array;
  format: 're-im' | 'magnitude-phase';
}

/** Reads the FRF columns (see the module doc); a 400 names the line and column of a problem. */
export function readUploadedFrf(table: NumericTable): UploadedFrf {
  const f = column(table, 'frequency_hz');
  for (let i = 0; i < f.length; i++) {
    if (f[i] < 0) throw badFile('a frequency must not be negative', { line: i + 2, column: 'frequency_hz' });
    if (i > 0 && !(f[i] > f[i - 1])) throw badFile('frequencies must rise from row to row', { line: i + 2, column: 'frequency_hz' });
  }
  if (table.data.has('h_re') || table.data.has('h_im')) {
    return usable({ frequenciesHz: f, re: column(table, 'h_re'), im: column(table, 'h_im'), format: 're-im' });
  }
  if (table.data.has('magnitude_db') || table.data.has('phase_deg')) {
    const db = column(table, 'magnitude_db');
    const deg = column(table, 'phase_deg');
    const re = new Float64Array(f.length);
    const im = new Float64Array(f.length);
    for (let i = 0; i < f.length; i++) {
      const m = 10 ** (db[i] / 20);
      const p = (deg[i] * Math.PI) / 180;
      re[i] = m * Math.cos(p);
      im[i] = m * Math.sin(p);
    }
    return usable({ frequenciesHz: f, re, im, format: 'magnitude-phase' });
  }
  throw badFile(
    `needs columns h_re and h_im, or magnitude_db and phase_deg, beside frequency_hz; the header has ${listColumns(table.columns)}`,
    { line: 1 },
  );
}

/**
 * Refuses an FRF that can give no score: a line whose |Ĥ| is not finite (e.g. 1e308 dB), or a
 * file in which no line's |Ĥ| lies in the usable range (all zeros, denormals).
 */
function usable(frf: UploadedFrf): UploadedFrf {
  let scorable = 0;
  for (let i = 0; i < frf.re.length; i++) {
    const m = Math.hypot(frf.re[i], frf.im[i]);
    if (!Number.isFinite(m)) throw badFile('this value is too large to be an FRF magnitude', { line: i + 2, column: frf.format === 're-im' ? 'h_re' : 'magnitude_db' });
    if (m >= USABLE_MAGNITUDE.min && m <= USABLE_MAGNITUDE.max) scorable++;
  }
  if (scorable === 0) throw badFile(`no line has a usable FRF magnitude (every |H| is zero or outside ${USABLE_MAGNITUDE.min} to ${USABLE_MAGNITUDE.max})`);
  return frf;
}

export function analyseUploadedFrf(table: NumericTable, system: SystemSpec) {
  const uploaded = readUploadedFrf(table);
  const linear = checkedByEngine('scenario.system', () => buildSystem(system));
  const exact = linear.frf(uploaded.frequenciesHz);
  const score = scoreFrf({ frequenciesHz: uploaded.frequenciesHz, exact, estimate: { re: uploaded.re, im: uploaded.im } });
  const s = score.summary;
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  return {
    kind: 'frf' as const,
    unit: linear.unit,
    frequenciesHz: toJsonArray(uploaded.frequenciesHz),
    exact: { re: toJsonArray(exact.re), im: toJsonArray(exact.im) },
    uploaded: { re: toJsonArray(uploaded.re), im: toJsonArray(uploaded.im) },
    magnitudeErrorDb: toJsonArray(score.magnitudeErrorDb),
    phaseErrorDeg: toJsonArray(score.phaseErrorDeg),
    complexRelativeError: toJsonArray(score.complexRelativeError),
    summary: {
      lines: s.lines,
      undefinedLines: s.undefinedLines,
      bandLowHz: finite(s.bandLowHz),
      bandHighHz: finite(s.bandHighHz),
      maxAbsMagnitudeDb: finite(s.maxAbsMagnitudeDb),
      worstMagnitudeHz: finite(s.worstMagnitudeHz),
      rmsMagnitudeDb: finite(s.rmsMagnitudeDb),
      maxAbsPhaseDeg: finite(s.maxAbsPhaseDeg),
      worstPhaseHz: finite(s.worstPhaseHz),
      maxComplexRelative: finite(s.maxComplexRelative),
      worstComplexHz: finite(s.worstComplexHz),
    },
    format: uploaded.format,
  };
}

export type UploadedFrfResult = ReturnType<typeof analyseUploadedFrf>;
