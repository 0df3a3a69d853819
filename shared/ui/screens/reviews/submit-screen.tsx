/**
 * Submit a recipe version for review: the version, its finished studies as evidence, the scope
 * it is put forward for, and a justification when a criterion of the evidence failed. The form is
 * checked with the server's own schema; the server's refusals (scope not covered, a study of
 * another version…) are shown as it words them.
 */
import { useRouter } from 'expo-router';
import { useEffect, useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { EXCITATION_KINDS, submitReviewSchema } from '@/shared/api/approval';
import { errorText } from '@/shared/ui/api/client';
import { useSubmission, useSubmitForReview } from '@/shared/ui/api/reviews';
import { recipesApi } from '@/shared/ui/api/recipes';
import { useStudies } from '@/shared/ui/api/studies';
import { AppText, Button, Screen, TextField } from '@/shared/ui/components';
import { useLabId, useLabRole } from '@/shared/ui/lab-context';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { SelectField } from '../kit/choice-field';
import { Panel, TextLink } from '../kit/panel';
import { CheckList, emptySubmitValues, excitationWords, fieldOf, toRequest, valuesFrom, type Excitation, type SubmitValues } from './submit-fields';

type Errors = Partial<Record<keyof SubmitValues | 'form', string>>;

const toggle = <T extends string>(list: readonly T[], value: T): T[] => (list.includes(value) ? list.filter((v) => v !== value) : [...list, value]);

export function SubmitReviewScreen({ from }: { from?: string } = {}) {
  const labId = useLabId();
  const role = useLabRole();
  const router = useRouter();
  const recipes = recipesApi.useAll(labId);
  const studies = useStudies(labId, { status: 'finished', limit: 200 });
  const submit = useSubmitForReview(labId);
  const [values, setValues] = useState<SubmitValues>(emptySubmitValues);
  const [errors, setErrors] = useState<Errors>({});
  const returned = useSubmission(labId, from ?? '');
  const earlier = returned.data?.status === 'returned' ? returned.data : null;
  // A resubmission starts from the returned submission, once it has loaded.
  useEffect(() => {
    if (earlier) setValues(valuesFrom(earlier));
  }, [earlier]);

  const set = (patch: Partial<SubmitValues>) => {
    setValues((v) => ({ ...v, ...patch }));
    setErrors({});
    if (submit.isError) submit.reset();
  };

  const recipe = recipes.data?.items.find((r) => r.id === values.recipeId);
  const versionOptions = recipe ? Array.from({ length: recipe.latestVersion }, (_, i) => recipe.latestVersion - i).map((n) => ({ value: String(n), label: `Version ${n}` })) : [];
  const evidence = useMemo(
    () => (studies.data?.items ?? []).filter((s) => s.recipe.id === values.recipeId && String(s.recipe.version) === values.version),
    [studies.data, values.recipeId, values.version],
  );
  const anyFailed = evidence.some((s) => values.studyIds.includes(s.id) && s.pass === false);

  if (role !== 'analyst') {
    return <Screen title="Submit a recipe for review" eyebrow="Reviews" intro="Only the lab's analysts put recipes forward for review." />;
  }

  const send = () => {
    const parsed = submitReviewSchema.safeParse(toRequest(values));
    const found: Errors = {};
    if (!parsed.success) for (const issue of parsed.error.issues) found[fieldOf(issue.path)] ??= issue.message.startsWith('Invalid input') || issue.message.includes('NaN') ? 'Enter a number' : issue.message;
    if (values.recipeId === '') found.recipeId = 'Choose the recipe';
    if (values.version === '') found.version = 'Choose the version';
    if (anyFailed && values.justification.trim().length < 20) found.justification = 'A criterion of the evidence failed: say why the recipe is fit nonetheless (at least 20 characters)';
    if (Object.keys(found).length > 0 || !parsed.success) return setErrors(found);
    submit.mutate(parsed.data, { onSuccess: (submission) => router.replace(`/reviews/${submission.id}`) });
  };

  return (
    <Screen title="Submit a recipe for review" eyebrow="Reviews" intro="Put one recipe version forward with the finished studies that prove it, for the kind of structure it is meant for. A reviewer other than you signs it off.">
      <TextLink href="/reviews" testID="submit-back">All reviews</TextLink>
      {earlier ? (
        <Panel title="Submitting again" testID="resubmit-source">
          <AppText variant="body">{`${earlier.recipe.name} v${earlier.recipe.version} was returned by ${earlier.decision?.reviewer.displayName ?? 'the reviewer'}.`}</AppText>
          {earlier.decision?.reason ? <AppText variant="body">{`Reason: ${earlier.decision.reason}`}</AppText> : null}
          <AppText variant="small" tone="muted">
            {earlier.recipe.latestVersion > earlier.recipe.version
              ? `The form puts forward the newest version, v${earlier.recipe.latestVersion}: choose finished studies of that version as evidence.`
              : 'The form holds what was submitted; change what the reason asks for, or submit a newer version.'}
          </AppText>
        </Panel>
      ) : null}
      <Panel title="Recipe and evidence">
        <SelectField label="Recipe" placeholder={recipes.isPending ? 'Loading recipes…' : 'Choose a recipe'} options={(recipes.data?.items ?? []).map((r) => ({ value: r.id, label: r.name }))} value={values.recipeId || undefined} onChange={(id) => set({ recipeId: id, version: '', studyIds: [] })} error={errors.recipeId} testID="submit-recipe" />
        <SelectField label="Version" placeholder={recipe ? 'Choose a version' : 'Choose a recipe first'} options={versionOptions} value={values.version || undefined} onChange={(v) => set({ version: v, studyIds: [] })} error={errors.version} testID="submit-version" />
        <CheckList
          label="Evidence studies"
          hint="Finished studies of exactly this version."
          emptyText={values.version ? 'No finished study ran this version. Run one from Studies first.' : 'Choose the recipe and version to see its studies.'}
          options={evidence.map((s) => ({ value: s.id, label: s.name, note: s.pass === null ? 'No verdict' : s.pass ? 'All criteria passed' : 'A criterion failed' }))}
          selected={values.studyIds}
          onToggle={(id) => set({ studyIds: toggle(values.studyIds, id) })}
          error={errors.studyIds}
          testID="submit-studies"
        />
      </Panel>
      <Panel title="Scope">
        <TextField label="Structure type" hint="As the lab names it, e.g. lightly damped frame." value={values.structureType} onChangeText={(t) => set({ structureType: t })} error={errors.structureType} />
        <View style={styles.pair}>
          <View style={styles.half}><TextField label="Band from (Hz)" inputMode="decimal" value={values.lowHz} onChangeText={(t) => set({ lowHz: t })} error={errors.lowHz} /></View>
          <View style={styles.half}><TextField label="Band to (Hz)" inputMode="decimal" value={values.highHz} onChangeText={(t) => set({ highHz: t })} error={errors.highHz} /></View>
        </View>
        <View style={styles.pair}>
          <View style={styles.half}><TextField label="Damping from (% of critical)" inputMode="decimal" value={values.dampingMin} onChangeText={(t) => set({ dampingMin: t })} error={errors.dampingMin} /></View>
          <View style={styles.half}><TextField label="Damping to (% of critical)" inputMode="decimal" value={values.dampingMax} onChangeText={(t) => set({ dampingMax: t })} error={errors.dampingMax} /></View>
        </View>
        <CheckList label="Excitation" options={EXCITATION_KINDS.map((k) => ({ value: k, label: excitationWords[k] }))} selected={values.excitations} onToggle={(k) => set({ excitations: toggle(values.excitations, k as Excitation) })} error={errors.excitations} testID="submit-excitations" />
        <TextField label="Purpose (optional)" value={values.purpose} onChangeText={(t) => set({ purpose: t })} error={errors.purpose} multiline />
      </Panel>
      {anyFailed ? (
        <Panel title="Justification">
          <TextField label="Why the recipe is fit although a criterion failed" hint="At least 20 characters; the reviewer reads it beside the failed criteria." value={values.justification} onChangeText={(t) => set({ justification: t })} error={errors.justification} multiline testID="submit-justification" />
        </Panel>
      ) : null}
      {submit.isError ? (
        <View style={styles.refusal} role="alert" testID="submit-refusal">
          <AppText variant="bodyStrong" tone="fail">The submission was not accepted</AppText>
          <AppText variant="body">{errorText(submit.error)}</AppText>
        </View>
      ) : null}
      <View style={styles.actions}>
        <Button label="Submit for review" busy={submit.isPending} busyLabel="Submitting…" onPress={send} testID="submit-send" />
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  half: { flexGrow: 1, flexBasis: 160 },
  refusal: { gap: space.xs, padding: space.md, borderLeftWidth: stroke.plumb, borderLeftColor: colors.fail, borderRadius: radius.sm, backgroundColor: colors.failTint },
  actions: { flexDirection: 'row' },
});
