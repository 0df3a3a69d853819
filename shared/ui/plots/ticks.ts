/**
 * Axis ticks and number formatting for the plots. Tick positions and the choice of which log
 * ticks carry a label come from d3-scale (`ticks`, `tickFormat`); this module only picks the
 * format specifier by the size of the numbers and writes minus signs as U+2212, as typeset
 * numbers use them.
 */
import { scaleLinear, scaleLog, type ScaleLinear, type ScaleLogarithmic } from 'd3-scale';

export type AxisKind = 'linear' | 'log';
export type AxisScale = ScaleLinear<number, number> | ScaleLogarithmic<number, number>;

/** A tick: its value and its label ('' for an unlabelled minor tick of a log axis). */
export interface Tick {
  value: number;
  label: string;
}

export const MINUS = '\u2212';

/** A d3 scale of the given kind from `domain` to pixel `range`. */
export function makeScale(kind: AxisKind, domain: readonly [number, number], range: readonly [number, number]): AxisScale {
  if (kind === 'log') return scaleLog().domain([domain[0], domain[1]]).range([range[0], range[1]]);
  return scaleLinear().domain([domain[0], domain[1]]).range([range[0], range[1]]);
}

/** Tick count that suits an axis `lengthPx` long (about one labelled tick per `spacingPx`). */
export function tickCountFor(lengthPx: number, spacingPx = 64): number {
  return Math.max(2, Math.min(10, Math.floor(lengthPx / spacingPx)));
}

/**
 * Ticks of a scale. Linear: d3's "nice" steps (1, 2, 5 × 10^k) with a fixed or exponent format
 * chosen by magnitude. Log: d3's 1…9 × 10^k ticks, labelled where d3's log tickFormat keeps a
 * label for `count` (every decade on a wide axis, also 2 and 5 on a narrow one).
 */
export function axisTicks(scale: AxisScale, kind: AxisKind, count: number): Tick[] {
  const values = scale.ticks(count);
  if (kind === 'log') {
    const keep = (scale as ScaleLogarithmic<number, number>).tickFormat(count, '~g');
    return values.map((value) => ({ value, label: keep(value) === '' ? '' : formatPlain(value) }));
  }
  const largest = Math.max(...values.map(Math.abs));
  const exponent = largest !== 0 && (largest < 1e-3 || largest >= 1e6);
  const format = (scale as ScaleLinear<number, number>).tickFormat(count, exponent ? '~e' : '~f');
  return values.map((value) => ({ value, label: typeset(value === 0 ? '0' : format(value)) }));
}

/** A tick value of a log axis: plain digits for 1e-3 ≤ |v| < 1e6, otherwise an exponent. */
export function formatPlain(value: number): string {
  const a = Math.abs(value);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) return typeset(value.toExponential().replace(/\.?0+e/, 'e').replace('e+', 'e'));
  return typeset(String(Number(value.toPrecision(12))));
}

/**
 * A read-out value with `significant` digits: fixed notation between 1e-3 and 1e6, an exponent
 * otherwise (receptances of 1e-7 m/N read as "1.234e−7"); "—" for a missing or non-finite value.
 */
export function formatReadout(value: number | null | undefined, significant = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a < 1e-3 || a >= 1e6) {
    const [mantissa, exp] = value.toExponential(significant - 1).split('e');
    return typeset(`${mantissa}e${exp.replace('+', '')}`);
  }
  const digits = Math.max(0, significant - 1 - Math.floor(Math.log10(a)));
  return typeset(value.toFixed(Math.min(digits, 12)));
}

/** A value and its unit, e.g. "36.02 Hz"; the unit is always shown (a dimensionless one may be ''). */
export function formatWithUnit(value: number | null | undefined, unit: string, significant = 4): string {
  const text = formatReadout(value, significant);
  return unit ? `${text} ${unit}` : text;
}

/** Hyphen-minus → minus sign (U+2212), so negative numbers line up and read as typeset. */
export function typeset(text: string): string {
  return text.replace(/-/g, MINUS);
}
