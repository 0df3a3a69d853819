/** Data shapes the plots take. x values of every series are ascending. */
import type { AxisKind } from './ticks';

export interface PlotSeries {
  id: string;
  label: string;
  color: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Dashed stroke (the exact FRF). */
  dashed?: boolean;
  /** Points instead of a line (e.g. predicted vs observed). */
  style?: 'line' | 'points';
  /** 'limit' lines (tolerances) are drawn thinner and listed as limits in the legend. */
  role?: 'curve' | 'limit';
  /** Unit of y for the read-out; defaults to the y axis unit. */
  unit?: string;
  /** Break the line where neighbouring drawn values jump by more than this (a wrapped phase: 180). */
  breakAbove?: number;
  /** Left out of the crosshair read-out (e.g. a tolerance line that equals a constant). */
  noReadout?: boolean;
}

/** A filled band between two curves: confidence bands, Monte Carlo percentile spread. */
export interface PlotBand {
  id: string;
  label: string;
  color: string;
  x: ArrayLike<number>;
  low: ArrayLike<number>;
  high: ArrayLike<number>;
}

/** A horizontal line across the plot at a y value (a tolerance limit, a coherence floor). */
export interface PlotRule {
  id: string;
  label: string;
  value: number;
  color: string;
}

export interface PlotAxis {
  kind: AxisKind;
  /** What the axis shows, e.g. "Frequency". */
  label: string;
  /** Unit, always shown, e.g. "Hz". */
  unit: string;
  /** Fixed domain; without it the y axis fits the visible data. */
  domain?: readonly [number, number];
  /** Tick values to use instead of d3's (e.g. −180, −90, 0, 90, 180 for a wrapped phase). */
  tickValues?: readonly number[];
}

/** A named frequency band the zoom buttons jump to. */
export interface ZoomBand {
  label: string;
  low: number;
  high: number;
}

/** One line of the crosshair read-out. */
export interface ReadoutRow {
  id: string;
  label: string;
  color: string;
  text: string;
  dashed?: boolean;
}
