/**
 * The chosen window's figures, computed live by the engine (F. J. Harris, Proc. IEEE 66(1), 1978):
 * coherent gain, equivalent noise bandwidth, scalloping loss, highest side lobe and the overlap
 * correlation that decides how much overlapped blocks still add (P. D. Welch, 1967).
 */
import { useMemo } from 'react';
import { AppText } from '@/shared/ui/components';
import { windowFigures, type WindowParams } from '@/shared/engine/windows';
import type { WindowName } from '@/shared/engine/types';
import { FactRow } from '@/shared/ui/screens/kit/figure';
import { Panel } from '@/shared/ui/screens/kit/panel';

/** Figures are computed on at most this many samples: for longer blocks they no longer change visibly. */
export const FIGURE_SAMPLES = 4096;

export function WindowFigures({ window, blockLength, params }: { window: WindowName; blockLength?: number; params?: WindowParams }) {
  const n = Math.max(8, Math.min(FIGURE_SAMPLES, blockLength && Number.isInteger(blockLength) ? blockLength : FIGURE_SAMPLES));
  const beta = params?.kaiserBeta;
  const figures = useMemo(() => {
    try {
      return { ok: true as const, value: windowFigures(window, n, beta === undefined ? undefined : { kaiserBeta: beta }) };
    } catch (err) {
      return { ok: false as const, message: err instanceof Error ? err.message : 'no figures' };
    }
  }, [window, n, beta]);
  if (!figures.ok) {
    return (
      <Panel title="Window figures" testID="window-figures">
        <AppText variant="small">{`No figures yet: ${figures.message}`}</AppText>
      </Panel>
    );
  }
  const f = figures.value;
  return (
    <Panel title="Window figures" testID="window-figures">
      <AppText variant="small" tone="muted">{`Computed in this browser on ${n} samples (Harris 1978).`}</AppText>
      <FactRow label="Coherent gain" value={f.coherentGain} unit="" digits={3} />
      <FactRow label="Equivalent noise bandwidth" value={f.enbwBins} unit="bins" digits={3} />
      <FactRow label="Scalloping loss" value={f.scallopingLossDb} unit="dB" digits={3} />
      <FactRow label="Highest side lobe" value={f.highestSidelobeDb} unit="dB" digits={3} />
      <FactRow label="Overlap correlation at 50 %" value={100 * f.overlapCorrelation.at50} unit="%" digits={3} />
      <FactRow label="Overlap correlation at 75 %" value={100 * f.overlapCorrelation.at75} unit="%" digits={3} />
    </Panel>
  );
}
