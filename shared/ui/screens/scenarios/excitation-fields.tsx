/**
 * Excitation: the kind used in the trade (random, burst random, periodic random, pseudo-random,
 * chirp, impact), its band, its level as RMS or peak force, and the timing fields of its kind,
 * with the units of the engine's scenario schema.
 */
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { ScenarioInput } from '@/shared/engine/scenario';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { errorAt } from '@/shared/ui/screens/systems/form-rules';
import { NumberField } from '@/shared/ui/screens/systems/number-field';
import { space } from '@/shared/ui/theme';
import { excitationAs, excitationOptions, type ExcitationKind, type ScenarioFormValues } from './scenario-form-values';

type Excitation = ScenarioInput['excitation'];
/** A path under the excitation, as a literal type react-hook-form checks against the form's values. */
const p = <R extends string>(rest: R) => `definition.excitation.${rest}` as const;

export function ExcitationFields() {
  const { control, getValues, setValue, formState } = useFormContext<ScenarioFormValues>();
  // Watching the whole definition: a replaced sub-object (another kind) re-renders reliably.
  const definition = useWatch({ control, name: 'definition' }) as ScenarioInput;
  const e = definition.excitation;
  const fs = definition.acquisition?.sampleRateHz;
  const level = e.level ?? { rmsN: 10 };
  const levelKind = 'peakN' in level ? 'peakN' : 'rmsN';
  const value = 'peakN' in level ? level.peakN : level.rmsN;
  return (
    <View style={styles.fields}>
      <ChoiceChips
        label="Excitation"
        options={excitationOptions}
        value={e.kind}
        onChange={(kind: ExcitationKind) =>
          kind !== e.kind && setValue('definition.excitation', excitationAs(kind, getValues('definition.excitation') as Excitation, fs || 512), { shouldDirty: true })
        }
      />
      {e.kind !== 'impact' ? (
        <View style={styles.pair}>
          <View style={styles.cell}>
            <NumberField control={control} name={p('band.lowHz')} label="Band from" unit="Hz" />
          </View>
          <View style={styles.cell}>
            <NumberField control={control} name={p('band.highHz')} label="Band to" unit="Hz" hint="Below fs/2" />
          </View>
        </View>
      ) : null}
      <ChoiceChips
        label="Level given as"
        options={[
          { value: 'rmsN', label: 'RMS force' },
          { value: 'peakN', label: 'Peak force' },
        ]}
        value={levelKind}
        onChange={(k) => k !== levelKind && setValue(p('level'), k === 'rmsN' ? { rmsN: value } : { peakN: value }, { shouldDirty: true })}
        error={errorAt(formState.errors, 'definition.excitation.level')}
      />
      <NumberField control={control} name={p(`level.${levelKind}`)} label={levelKind === 'rmsN' ? 'RMS force over the record' : 'Largest force sample'} unit="N" />
      <KindFields kind={e.kind} />
    </View>
  );
}

function KindFields({ kind }: { kind: ExcitationKind }) {
  const { control, setValue } = useFormContext<ScenarioFormValues>();
  const sweep = useWatch({ control, name: p('sweep') });
  const doubleHit = useWatch({ control, name: p('doubleHit') });
  if (kind === 'random') return null;
  if (kind === 'burst-random') {
    return (
      <>
        <NumberField control={control} name={p('blockLengthS')} label="Burst block length" unit="s" hint="A whole number of samples" />
        <NumberField control={control} name={p('burstFraction')} label="Fraction of the block the burst is on" unit="" hint="0 < fraction ≤ 1" />
        <NumberField control={control} name={p('offsetS')} label="Burst start within the block" unit="s" />
      </>
    );
  }
  if (kind === 'periodic-random' || kind === 'pseudo-random') {
    return (
      <>
        <NumberField control={control} name={p('periodS')} label="Period" unit="s" hint="A power-of-two number of samples" />
        {kind === 'periodic-random' ? (
          <NumberField control={control} name={p('periodsPerRealisation')} label="Periods per random realisation" unit="" />
        ) : null}
      </>
    );
  }
  if (kind === 'chirp') {
    return (
      <>
        <NumberField control={control} name={p('periodS')} label="Sweep period" unit="s" />
        <ChoiceChips
          label="Sweep law"
          options={[
            { value: 'linear', label: 'Linear' },
            { value: 'log', label: 'Logarithmic' },
          ]}
          value={sweep ?? 'linear'}
          onChange={(v) => setValue(p('sweep'), v, { shouldDirty: true })}
        />
      </>
    );
  }
  return (
    <>
      <NumberField control={control} name={p('pulseDurationS')} label="Half-sine pulse duration" unit="s" hint="At least 2 samples" />
      <NumberField control={control} name={p('periodS')} label="Time between impacts" unit="s" />
      <NumberField control={control} name={p('offsetS')} label="First hit within each period" unit="s" hint="Empty: 5 % of the period" />
      <ChoiceChips
        label="Second hit (hammer bounce)"
        options={[
          { value: 'no', label: 'None' },
          { value: 'yes', label: 'Add a second hit' },
        ]}
        value={doubleHit ? 'yes' : 'no'}
        onChange={(v) => setValue(p('doubleHit'), v === 'yes' ? { delayS: 0.002, amplitudeRatio: 0.3 } : undefined, { shouldDirty: true })}
      />
      {doubleHit ? (
        <>
          <NumberField control={control} name={p('doubleHit.delayS')} label="Delay of the second hit" unit="s" />
          <NumberField control={control} name={p('doubleHit.amplitudeRatio')} label="Second hit ÷ first" unit="" />
        </>
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.md },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flex: 1, minWidth: 140 },
});
