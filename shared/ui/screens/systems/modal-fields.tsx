/**
 * Modal fields: a table of modes, each with its natural frequency, damping ratio and one way of
 * giving its strength — a real modal constant, a complex residue, or mode-shape values at the
 * force and response points with a modal mass (the three forms of the engine's modal schema).
 */
import { useFieldArray, useFormContext, useWatch, type Path } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { ModeSpec } from '@/shared/engine/systems/schema';
import { AppText, Button } from '@/shared/ui/components';
import { ChoiceChips, FieldError } from '@/shared/ui/screens/kit/choice-field';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { errorAt } from './form-rules';
import { NumberField } from './number-field';
import type { SystemFormValues } from './system-form-values';

type Strength = 'modalConstant' | 'residue' | 'shape';
/** The number fields of one mode, as paths under definition.modes.<i>. */
type ModeField = 'naturalFrequencyHz' | 'dampingRatio' | 'modalConstant' | 'residue.re' | 'residue.im' | 'shape.atInput' | 'shape.atOutput' | 'shape.modalMassKg';
const strengthOptions = [
  { value: 'modalConstant', label: 'Modal constant' },
  { value: 'residue', label: 'Complex residue' },
  { value: 'shape', label: 'Mode shape' },
] as const;

const strengthOf = (m: Partial<ModeSpec> | undefined): Strength => (m?.residue ? 'residue' : m?.shape ? 'shape' : 'modalConstant');

function withStrength(m: ModeSpec, strength: Strength): ModeSpec {
  const base = { naturalFrequencyHz: m.naturalFrequencyHz, dampingRatio: m.dampingRatio };
  if (strength === 'residue') return { ...base, residue: { re: 0, im: -1e-3 } };
  if (strength === 'shape') return { ...base, shape: { atInput: 1, atOutput: 1, modalMassKg: 10 } };
  return { ...base, modalConstant: 0.01 };
}

export function ModalFields() {
  const { control, getValues, setValue, formState } = useFormContext<SystemFormValues>();
  const { fields, append, remove } = useFieldArray({ control, name: 'definition.modes' });
  const modes = useWatch({ control, name: 'definition.modes' });
  const name = (i: number, rest: ModeField): Path<SystemFormValues> => `definition.modes.${i}.${rest}`;
  return (
    <View style={styles.fields}>
      <FieldError error={errorAt(formState.errors, 'definition.modes')} />
      {fields.map((field, i) => {
        const strength = strengthOf(modes?.[i]);
        return (
          <View key={field.id} style={styles.mode} role="group" aria-label={`Mode ${i + 1}`}>
            <View style={styles.modeHead}>
              <AppText variant="bodyStrong">{`Mode ${i + 1}`}</AppText>
              <Button label={`Remove mode ${i + 1}`} variant="secondary" compact disabled={fields.length <= 1} onPress={() => remove(i)} />
            </View>
            <View style={styles.pair}>
              <View style={styles.cell}>
                <NumberField control={control} name={name(i, 'naturalFrequencyHz')} label="Natural frequency fₙ" unit="Hz" />
              </View>
              <View style={styles.cell}>
                <NumberField control={control} name={name(i, 'dampingRatio')} label="Damping ratio ζ" unit="" hint="0.01 is 1 %" />
              </View>
            </View>
            <ChoiceChips
              label="Strength given as"
              options={strengthOptions}
              value={strength}
              onChange={(next) => setValue(`definition.modes.${i}`, withStrength(getValues(`definition.modes.${i}`), next), { shouldDirty: true })}
              error={errorAt(formState.errors, `definition.modes.${i}.modalConstant`)}
            />
            {strength === 'modalConstant' ? (
              <NumberField control={control} name={name(i, 'modalConstant')} label="Modal constant R = φ_in·φ_out/m_r" unit="1/kg" />
            ) : strength === 'residue' ? (
              <View style={styles.pair}>
                <View style={styles.cell}>
                  <NumberField control={control} name={name(i, 'residue.re')} label="Residue, real part" unit="m/(N·s)" />
                </View>
                <View style={styles.cell}>
                  <NumberField control={control} name={name(i, 'residue.im')} label="Residue, imaginary part" unit="m/(N·s)" />
                </View>
              </View>
            ) : (
              <View style={styles.pair}>
                <View style={styles.cell}>
                  <NumberField control={control} name={name(i, 'shape.atInput')} label="Shape at force point" unit="" />
                </View>
                <View style={styles.cell}>
                  <NumberField control={control} name={name(i, 'shape.atOutput')} label="Shape at response point" unit="" />
                </View>
                <View style={styles.cell}>
                  <NumberField control={control} name={name(i, 'shape.modalMassKg')} label="Modal mass" unit="kg" />
                </View>
              </View>
            )}
          </View>
        );
      })}
      <Button
        label="Add a mode"
        variant="secondary"
        compact
        disabled={fields.length >= 40}
        onPress={() => {
          const last = modes?.[modes.length - 1];
          append({ naturalFrequencyHz: (last?.naturalFrequencyHz ?? 50) * 1.5, dampingRatio: last?.dampingRatio ?? 0.01, modalConstant: 0.01 });
        }}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.md },
  mode: { gap: space.sm, padding: space.md, borderWidth: stroke.rule, borderColor: colors.border, borderRadius: radius.sm, backgroundColor: colors.background },
  modeHead: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'center', gap: space.sm },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flex: 1, minWidth: 150 },
});
