/**
 * One plot area: grid, axes with d3 ticks, filled bands, curves (decimated per pixel column for
 * drawing), horizontal rules, the drag selection and the crosshair — a thin brass plumb line with
 * a bob at its foot and a marker on each curve. Pointer events (web) move the crosshair on hover,
 * pin it on a tap, and a horizontal drag selects a band to zoom to; the arrow keys move it too.
 */
import { memo, useMemo, useRef, type KeyboardEvent } from 'react';
import { StyleSheet, View, type PointerEvent as RNPointerEvent } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import { area as d3Area, line as d3Line } from 'd3-shape';
import { colors, fontFamily, radius, stroke, typeScale } from '@/shared/ui/theme';
import { breakJumps, decimateBand, decimateLine, nearestIndex } from './decimate';
import { yExtent } from './domain';
import { axisTicks, formatPlain, makeScale, tickCountFor, type AxisScale } from './ticks';
import type { PlotAxis, PlotBand, PlotRule, PlotSeries } from './types';
import { webData, webProps } from './web-data';

export const FRAME_MARGIN = { top: 8, right: 12, bottom: 24, left: 56 } as const;
const DRAG_THRESHOLD_PX = 6;

export interface FrameInteraction {
  onCursor: (x: number | null) => void;
  onSelect: (range: [number, number] | null) => void;
  onZoom: (range: [number, number]) => void;
}

export interface PlotFrameProps {
  width: number;
  height: number;
  x: PlotAxis & { domain: readonly [number, number] };
  y: PlotAxis;
  series: readonly PlotSeries[];
  bands?: readonly PlotBand[];
  rules?: readonly PlotRule[];
  cursorX: number | null;
  selection: [number, number] | null;
  interaction: FrameInteraction;
  /** The accessible name of the plot (what it shows). */
  label: string;
  testID?: string;
}

interface Scales {
  x: AxisScale;
  y: AxisScale;
  inner: { left: number; right: number; top: number; bottom: number };
}

function useScales(props: PlotFrameProps, bands: readonly PlotBand[], rules: readonly PlotRule[]): Scales {
  const { width, height, x, y, series } = props;
  return useMemo(() => {
    const inner = {
      left: FRAME_MARGIN.left,
      right: Math.max(FRAME_MARGIN.left + 10, width - FRAME_MARGIN.right),
      top: FRAME_MARGIN.top,
      bottom: Math.max(FRAME_MARGIN.top + 10, height - FRAME_MARGIN.bottom),
    };
    const xScale = makeScale(x.kind, x.domain, [inner.left, inner.right]);
    const fitted = y.domain ?? yExtent(series, bands, rules, x.domain, x.kind === 'log') ?? [0, 1];
    const yScale = makeScale(y.kind, fitted, [inner.bottom, inner.top]);
    if (!y.domain) yScale.nice(tickCountFor(inner.bottom - inner.top, 40));
    return { x: xScale, y: yScale, inner };
  }, [width, height, x.kind, x.domain, y.kind, y.domain, series, bands, rules]);
}

