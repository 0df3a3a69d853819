/** SDOF fields: mass, stiffness and damping, or natural frequency, damping ratio and stiffness. */
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { SdofSpec } from '@/shared/engine/systems/schema';
import { ChoiceChips } from '@/shared/ui/screens/kit/choice-field';
import { space } from '@/shared/ui/theme';
import { NumberField } from './number-field';
import { sdofAs, type SystemFormValues } from './system-form-values';

const givenAs = [
  { value: 'modal', label: 'Natural frequency, damping ratio, stiffness' },
  { value: 'physical', label: 'Mass, stiffness, damping' },
] as const;

export function SdofFields() {
  const { control, getValues, setValue } = useFormContext<SystemFormValues>();
  const massKg = useWatch({ control, name: 'definition.massKg' });
  const form = massKg !== undefined ? 'physical' : 'modal';
  return (
    <View style={styles.fields}>
      <ChoiceChips
        label="Given as"
        options={givenAs}
        value={form}
        onChange={(next) => {
          if (next === form) return;
          setValue('definition', sdofAs(getValues('definition') as SdofSpec, next), { shouldDirty: true });
        }}
      />
      {form === 'modal' ? (
        <>
          <NumberField control={control} name={'definition.naturalFrequencyHz'} label="Natural frequency fₙ" unit="Hz" />
          <NumberField control={control} name={'definition.dampingRatio'} label="Damping ratio ζ" unit="" hint="Fraction of critical: 0.01 is 1 %" />
        </>
      ) : (
        <>
          <NumberField control={control} name={'definition.massKg'} label="Mass m" unit="kg" />
          <NumberField control={control} name={'definition.dampingNsPerM'} label="Damping c" unit="N·s/m" hint="Below critical damping 2·√(k·m)" />
        </>
      )}
      <NumberField control={control} name={'definition.stiffnessNPerM'} label="Stiffness k" unit="N/m" />
    </View>
  );
}

const styles = StyleSheet.create({ fields: { gap: space.md } });
