/**
 * Recipe settings: block length or frequency resolution, window (Kaiser β), overlap, averages,
 * detrending, estimator (with the Hv weighting), band of interest, scaling, the transient windows
 * of impact processing, and the acceptance criteria.
 */
import { useFormContext, useWatch, type Path, type PathValue } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { Recipe } from '@/shared/engine/recipe';
import { AppText, Caution } from '@/shared/ui/components';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { SwitchRow } from '@/shared/ui/screens/scenarios/switch-row';
import { NumberField } from '@/shared/ui/screens/systems/number-field';
import { space } from '@/shared/ui/theme';
import { detrendOptions, estimatorOptions, scalingOptions, toleranceFields, transientStart, windowOptions, type RecipeFormValues } from './recipe-form-values';

/** A path under the definition, as a literal type react-hook-form checks against the form's values. */
const p = <R extends string>(rest: R) => `definition.${rest}` as const;

export function RecipeFields() {
  const { control, setValue, getValues } = useFormContext<RecipeFormValues>();
  const r = useWatch({ control, name: 'definition' }) as Recipe;
  const byResolution = r.frequencyResolutionHz !== undefined;
  const set = <P extends Path<RecipeFormValues>>(path: P, value: PathValue<RecipeFormValues, P>) => setValue(path, value, { shouldDirty: true });
  return (
    <View style={styles.fields}>
      <Panel title="Blocks">
        <ChoiceChips
          label="Block size given as"
          options={[
            { value: 'block', label: 'Block length (samples)' },
            { value: 'resolution', label: 'Frequency resolution (Hz)' },
          ]}
          value={byResolution ? 'resolution' : 'block'}
          onChange={(v) => {
            const d = getValues('definition') as Recipe;
            if (v === 'resolution' && !byResolution) setValue('definition', { ...d, blockLength: undefined, frequencyResolutionHz: 0.125 }, { shouldDirty: true });
            if (v === 'block' && byResolution) setValue('definition', { ...d, frequencyResolutionHz: undefined, blockLength: 4096 }, { shouldDirty: true });
          }}
        />
        {byResolution ? (
          <NumberField control={control} name={p('frequencyResolutionHz')} label="Line spacing Δf" unit="Hz" hint="The shortest power-of-two block no coarser than this" />
        ) : (
          <NumberField control={control} name={p('blockLength')} label="Block length N" unit="samples" hint="A power of two, 4 … 16 777 216" />
        )}
        <ChoiceChips label="Window" options={windowOptions} value={r.window} onChange={(v) => set(p('window'), v)} />
        {r.window === 'kaiser' ? <NumberField control={control} name={p('windowParams.kaiserBeta')} label="Kaiser β" unit="" hint="0 … 100" /> : null}
        <NumberField control={control} name={p('overlap')} label="Overlap" unit="" hint="A fraction in [0, 1): 0.5 is 50 %" />
        <ChoiceChips
          label="Averages"
          options={[
            { value: 'all', label: 'Every block of the record' },
            { value: 'count', label: 'A set number' },
          ]}
          value={typeof r.averages === 'number' ? 'count' : 'all'}
          onChange={(v) => set(p('averages'), v === 'all' ? 'all' : 20)}
        />
        {typeof r.averages === 'number' ? <NumberField control={control} name={p('averages')} label="Blocks to average" unit="" /> : null}
        <ChoiceChips label="Detrend each block" options={detrendOptions} value={r.detrend} onChange={(v) => set(p('detrend'), v)} />
        <ChoiceChips label="Spectral scaling" options={scalingOptions} value={r.scaling} onChange={(v) => set(p('scaling'), v)} />
      </Panel>
      <Panel title="Estimator and band">
        <ChoiceChips label="Estimator" options={estimatorOptions} value={r.estimator} onChange={(v) => set(p('estimator'), v)} />
        {r.estimator === 'Hv' ? (
          <>
            <Caution title="Hv depends on channel scaling" testID="hv-note">
              Hv weighs the noise on the two channels as equal after scaling. The weight κ says how much more noise power the response channel carries than the force channel, in their own units; with κ = 1 a change of units on one channel changes the estimate.
            </Caution>
            <NumberField control={control} name={p('hvWeight')} label="Noise weight κ (response ÷ force)" unit="" hint="Empty: 1" />
          </>
        ) : null}
        <View style={styles.pair}>
          <View style={styles.cell}>
            <NumberField control={control} name={p('band.lowHz')} label="Band from" unit="Hz" />
          </View>
          <View style={styles.cell}>
            <NumberField control={control} name={p('band.highHz')} label="Band to" unit="Hz" />
          </View>
        </View>
      </Panel>
      <SwitchRow
        label="Transient windows (impact testing)"
        hint="Triggered blocks: a force window on the input, an exponential window on the response"
        on={r.transient !== undefined}
        onChange={(on) => set(p('transient'), on ? { ...transientStart } : undefined)}
        testID="transient-switch"
      >
        <NumberField control={control} name={p('transient.forceWindowFraction')} label="Force window length" unit="of the block" hint="(0, 1]" />
        <NumberField control={control} name={p('transient.exponentialDecayFraction')} label="Exponential decay time τ" unit="of the block" />
        <NumberField control={control} name={p('transient.triggerLevelFraction')} label="Trigger level" unit="of the peak force" hint="(0, 1]" />
        <NumberField control={control} name={p('transient.pretriggerFraction')} label="Pretrigger" unit="of the block" hint="[0, 1)" />
      </SwitchRow>
      <Panel title="Acceptance criteria">
        <AppText variant="small" tone="muted">A result passes when every criterion given here holds in the band. Leave one empty to not judge it.</AppText>
        {toleranceFields.map((t) => (
          <NumberField key={t.key} control={control} name={p(`tolerances.${t.key}`)} label={t.label} unit={t.unit} />
        ))}
      </Panel>
    </View>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.lg },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flex: 1, minWidth: 140 },
});
