/** The bench's controls: where the noise sits and how loud, delay, block length, window, estimator, record, tolerance. */
import { StyleSheet, View } from 'react-native';
import { AppText, Button } from '@/shared/ui/components';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { space } from '@/shared/ui/theme';
import { BENCH_MAX_SAMPLES } from './builtin-scenarios';
import type { NoisePlacement, WhatIfSettings } from './what-if-run';

const noiseOptions = [
  { value: 'none', label: 'No noise' },
  { value: 'input', label: 'On the force' },
  { value: 'output', label: 'On the response' },
  { value: 'both', label: 'On both' },
] as const;
const windowOptions = [
  { value: 'rectangular', label: 'Rectangular' },
  { value: 'hann', label: 'Hann' },
  { value: 'hamming', label: 'Hamming' },
  { value: 'flattop', label: 'Flat-top' },
  { value: 'blackman-harris', label: 'Blackman-Harris' },
] as const;
const estimatorOptions = [
  { value: 'H1', label: 'H1' },
  { value: 'H2', label: 'H2' },
  { value: 'Hv', label: 'Hv' },
] as const;
const snrChoices = [40, 30, 20, 10, 0];
const delayChoices = [0, 1, 5, 20, 100];
const toleranceChoices = [0.5, 1, 2];

interface ControlsProps {
  settings: WhatIfSettings;
  sampleRateHz: number;
  baseDurationS: number;
  onChange: (next: WhatIfSettings) => void;
}

const trim = (v: number) => String(Number(v.toPrecision(4)));

export function WhatIfControls({ settings: s, sampleRateHz: fs, baseDurationS, onChange }: ControlsProps) {
  const set = <K extends keyof WhatIfSettings>(key: K, value: WhatIfSettings[K]) => onChange({ ...s, [key]: value });
  const samples = Math.round(s.durationS * fs);
  const blocks = [256, 512, 1024, 2048, 4096, 8192, 16384, 32768].filter((n) => n <= samples / 2 || n === s.blockLength);
  const durations = [baseDurationS / 8, baseDurationS / 4, baseDurationS / 2, baseDurationS, baseDurationS * 2]
    .filter((d) => d * fs >= 2 * s.blockLength && d * fs <= BENCH_MAX_SAMPLES)
    .concat(s.durationS)
    .filter((d, i, all) => all.indexOf(d) === i)
    .sort((a, b) => a - b);
  return (
    <Panel title="Settings" testID="what-if-controls">
      <ChoiceChips label="Noise" options={noiseOptions} value={s.noise} onChange={(v: NoisePlacement) => set('noise', v)} />
      {s.noise !== 'none' ? (
        <ChoiceChips
          label="Signal-to-noise ratio over the band"
          options={snrChoices.map((v) => ({ value: String(v), label: `${v} dB` }))}
          value={String(s.snrDb)}
          onChange={(v) => set('snrDb', Number(v))}
        />
      ) : null}
      <ChoiceChips
        label="Delay of the response channel"
        options={delayChoices.concat(delayChoices.includes(s.delayMs) ? [] : [s.delayMs]).map((v) => ({ value: String(v), label: v === 0 ? 'None' : `${trim(v)} ms` }))}
        value={String(s.delayMs)}
        onChange={(v) => set('delayMs', Number(v))}
      />
      <ChoiceChips
        label="Block length"
        options={blocks.map((n) => ({ value: String(n), label: `${n} · ${trim(fs / n)} Hz` }))}
        value={String(s.blockLength)}
        onChange={(v) => set('blockLength', Number(v))}
      />
      <ChoiceChips label="Window" options={windowOptions} value={s.window} onChange={(v) => set('window', v)} />
      <ChoiceChips label="Estimator judged (band and errors)" options={estimatorOptions} value={s.estimator} onChange={(v) => set('estimator', v)} />
      <ChoiceChips
        label="Record length"
        options={durations.map((d) => ({ value: String(d), label: `${trim(d)} s` }))}
        value={String(s.durationS)}
        onChange={(v) => set('durationS', Number(v))}
      />
      <ChoiceChips
        label="Magnitude tolerance"
        options={toleranceChoices.map((v) => ({ value: String(v), label: `±${v} dB` }))}
        value={String(s.toleranceDb)}
        onChange={(v) => set('toleranceDb', Number(v))}
      />
      <View style={styles.row}>
        <AppText variant="small" tone="muted">{`Seed ${s.seed}`}</AppText>
        <Button label="Another seed" variant="secondary" compact onPress={() => set('seed', s.seed + 1)} />
      </View>
    </Panel>
  );
}

const styles = StyleSheet.create({ row: { flexDirection: 'row', alignItems: 'center', gap: space.md } });