export function PlotFrame(props: PlotFrameProps) {
  const { width, height, series, cursorX, selection, interaction, label, testID } = props;
  const bands = props.bands ?? noBands;
  const rules = props.rules ?? noRules;
  const scales = useScales(props, bands, rules);
  const ref = useRef<View>(null);
  const drag = useRef<{ startClientX: number; startX: number; moved: boolean } | null>(null);

  const dataX = (clientX: number) => {
    const node = ref.current as unknown as HTMLElement | null;
    const left = node?.getBoundingClientRect ? node.getBoundingClientRect().left : 0;
    const px = Math.min(scales.inner.right, Math.max(scales.inner.left, clientX - left));
    return scales.x.invert(px);
  };
  const onPointerDown = (e: RNPointerEvent) => {
    const { clientX } = e.nativeEvent;
    drag.current = { startClientX: clientX, startX: dataX(clientX), moved: false };
  };
  const onPointerMove = (e: RNPointerEvent) => {
    const { clientX, pointerType } = e.nativeEvent;
    const d = drag.current;
    if (d) {
      if (Math.abs(clientX - d.startClientX) > DRAG_THRESHOLD_PX) d.moved = true;
      if (d.moved) interaction.onSelect([d.startX, dataX(clientX)]);
    } else if (pointerType === 'mouse' || pointerType === undefined) {
      interaction.onCursor(dataX(clientX));
    }
  };
  const onPointerUp = (e: RNPointerEvent) => {
    const d = drag.current;
    drag.current = null;
    if (!d) return;
    const x = dataX(e.nativeEvent.clientX);
    if (d.moved) {
      interaction.onSelect(null);
      interaction.onZoom([d.startX, x]);
    } else {
      interaction.onCursor(x);
    }
  };
  const onPointerLeave = () => {
    if (drag.current?.moved) interaction.onSelect(null);
    drag.current = null;
  };
  const onKeyDown = (e: KeyboardEvent) => {
    const { left, right } = scales.inner;
    const at = cursorX === null ? (left + right) / 2 : scales.x(cursorX);
    const step = (right - left) * (e.shiftKey ? 0.1 : 0.01);
    const moves: Record<string, number> = { ArrowLeft: at - step, ArrowRight: at + step, Home: left, End: right };
    if (e.key in moves) {
      e.preventDefault();
      interaction.onCursor(scales.x.invert(Math.min(right, Math.max(left, moves[e.key]))));
    } else if (e.key === 'Escape') {
      interaction.onCursor(null);
    }
  };

  return (
    <View
      ref={ref}
      style={[styles.frame, { width, height }]}
      role="img"
      aria-label={label}
      focusable
      testID={testID}
      {...webData({ plotFrame: 'true' })}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onPointerLeave={onPointerLeave}
      {...webProps({ onKeyDown })}
    >
      <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
        <FrameLayers scales={scales} x={props.x} y={props.y} series={series} bands={bands} rules={rules} width={width} height={height} />
        <Overlay scales={scales} series={series} cursorX={cursorX} selection={selection} />
      </Svg>
    </View>
  );
}

const noBands: PlotBand[] = [];
const noRules: PlotRule[] = [];
const tickText = { fontFamily: fontFamily.mono, fontSize: typeScale.label.fontSize, fill: colors.textMuted };

type LayerProps = Pick<PlotFrameProps, 'x' | 'y' | 'series' | 'width' | 'height'> & {
  scales: Scales;
  bands: readonly PlotBand[];
  rules: readonly PlotRule[];
};

/** Everything that does not move with the crosshair, so hovering re-draws only the overlay. */
const FrameLayers = memo(function FrameLayers({ scales, x, y, series, bands, rules, width, height }: LayerProps) {
  const { inner } = scales;
  const positiveOnly = x.kind === 'log';
  const pixelWidth = inner.right - inner.left;
  const xTicks = axisTicks(scales.x, x.kind, tickCountFor(pixelWidth, x.kind === 'log' ? 48 : 72));
  const yTicks = y.tickValues
    ? y.tickValues.map((value) => ({ value, label: formatPlain(value) }))
    : axisTicks(scales.y, y.kind, tickCountFor(inner.bottom - inner.top, 36));
  const options = { domain: x.domain, toPixel: (v: number) => scales.x(v), pixelWidth, positiveOnly };
  return (
    <G>
      <Rect x={0} y={0} width={width} height={height} fill={colors.surface} />
      {xTicks.map((t) => (
        <Line key={`gx${t.value}`} x1={scales.x(t.value)} x2={scales.x(t.value)} y1={inner.top} y2={inner.bottom} stroke={colors.border} strokeWidth={t.label ? 1 : 0.5} />
      ))}
      {yTicks.map((t) => (
        <Line key={`gy${t.value}`} x1={inner.left} x2={inner.right} y1={scales.y(t.value)} y2={scales.y(t.value)} stroke={colors.border} strokeWidth={1} />
      ))}
      <G>
        {bands.map((b) => {
          const d = decimateBand(b.x, b.low, b.high, options);
          const path = d3Area<number>()
            .defined((i) => Number.isFinite(d.low[i]) && Number.isFinite(d.high[i]))
            .x((i) => scales.x(d.x[i]))
            .y0((i) => clampY(scales, d.low[i]))
            .y1((i) => clampY(scales, d.high[i]))(d.x.map((_, i) => i));
          return path ? <Path key={b.id} d={path} fill={b.color} fillOpacity={0.15} stroke="none" /> : null;
        })}
        {rules.map((r) => (
          <Line key={r.id} x1={inner.left} x2={inner.right} y1={scales.y(r.value)} y2={scales.y(r.value)} stroke={r.color} strokeWidth={stroke.focus} strokeDasharray="2 3" />
        ))}
        {series.map((s) => {
          const decimated = decimateLine(s.x, s.y, options);
          const d = s.breakAbove === undefined ? decimated : breakJumps(decimated, s.breakAbove);
          if (s.style === 'points') {
            return (
              <G key={s.id}>
                {d.x.map((xv, i) =>
                  Number.isFinite(d.y[i]) ? <Circle key={i} cx={scales.x(xv)} cy={clampY(scales, d.y[i])} r={2.5} fill={s.color} /> : null,
                )}
              </G>
            );
          }
          const path = d3Line<number>()
            .defined((i) => Number.isFinite(d.y[i]))
            .x((i) => scales.x(d.x[i]))
            .y((i) => clampY(scales, d.y[i]))(d.x.map((_, i) => i));
          if (!path) return null;
          const limit = s.role === 'limit';
          return (
            <Path
              key={s.id}
              d={path}
              fill="none"
              stroke={s.color}
              strokeWidth={limit ? stroke.focus : 1.75}
              strokeDasharray={s.dashed ? '6 4' : limit ? '2 3' : undefined}
              strokeLinejoin="round"
            />
          );
        })}
      </G>
      <Rect x={inner.left} y={inner.top} width={inner.right - inner.left} height={inner.bottom - inner.top} fill="none" stroke={colors.borderStrong} strokeWidth={1} />
      {yTicks.map((t) => (
        <SvgText key={`ty${t.value}`} x={inner.left - 6} y={scales.y(t.value) + 4} textAnchor="end" {...tickText}>
          {t.label}
        </SvgText>
      ))}
      {xTicks.map((t) =>
        t.label ? (
          <SvgText key={`tx${t.value}`} x={scales.x(t.value)} y={inner.bottom + 16} textAnchor="middle" {...tickText}>
            {t.label}
          </SvgText>
        ) : null,
      )}
    </G>
  );
});

