/**
 * Error sources, each off unless switched on: uncorrelated noise on the force and on the response
 * channel (as an SNR over the band, or a noise PSD level), a delay between the channels, channel
 * gain and phase mismatch, ADC quantisation and overload, a cubic spring, and clipping.
 */
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { ScenarioErrors } from '@/shared/engine/scenario';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { NumberField } from '@/shared/ui/screens/systems/number-field';
import { space } from '@/shared/ui/theme';
import { errorStart, type ErrorSource, type ScenarioFormValues } from './scenario-form-values';
import { SwitchRow } from './switch-row';

/** A path under the error sources, as a literal type react-hook-form checks against the form's values. */
const p = <R extends string>(rest: R) => `definition.errors.${rest}` as const;

export function ErrorFields({ outputUnit }: { outputUnit: string }) {
  const { control, setValue } = useFormContext<ScenarioFormValues>();
  const errors = (useWatch({ control, name: 'definition.errors' }) ?? {}) as ScenarioErrors;
  const toggle = (source: ErrorSource) => (on: boolean) =>
    setValue(p(source), (on ? JSON.parse(JSON.stringify(errorStart[source])) : undefined), { shouldDirty: true });
  const fullScale = (channel: 'inputFullScale' | 'outputFullScale') => errors.quantisation?.[channel];
  return (
    <View style={styles.fields}>
      <NoiseFields channel="inputNoise" label="Noise on the force channel" unit="N²/Hz" on={!!errors.inputNoise} onToggle={toggle('inputNoise')} spec={errors.inputNoise} />
      <NoiseFields channel="outputNoise" label="Noise on the response channel" unit={`(${outputUnit})²/Hz`} on={!!errors.outputNoise} onToggle={toggle('outputNoise')} spec={errors.outputNoise} />
      <SwitchRow label="Delay between the channels" hint="The response lags the force (cables, filters)" on={errors.delayS !== undefined} onChange={toggle('delayS')} testID="error-delay">
        <NumberField control={control} name={p('delayS')} label="Delay" unit="s" hint="0.0005 s is 0.5 ms" />
      </SwitchRow>
      <SwitchRow label="Response channel gain error" on={errors.gainMismatch !== undefined} onChange={toggle('gainMismatch')}>
        <NumberField control={control} name={p('gainMismatch')} label="Gain as a ratio" unit="" hint="1 is no error" />
      </SwitchRow>
      <SwitchRow label="Response channel phase error" on={errors.phaseMismatchDeg !== undefined} onChange={toggle('phaseMismatchDeg')}>
        <NumberField control={control} name={p('phaseMismatchDeg')} label="Phase error" unit="°" hint="−180 … 180" />
      </SwitchRow>
      <SwitchRow label="ADC quantisation and overload" on={!!errors.quantisation} onChange={toggle('quantisation')}>
        <NumberField control={control} name={p('quantisation.bits')} label="Converter resolution" unit="bits" hint="2 … 32" />
        {(['inputFullScale', 'outputFullScale'] as const).map((channel) => (
          <View key={channel} style={styles.fields}>
            <ChoiceChips
              label={channel === 'inputFullScale' ? 'Force channel range' : 'Response channel range'}
              options={[
                { value: 'auto', label: 'Auto (1.25 × largest sample)' },
                { value: 'set', label: 'Set a range' },
              ]}
              value={typeof fullScale(channel) === 'number' ? 'set' : 'auto'}
              onChange={(v) => setValue(p(`quantisation.${channel}`), (v === 'auto' ? 'auto' : 1), { shouldDirty: true })}
            />
            {typeof fullScale(channel) === 'number' ? (
              <NumberField control={control} name={p(`quantisation.${channel}`)} label="Range ±" unit={channel === 'inputFullScale' ? 'N' : outputUnit} />
            ) : null}
          </View>
        ))}
      </SwitchRow>
      <SwitchRow label="Cubic stiffness" hint="A Duffing spring; the reference stays the linear FRF" on={!!errors.cubicStiffness} onChange={toggle('cubicStiffness')}>
        <NumberField control={control} name={p('cubicStiffness.k3NPerM3')} label="Cubic stiffness k₃" unit="N/m³" hint="Negative softens" />
        <NumberField control={control} name={p('cubicStiffness.springIndex')} label="On spring number (from 0)" unit="" hint="0 for a single mass" />
        <NumberField control={control} name={p('cubicStiffness.oversampling')} label="Integration sub-steps per sample" unit="" hint="4 … 64" />
      </SwitchRow>
      <SwitchRow label="Clipping" hint="Hard limits before noise and ADC" on={!!errors.clipping} onChange={toggle('clipping')}>
        <NumberField control={control} name={p('clipping.inputLimitN')} label="Force clips at ±" unit="N" />
        <NumberField control={control} name={p('clipping.outputLimit')} label="Response clips at ±" unit={outputUnit} />
      </SwitchRow>
    </View>
  );
}

interface NoiseProps {
  channel: 'inputNoise' | 'outputNoise';
  label: string;
  unit: string;
  on: boolean;
  onToggle: (on: boolean) => void;
  spec: ScenarioErrors['inputNoise'];
}

function NoiseFields({ channel, label, unit, on, onToggle, spec }: NoiseProps) {
  const { control, setValue } = useFormContext<ScenarioFormValues>();
  const asPsd = !!spec && 'psd' in spec;
  return (
    <SwitchRow label={label} hint="Uncorrelated white noise" on={on} onChange={onToggle} testID={`error-${channel}`}>
      <ChoiceChips
        label="Given as"
        options={[
          { value: 'snr', label: 'SNR over the band' },
          { value: 'psd', label: 'Noise PSD level' },
        ]}
        value={asPsd ? 'psd' : 'snr'}
        onChange={(v) => setValue(p(channel), (v === 'psd' ? { psd: 1e-6 } : { snrDb: 20 }), { shouldDirty: true })}
      />
      {asPsd ? (
        <NumberField control={control} name={p(`${channel}.psd`)} label="Noise PSD" unit={unit} />
      ) : (
        <NumberField control={control} name={p(`${channel}.snrDb`)} label="Signal-to-noise ratio" unit="dB" hint="−40 … 200, over the excitation band" />
      )}
    </SwitchRow>
  );
}

const styles = StyleSheet.create({ fields: { gap: space.md } });
