/**
 * The frame around one or more plot areas: title, the caller's controls, zoom bands and reset,
 * export (SVG, PNG), the legend and the crosshair read-out. It measures its own width and hands
 * the drawing width to `children`.
 */
import { useRef, useState, type ReactNode } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import { AppText, Button } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { Legend, type LegendEntry } from './legend';
import { canExport, downloadPng, downloadSvg } from './plot-export';
import { Readout } from './readout';
import type { ReadoutRow, ZoomBand } from './types';
import type { PlotView } from './use-plot-view';
import { webData } from './web-data';

const DEFAULT_WIDTH = 320;
export const PLOT_HINT = 'Hover or tap a plot to read values; drag across it to zoom to a band; arrow keys move the crosshair.';

export interface PlotPanelProps {
  title: string;
  /** A sentence under the title (what the plot shows, what the reference is). */
  subtitle?: string;
  view: PlotView;
  /** Named bands to zoom to (modes, the band of interest). */
  zoomBands?: readonly ZoomBand[];
  controls?: ReactNode;
  legend: readonly LegendEntry[];
  readout: { heading: { label: string; text: string } | null; rows: readonly ReadoutRow[] };
  children: (width: number) => ReactNode;
  testID?: string;
}

export function PlotPanel({ title, subtitle, view, zoomBands, controls, legend, readout, children, testID }: PlotPanelProps) {
  const [width, setWidth] = useState(DEFAULT_WIDTH);
  const [exportError, setExportError] = useState<string | null>(null);
  const ref = useRef<View>(null);
  const onLayout = (e: LayoutChangeEvent) => {
    const w = Math.floor(e.nativeEvent.layout.width) - 2 * space.md;
    if (w > 0 && Math.abs(w - width) >= 1) setWidth(w);
  };
  const runExport = async (kind: 'svg' | 'png') => {
    setExportError(null);
    const node = ref.current as unknown as Element | null;
    if (!node) return;
    try {
      if (kind === 'svg') downloadSvg(node, title);
      else await downloadPng(node, title);
    } catch (err) {
      setExportError(err instanceof Error ? err.message : 'The plot could not be exported.');
    }
  };
  return (
    <View ref={ref} style={styles.panel} onLayout={onLayout} testID={testID}>
      <View style={styles.head}>
        <AppText variant="heading" role="heading" aria-level={3}>
          {title}
        </AppText>
        {subtitle ? (
          <AppText variant="small" tone="muted">
            {subtitle}
          </AppText>
        ) : null}
      </View>
      {controls ? <View style={styles.controls}>{controls}</View> : null}
      <View style={styles.controls}>
        {zoomBands?.map((b) => (
          <Button key={b.label} label={b.label} variant="secondary" compact onPress={() => view.zoomTo([b.low, b.high])} />
        ))}
        <Button label="Reset zoom" variant="secondary" compact disabled={!view.zoomed} onPress={view.reset} />
        {canExport ? (
          <>
            <Button label="Export SVG" variant="secondary" compact onPress={() => void runExport('svg')} />
            <Button label="Export PNG" variant="secondary" compact onPress={() => void runExport('png')} />
          </>
        ) : null}
      </View>
      {exportError ? (
        <AppText variant="small" tone="fail" role="alert">
          {exportError}
        </AppText>
      ) : null}
      <View style={styles.body}>{children(width)}</View>
      <Legend entries={legend} />
      <Readout heading={readout.heading} rows={readout.rows} hint={PLOT_HINT} testID={testID ? `${testID}-readout` : undefined} />
    </View>
  );
}

/** A caption above a plot area, e.g. "Magnitude · dB re 1 m/N"; also carried into exports. */
export function PlotCaption({ text }: { text: string }) {
  return (
    <View {...webData({ plotCaption: text })}>
      <AppText variant="label" tone="muted">
        {text}
      </AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  panel: {
    gap: space.md,
    padding: space.md,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
  },
  head: { gap: space.hair },
  controls: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'flex-end' },
  body: { gap: space.xs },
});
