/**
 * The live side of the system editor: as the definition changes (settled for 250 ms) the shared
 * engine builds the system in the browser and this shows its exact FRF (magnitude in dB, phase)
 * and the facts of each mode — natural and damped frequency, damping, half-power bandwidth, decay
 * times — and the anti-resonances.
 */
import { useMemo } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { ModeFacts } from '@/shared/engine/types';
import { AppText } from '@/shared/ui/components';
import { FrfPlot } from '@/shared/ui/plots';
import { FactRow } from '@/shared/ui/screens/kit/figure';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { colors, curveColors, radius, space, stroke } from '@/shared/ui/theme';
import { previewSystem } from './system-preview';
import type { SystemFormValues } from './system-form-values';
import { useDebounced } from './use-debounced';

export function SystemLive() {
  const { control } = useFormContext<SystemFormValues>();
  const definition = useWatch({ control, name: 'definition' });
  const settled = useDebounced(JSON.stringify(definition), 250);
  const preview = useMemo(() => previewSystem(JSON.parse(settled)), [settled]);
  if (!preview.ok) {
    return (
      <Panel title="Exact FRF" testID="system-live">
        <AppText variant="body" testID="preview-problem">{`The preview waits for a valid system. ${preview.message}`}</AppText>
      </Panel>
    );
  }
  const zoomBands = preview.modes.map((m, i) => ({
    label: `Mode ${i + 1}`,
    low: Math.max(m.naturalFrequencyHz - 8 * m.halfPowerBandwidthHz, m.naturalFrequencyHz * 0.5),
    high: m.naturalFrequencyHz + 8 * m.halfPowerBandwidthHz,
  }));
  const finest = Math.min(...preview.modes.map((m) => m.halfPowerBandwidthHz));
  return (
    <View style={styles.live} testID="system-live">
      <FrfPlot
        title="Exact FRF"
        subtitle="Computed in this browser by the engine from the values above."
        unit={preview.unit}
        curves={[{ id: 'exact', label: 'Exact', color: curveColors.exact, dashed: true, frequenciesHz: preview.frequenciesHz, frf: preview.frf }]}
        zoomBands={zoomBands}
        testID="system-frf"
      />
      <Panel title="Modes" testID="system-facts">
        <View style={styles.modes}>
          {preview.modes.map((m, i) => (
            <ModeCard key={i} index={i} mode={m} />
          ))}
        </View>
        <FactRow label="Anti-resonances" text={preview.antiResonancesHz.length ? preview.antiResonancesHz.map((f) => `${f.toPrecision(5)} Hz`).join(', ') : 'none between the modes'} />
        <FactRow label="Line spacing for a quarter of the narrowest half-power bandwidth (common practice)" value={finest / 4} unit="Hz" digits={3} />
      </Panel>
    </View>
  );
}

function ModeCard({ index, mode }: { index: number; mode: ModeFacts }) {
  return (
    <View style={styles.card} role="group" aria-label={`Mode ${index + 1}`} testID={`mode-${index + 1}`}>
      <AppText variant="bodyStrong">{`Mode ${index + 1}`}</AppText>
      <FactRow label="Natural frequency fₙ" value={mode.naturalFrequencyHz} unit="Hz" digits={5} />
      <FactRow label="Damped natural frequency" value={mode.dampedFrequencyHz} unit="Hz" digits={5} />
      <FactRow label="Damping ratio ζ" value={mode.dampingRatio * 100} unit="%" digits={3} />
      <FactRow label="Half-power bandwidth 2ζfₙ" value={mode.halfPowerBandwidthHz} unit="Hz" digits={3} />
      <FactRow label="Decay to 1 %" value={mode.decayTimeS.to1Percent} unit="s" digits={3} />
      <FactRow label="Decay to 10⁻⁶" value={mode.decayTimeS.to1e6} unit="s" digits={3} />
    </View>
  );
}

const styles = StyleSheet.create({
  live: { gap: space.lg },
  modes: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  card: {
    flexGrow: 1,
    flexBasis: 260,
    gap: space.hair,
    padding: space.md,
    borderLeftWidth: stroke.plumb,
    borderLeftColor: colors.borderStrong,
    borderRadius: radius.sm,
    backgroundColor: colors.background,
  },
});
