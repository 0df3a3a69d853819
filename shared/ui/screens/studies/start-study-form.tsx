/**
 * Start a study: recipe (latest version) × scenarios × seeds, checked with the server's own
 * schema (startStudySchema) before anything is sent.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { Controller, useForm, type Resolver } from 'react-hook-form';
import { Pressable, StyleSheet, View } from 'react-native';
import type { z } from 'zod';
import { MAX_STUDY_RUNS, startStudySchema, type ResourceSummary } from '@/shared/api/work';
import { errorText } from '@/shared/ui/api/client';
import { useStartStudy } from '@/shared/ui/api/studies';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';
import { FieldError, SelectField } from '../kit/choice-field';

type Fields = z.input<typeof startStudySchema>;
type Parsed = z.output<typeof startStudySchema>;

const typeHints: Record<string, string> = {
  seeds: 'Enter a whole number of seeds, 1 to 1000',
  baseSeed: 'Enter a whole number, 0 or more',
  'recipe.id': 'Choose a recipe',
  scenarios: 'Tick at least one scenario',
};

/** The server schema, with plain words where zod's own type messages would show. */
const baseResolver = zodResolver(startStudySchema);
export const startStudyResolver: Resolver<Fields, unknown, Parsed> = async (values, context, options) => {
  const result = await baseResolver(values, context, options);
  const fix = (errors: Record<string, unknown>, prefix = '') => {
    for (const [key, value] of Object.entries(errors)) {
      const path = prefix + key;
      const e = value as { message?: string; type?: string } & Record<string, unknown>;
      if (e && typeof e.message === 'string' && /^Invalid input|^Too small|^Too big/.test(e.message) && typeHints[path]) e.message = typeHints[path];
      else if (e && typeof e === 'object' && !('message' in e && 'type' in e)) fix(e as Record<string, unknown>, `${path}.`);
    }
  };
  fix(result.errors as Record<string, unknown>);
  return result;
};

const toNumber = (text: string) => (text.trim() === '' ? undefined : Number(text));

type Props = { labId: string; recipes: ResourceSummary[]; scenarios: ResourceSummary[] };

export function StartStudyForm({ labId, recipes, scenarios }: Props) {
  const start = useStartStudy(labId);
  const router = useRouter();
  const { control, handleSubmit, watch, formState: { errors } } = useForm<Fields, unknown, Parsed>({
    resolver: startStudyResolver,
    defaultValues: { name: '', recipe: { id: '' }, scenarios: [], seeds: 20, baseSeed: 1 },
  });
  const chosen = watch('scenarios') ?? [];
  const seeds = watch('seeds');
  const runs = chosen.length * (typeof seeds === 'number' && Number.isFinite(seeds) ? seeds : 0);
  const submit = handleSubmit((values) => start.mutate(values, { onSuccess: (study) => router.replace(`/studies/${study.id}`) }));

  return (
    <View style={styles.form} testID="start-study-form">
      <Controller control={control} name="name" render={({ field }) => (
        <TextField label="Study name" hint="What the study shows, e.g. “Frame survey against noise on both channels”." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.name?.message} testID="study-name" />
      )} />
      <Controller control={control} name="recipe.id" render={({ field }) => (
        <SelectField label="Recipe" hint="The latest version of the recipe is run." placeholder="Choose a recipe…" value={field.value || undefined}
          options={recipes.map((r) => ({ value: r.id, label: `${r.name} (v${r.latestVersion})` }))} onChange={field.onChange}
          error={errors.recipe?.id?.message ?? errors.recipe?.message} testID="study-recipe" />
      )} />
      <Controller control={control} name="scenarios" render={({ field }) => {
        const ids = (field.value ?? []).map((s) => s.id);
        const toggle = (id: string) => field.onChange(ids.includes(id) ? field.value.filter((s) => s.id !== id) : [...(field.value ?? []), { id }]);
        return (
          <View style={styles.group}>
            <AppText variant="smallStrong">Scenarios</AppText>
            <AppText variant="small" tone="muted">Results list them in the order you tick them.</AppText>
            <View role="group" aria-label="Scenarios" style={styles.checks}>
              {scenarios.map((s) => {
                const position = ids.indexOf(s.id);
                return (
                  <Pressable key={s.id} role="checkbox" aria-checked={position >= 0} accessibilityLabel={s.name} onPress={() => toggle(s.id)} style={[styles.check, position >= 0 && styles.checkOn]}>
                    <View style={[styles.box, position >= 0 && styles.boxOn]}>
                      <AppText variant="label">{position >= 0 ? String(position + 1) : ' '}</AppText>
                    </View>
                    <View style={styles.flex}>
                      <AppText variant="body">{s.name}</AppText>
                      {s.description ? <AppText variant="small" tone="muted" numberOfLines={2}>{s.description}</AppText> : null}
                    </View>
                  </Pressable>
                );
              })}
            </View>
            <FieldError error={errors.scenarios?.message ?? errors.scenarios?.root?.message} />
          </View>
        );
      }} />
      <View style={styles.pair}>
        <View style={styles.flex}>
          <Controller control={control} name="seeds" render={({ field }) => (
            <TextField label="Seeds per scenario" hint="Monte Carlo runs of each scenario." value={field.value === undefined || Number.isNaN(field.value) ? '' : String(field.value)} onChangeText={(t) => field.onChange(toNumber(t))} inputMode="numeric" error={errors.seeds?.message} testID="study-seeds" />
          )} />
        </View>
        <View style={styles.flex}>
          <Controller control={control} name="baseSeed" render={({ field }) => (
            <TextField label="Base seed" hint="Run r of scenario j uses base + j·1000000 + r." value={field.value === undefined || Number.isNaN(field.value) ? '' : String(field.value)} onChangeText={(t) => field.onChange(toNumber(t))} inputMode="numeric" error={errors.baseSeed?.message} testID="study-base-seed" />
          )} />
        </View>
      </View>
      <AppText variant="number" tone={runs > MAX_STUDY_RUNS ? 'fail' : 'muted'} testID="study-runs">{`${runs} runs of at most ${MAX_STUDY_RUNS}`}</AppText>
      {start.isError ? <AppText variant="body" tone="fail" role="alert" testID="start-error">{errorText(start.error)}</AppText> : null}
      <Button label="Start the study" busy={start.isPending} busyLabel="Starting…" onPress={() => void submit()} testID="start-study-submit" />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg, maxWidth: layout.contentMaxWidth },
  flex: { flex: 1, minWidth: 0 },
  group: { gap: space.xs },
  checks: { gap: space.xs },
  check: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchTarget,
    padding: space.sm,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.sm,
    backgroundColor: colors.surface,
  },
  checkOn: { borderColor: colors.primary, backgroundColor: colors.primaryTint },
  box: { width: 24, height: 24, alignItems: 'center', justifyContent: 'center', borderWidth: stroke.focus, borderColor: colors.borderStrong, borderRadius: radius.sm },
  boxOn: { borderColor: colors.text, backgroundColor: colors.surface },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
