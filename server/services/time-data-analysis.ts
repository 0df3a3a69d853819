/**
 * A lab's own two-channel time record run through one of its recipes: the three estimators,
 * coherence and the Bendat & Piersol random errors on the recipe's band. There is no exact FRF
 * for a measured record, so nothing is scored. Arrays are cut to the band's lines; values without
 * a number (a line where Gxx = 0) travel as null.
 */
import { processRecord } from '@/shared/engine/process';
import type { Recipe } from '@/shared/engine/recipe';
import { badFile, column, listColumns, requireUsableChannel, type NumericTable } from './csv-read';
import { checkedByEngine } from './engine-input';

export interface TimeDataOptions {
  inputColumn: string;
  outputColumn: string;
  timeColumn: string;
  sampleRateHz?: number;
}

/** JSON-ready numbers: NaN and ±Infinity become null. */
export function toJsonArray(values: ArrayLike<number>, start = 0, end = values.length): (number | null)[] {
  const out: (number | null)[] = new Array(end - start);
  for (let i = start; i < end; i++) out[i - start] = Number.isFinite(values[i]) ? values[i] : null;
  return out;
}

/**
 * The sample rate from a time column: 1 / (mean step), after checking that the column rises by
 * the same step throughout (within 1 % of a step, for times rounded when written).
 */
export function sampleRateFromTime(t: Float64Array, name: string): number {
  const n = t.length;
  const dt = (t[n - 1] - t[0]) / (n - 1);
  if (!(dt > 0)) throw badFile('must rise from the first row to the last', { line: 2, column: name });
  for (let i = 1; i < n; i++) {
    if (Math.abs(t[i] - t[0] - i * dt) > 0.01 * dt) {
      throw badFile(`the time step changes here (samples must be evenly spaced, step ${dt.toPrecision(6)} s)`, { line: i + 2, column: name });
    }
  }
  return 1 / dt;
}

export function analyseTimeData(table: NumericTable, recipe: Recipe, o: TimeDataOptions) {
  if (o.inputColumn === o.outputColumn) throw badFile(`the input and output columns must differ (both "${o.inputColumn}")`);
  const input = column(table, o.inputColumn);
  const output = column(table, o.outputColumn);
  requireUsableChannel(input, o.inputColumn);
  requireUsableChannel(output, o.outputColumn);
  let sampleRateHz = o.sampleRateHz;
  if (sampleRateHz === undefined) {
    if (!table.data.has(o.timeColumn)) {
      throw badFile(`no time column "${o.timeColumn}" and no sampleRateHz given; the header has ${listColumns(table.columns)}`, { line: 1 });
    }
    sampleRateHz = sampleRateFromTime(column(table, o.timeColumn), o.timeColumn);
  }
  const fs = sampleRateHz;
  const p = checkedByEngine('recipe', () => processRecord({ sampleRateHz: fs, input, output }, recipe));
  const { start, end } = p.bandIndices;
  const cut = (a: ArrayLike<number>) => toJsonArray(a, start, end);
  const complex = (c: { re: Float64Array; im: Float64Array }) => ({ re: cut(c.re), im: cut(c.im) });
  const phaseDeg = p.estimate.randomError.phaseRad.map((v) => (v * 180) / Math.PI);
  return {
    kind: 'time-data' as const,
    sampleRateHz: fs,
    samples: table.rows,
    blockLength: (p.frequenciesHz.length - 1) * 2,
    averages: p.spectra.blocks,
    effectiveAverages: p.spectra.effectiveAverages,
    unit: null,
    frequenciesHz: cut(p.frequenciesHz),
    h1: complex(p.estimate.h1),
    h2: complex(p.estimate.h2),
    hv: complex(p.estimate.hv),
    coherence: cut(p.estimate.coherence),
    randomError: { magnitude: cut(p.estimate.randomError.magnitude), phaseDeg: cut(phaseDeg) },
    warnings: p.warnings,
  };
}

export type TimeDataResult = ReturnType<typeof analyseTimeData>;

/** The part of a result kept in the upload's row (the curves are recomputed from the file). */
export function timeDataSummary(r: TimeDataResult) {
  return {
    sampleRateHz: r.sampleRateHz,
    samples: r.samples,
    blockLength: r.blockLength,
    averages: r.averages,
    lines: r.frequenciesHz.length,
    bandLowHz: r.frequenciesHz[0],
    bandHighHz: r.frequenciesHz[r.frequenciesHz.length - 1],
    warnings: r.warnings,
  };
}
