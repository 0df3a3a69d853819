/** Plot components (react-native-svg drawing, d3-scale scales and ticks, d3-shape paths). */
export { FrfPlot, type FrfCurve, type FrfPlotProps } from './frf-plot';
export { LinePlot, type LinePlotProps } from './line-plot';
export { PlotFrame, type PlotFrameProps } from './plot-frame';
export { PlotPanel, PlotCaption, PLOT_HINT } from './plot-panel';
export { ToggleGroup, type ToggleOption } from './toggle-group';
export { Legend, type LegendEntry } from './legend';
export { usePlotView, type PlotView } from './use-plot-view';
export { decimateBand, decimateLine, lowerBound, nearestIndex, visibleRange } from './decimate';
export { axisTicks, formatPlain, formatReadout, formatWithUnit, makeScale, typeset, type AxisKind } from './ticks';
export { magnitudeIn, magnitudeOf, magnitudeUnit, phaseDeg, phaseIn, toDb, unwrapDeg, type MagnitudeScale, type PhaseMode } from './frf-values';
export { exportFileName, panelSvg } from './plot-export';
export type { PlotAxis, PlotBand, PlotRule, PlotSeries, ReadoutRow, ZoomBand } from './types';
