/**
 * The interactive state of a plot: the visible x-range (zoom), the crosshair position and the
 * band being dragged. The full range comes from the data; a zoom is kept inside it.
 */
import { useCallback, useEffect, useMemo, useState } from 'react';
import { clampRange } from './domain';
import type { FrameInteraction } from './plot-frame';
import type { AxisKind } from './ticks';

export interface PlotView {
  domain: readonly [number, number];
  zoomed: boolean;
  cursorX: number | null;
  selection: [number, number] | null;
  interaction: FrameInteraction;
  zoomTo: (range: readonly [number, number]) => void;
  reset: () => void;
  setCursor: (x: number | null) => void;
}

/** Narrowest zoom: 1/1000 of the full range (linear) or of its decades (log). */
function minimumWidth(full: readonly [number, number], kind: AxisKind, range: readonly [number, number]) {
  if (kind === 'log') return Math.min(range[0], range[1]) * (Math.pow(full[1] / full[0], 0.001) - 1);
  return (full[1] - full[0]) / 1000;
}

export function usePlotView(full: readonly [number, number], kind: AxisKind): PlotView {
  const [zoom, setZoom] = useState<[number, number] | null>(null);
  const [cursorX, setCursor] = useState<number | null>(null);
  const [selection, setSelection] = useState<[number, number] | null>(null);
  const fullLow = full[0];
  const fullHigh = full[1];

  // A new data range (another system, a longer record) drops a zoom that no longer fits.
  useEffect(() => {
    setZoom((z) => (z && (z[0] < fullLow || z[1] > fullHigh) ? null : z));
  }, [fullLow, fullHigh]);

  const zoomTo = useCallback(
    (range: readonly [number, number]) => {
      const limits: [number, number] = [fullLow, fullHigh];
      const next = clampRange(range, limits, minimumWidth(limits, kind, range));
      if (next) setZoom(next[0] <= fullLow && next[1] >= fullHigh ? null : next);
    },
    [fullLow, fullHigh, kind],
  );
  const reset = useCallback(() => setZoom(null), []);
  const interaction = useMemo<FrameInteraction>(
    () => ({ onCursor: setCursor, onSelect: setSelection, onZoom: zoomTo }),
    [zoomTo],
  );
  const domain = useMemo<readonly [number, number]>(() => zoom ?? [fullLow, fullHigh], [zoom, fullLow, fullHigh]);
  return { domain, zoomed: zoom !== null, cursorX, selection, interaction, zoomTo, reset, setCursor };
}
