/**
 * Start a sweep: a recipe and a scenario of the lab, one setting and its values (a second setting
 * is optional), seeds. Checked with the server's schema before sending; the server checks the grid
 * against the recipe and scenario and answers in words naming the setting and value.
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { startSweepSchema } from '@/shared/api/sweeps';
import type { ResourceSummary } from '@/shared/api/work';
import { SWEEP_SETTING_NAMES, SWEEP_SETTINGS, type SweepSetting, type SweepValue } from '@/shared/engine/sweep';
import { errorText } from '@/shared/ui/api/client';
import { useStartSweep } from '@/shared/ui/api/sweeps';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { layout, space } from '@/shared/ui/theme';
import { SelectField } from '../kit/choice-field';

const settingOptions = SWEEP_SETTING_NAMES.map((s) => ({
  value: s,
  label: `${SWEEP_SETTINGS[s].label}${SWEEP_SETTINGS[s].unit ? ` (${SWEEP_SETTINGS[s].unit})` : ''}${SWEEP_SETTINGS[s].kind === 'condition' ? ' — test condition' : ''}`,
}));

/** "512, 1024" → values of the setting; words stay words where the setting takes words. */
export function parseValues(setting: SweepSetting, text: string): SweepValue[] {
  const info = SWEEP_SETTINGS[setting];
  return text
    .split(/[,;\s]+/)
    .map((w) => w.trim())
    .filter((w) => w !== '')
    .map((w) => (Array.isArray(info.values) || (info.values === 'integer-or-all' && w.toLowerCase() === 'all') ? w.toLowerCase() === 'all' ? 'all' : w : Number(w)));
}

type Props = { labId: string; recipes: ResourceSummary[]; scenarios: ResourceSummary[] };

export function SweepStartForm({ labId, recipes, scenarios }: Props) {
  const start = useStartSweep(labId);
  const router = useRouter();
  const [name, setName] = useState('');
  const [recipe, setRecipe] = useState('');
  const [scenario, setScenario] = useState('');
  const [setting, setSetting] = useState<SweepSetting>('blockLength');
  const [values, setValues] = useState('');
  const [seeds, setSeeds] = useState('10');
  const [problem, setProblem] = useState<string | null>(null);

  const submit = () => {
    const body = {
      name: name.trim() || `Sweep of ${SWEEP_SETTINGS[setting].label.toLowerCase()}`,
      recipe: { id: recipe },
      scenario: { id: scenario },
      vary: [{ setting, values: parseValues(setting, values) }],
      seeds: Number(seeds),
    };
    if (!recipe) return setProblem('Choose a recipe.');
    if (!scenario) return setProblem('Choose a scenario.');
    if (body.vary[0].values.length === 0) return setProblem('Enter at least one value, separated by commas.');
    if (body.vary[0].values.some((v) => typeof v === 'number' && !Number.isFinite(v))) return setProblem(`Values of ${SWEEP_SETTINGS[setting].label.toLowerCase()} must be numbers.`);
    const parsed = startSweepSchema.safeParse(body);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      return setProblem(issue.path[0] === 'seeds' ? 'Enter a whole number of seeds, 1 to 1000 (at most 5000 runs in all).' : issue.message);
    }
    setProblem(null);
    start.mutate(parsed.data, { onSuccess: (sweep) => router.replace(`/sweeps/${sweep.id}`) });
  };

  return (
    <View style={styles.form} testID="start-sweep-form">
      <TextField label="Sweep name" hint="What the sweep asks, e.g. “Shortest block for the frame survey”." value={name} onChangeText={setName} testID="sweep-name" />
      <SelectField label="Recipe" hint="Its latest version is the base of every grid point." placeholder="Choose a recipe…" value={recipe || undefined}
        options={recipes.map((r) => ({ value: r.id, label: `${r.name} (v${r.latestVersion})` }))} onChange={setRecipe} testID="sweep-recipe" />
      <SelectField label="Scenario" hint="Every grid point runs on this scenario, over the same seeds." placeholder="Choose a scenario…" value={scenario || undefined}
        options={scenarios.map((s) => ({ value: s.id, label: `${s.name} (v${s.latestVersion})` }))} onChange={setScenario} testID="sweep-scenario" />
      <SelectField label="Setting to vary" value={setting} options={settingOptions} onChange={(v) => setSetting(v as SweepSetting)} testID="sweep-setting" />
      <TextField label="Values" hint={Array.isArray(SWEEP_SETTINGS[setting].values) ? `Separated by commas, from: ${(SWEEP_SETTINGS[setting].values as readonly string[]).join(', ')}` : 'Numbers separated by commas, e.g. 512, 1024, 2048'} value={values} onChangeText={setValues} testID="sweep-values" />
      <TextField label="Seeds per grid point" hint="The same seeds at every point." value={seeds} onChangeText={setSeeds} inputMode="numeric" testID="sweep-seeds" />
      {problem ? <AppText variant="body" tone="fail" role="alert" testID="sweep-problem">{problem}</AppText> : null}
      {start.isError ? <AppText variant="body" tone="fail" role="alert" testID="sweep-start-error">{errorText(start.error)}</AppText> : null}
      <Button label="Start the sweep" busy={start.isPending} busyLabel="Starting…" onPress={submit} testID="start-sweep-submit" />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg, maxWidth: layout.contentMaxWidth },
});