/** Keeps a value inside the plot area (a curve leaving a fixed range is drawn along its edge). */
function clampY(scales: Scales, v: number): number {
  const px = scales.y(v);
  return Math.min(scales.inner.bottom + 1, Math.max(scales.inner.top - 1, px));
}

function Overlay({ scales, series, cursorX, selection }: { scales: Scales; series: readonly PlotSeries[]; cursorX: number | null; selection: [number, number] | null }) {
  const { inner } = scales;
  const sel = selection ? [scales.x(selection[0]), scales.x(selection[1])].sort((a, b) => a - b) : null;
  const cx = cursorX === null ? null : scales.x(cursorX);
  const showCursor = cx !== null && Number.isFinite(cx) && cx >= inner.left - 0.5 && cx <= inner.right + 0.5;
  return (
    <G>
      {sel ? (
        <Rect x={sel[0]} y={inner.top} width={Math.max(1, sel[1] - sel[0])} height={inner.bottom - inner.top} fill={colors.plumbLine} fillOpacity={0.15} stroke={colors.plumbLine} strokeWidth={1} />
      ) : null}
      {showCursor ? (
        <G>
          <Line x1={cx} x2={cx} y1={inner.top} y2={inner.bottom - 6} stroke={colors.plumbLine} strokeWidth={1.5} />
          <Path d={`M ${cx - 3} ${inner.bottom - 6} L ${cx} ${inner.bottom - 9} L ${cx + 3} ${inner.bottom - 6} L ${cx} ${inner.bottom} Z`} fill={colors.plumbLine} />
          {series.map((s) => {
            if (s.noReadout || s.role === 'limit') return null;
            const i = nearestIndex(s.x, cursorX!);
            const v = i >= 0 ? s.y[i] : NaN;
            if (!Number.isFinite(v)) return null;
            return <Circle key={s.id} cx={scales.x(s.x[i])} cy={clampY(scales, v)} r={3.5} fill={colors.surface} stroke={s.color} strokeWidth={stroke.focus} />;
          })}
        </G>
      ) : null}
    </G>
  );
}

const styles = StyleSheet.create({
  frame: {
    borderRadius: radius.sm,
    overflow: 'hidden',
    // Vertical scrolling stays with the page on touch screens; horizontal drags select a band.
    touchAction: 'pan-y',
    cursor: 'crosshair',
  } as object,
});
