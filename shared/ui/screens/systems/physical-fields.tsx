/**
 * Physical fields: lumped masses (nodes 1…n on screen, 0…n−1 in the definition), springs and
 * dampers between two nodes or a node and ground, the force node and the response node. "Add a
 * mass" extends the chain: the new mass hangs from the last one by a spring and a damper like the
 * last ones.
 */
import { useController, useFormContext, useFormState, useWatch, type Control, type Path } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { PhysicalSpec } from '@/shared/engine/systems/schema';
import { AppText, Button } from '@/shared/ui/components';
import { FieldError, SelectField } from '@/shared/ui/screens/kit/choice-field';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { errorAt } from './form-rules';
import { NumberField } from './number-field';
import type { SystemFormValues } from './system-form-values';

type NodeRef = number | 'ground';
type Element = 'springs' | 'dampers';

function nodeOptions(n: number, withGround: boolean) {
  const masses = Array.from({ length: n }, (_, i) => ({ value: String(i), label: `Mass ${i + 1}` }));
  return withGround ? [{ value: 'ground', label: 'Ground' }, ...masses] : masses;
}

function NodeSelect({ control, name, label, n, withGround }: { control: Control<SystemFormValues>; name: Path<SystemFormValues>; label: string; n: number; withGround: boolean }) {
  const { field } = useController({ control, name });
  const { errors } = useFormState({ control, name });
  const value = field.value as NodeRef | undefined;
  return (
    <SelectField
      label={label}
      options={nodeOptions(n, withGround)}
      value={value === undefined ? undefined : String(value)}
      onChange={(v) => field.onChange(v === 'ground' ? 'ground' : Number(v))}
      error={errorAt(errors, name)}
    />
  );
}

export function PhysicalFields() {
  const { control, getValues, setValue, formState } = useFormContext<SystemFormValues>();
  const spec = useWatch({ control, name: 'definition' }) as PhysicalSpec;
  const n = spec.massesKg?.length ?? 0;
  const put = (next: PhysicalSpec) => setValue('definition', next, { shouldDirty: true });
  const current = () => getValues('definition') as PhysicalSpec;

  const addMass = () => {
    const s = current();
    const last = s.massesKg.length - 1;
    const k = s.springs[s.springs.length - 1]?.stiffnessNPerM ?? 1e5;
    const c = s.dampers[s.dampers.length - 1]?.dampingNsPerM ?? 10;
    put({
      ...s,
      massesKg: [...s.massesKg, s.massesKg[last] ?? 1],
      springs: [...s.springs, { between: [last < 0 ? 'ground' : last, last + 1], stiffnessNPerM: k }],
      dampers: [...s.dampers, { between: [last < 0 ? 'ground' : last, last + 1], dampingNsPerM: c }],
    });
  };
  const removeLastMass = () => {
    const s = current();
    const gone = s.massesKg.length - 1;
    const keeps = (e: { between: NodeRef[] }) => !e.between.includes(gone);
    put({
      ...s,
      massesKg: s.massesKg.slice(0, gone),
      springs: s.springs.filter(keeps),
      dampers: s.dampers.filter(keeps),
      inputNode: Math.min(s.inputNode, gone - 1),
      outputNode: Math.min(s.outputNode, gone - 1),
    });
  };
  const addElement = (kind: Element) => {
    const s = current();
    const value = kind === 'springs' ? { between: ['ground', 0], stiffnessNPerM: 1e5 } : { between: ['ground', 0], dampingNsPerM: 10 };
    put({ ...s, [kind]: [...s[kind], value] } as PhysicalSpec);
  };
  const removeElement = (kind: Element, i: number) => {
    const s = current();
    put({ ...s, [kind]: s[kind].filter((_, j) => j !== i) } as PhysicalSpec);
  };

  return (
    <View style={styles.fields}>
      <AppText variant="bodyStrong" role="heading" aria-level={3}>Masses</AppText>
      {spec.massesKg?.map((_, i) => (
        <NumberField key={`m${i}`} control={control} name={`definition.massesKg.${i}`} label={`Mass ${i + 1}`} unit="kg" />
      ))}
      <View style={styles.row}>
        <Button label="Add a mass" variant="secondary" compact disabled={n >= 20} onPress={addMass} />
        <Button label="Remove the last mass" variant="secondary" compact disabled={n <= 1} onPress={removeLastMass} />
      </View>
      {(['springs', 'dampers'] as const).map((kind) => (
        <View key={kind} style={styles.fields}>
          <AppText variant="bodyStrong" role="heading" aria-level={3}>{kind === 'springs' ? 'Springs' : 'Dampers'}</AppText>
          <FieldError error={errorAt(formState.errors, `definition.${kind}`)} />
          {spec[kind]?.map((_, i) => {
            const noun = kind === 'springs' ? 'Spring' : 'Damper';
            return (
              <View key={`${kind}${i}`} style={styles.element} role="group" aria-label={`${noun} ${i + 1}`}>
                <View style={styles.row}>
                  <View style={styles.cell}>
                    <NodeSelect control={control} name={`definition.${kind}.${i}.between.0`} label={`${noun} ${i + 1} from`} n={n} withGround />
                  </View>
                  <View style={styles.cell}>
                    <NodeSelect control={control} name={`definition.${kind}.${i}.between.1`} label="to" n={n} withGround />
                  </View>
                </View>
                <FieldError error={errorAt(formState.errors, `definition.${kind}.${i}.between`)} />
                {kind === 'springs' ? (
                  <NumberField control={control} name={`definition.springs.${i}.stiffnessNPerM`} label={`Stiffness of spring ${i + 1}`} unit="N/m" />
                ) : (
                  <NumberField control={control} name={`definition.dampers.${i}.dampingNsPerM`} label={`Damping of damper ${i + 1}`} unit="N·s/m" />
                )}
                <Button label={`Remove ${noun.toLowerCase()} ${i + 1}`} variant="secondary" compact disabled={spec[kind].length <= 1} onPress={() => removeElement(kind, i)} />
              </View>
            );
          })}
          <Button label={kind === 'springs' ? 'Add a spring' : 'Add a damper'} variant="secondary" compact onPress={() => addElement(kind)} />
        </View>
      ))}
      <View style={styles.row}>
        <View style={styles.cell}>
          <NodeSelect control={control} name="definition.inputNode" label="Force acts on" n={n} withGround={false} />
        </View>
        <View style={styles.cell}>
          <NodeSelect control={control} name="definition.outputNode" label="Response measured at" n={n} withGround={false} />
        </View>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-start' },
  cell: { flex: 1, minWidth: 140 },
  element: { gap: space.sm, padding: space.md, borderWidth: stroke.rule, borderColor: colors.border, borderRadius: radius.sm, backgroundColor: colors.background },
});
