/**
 * The engine's advice for one of the lab's scenarios, computed in the browser: block length and
 * resolution from the narrowest half-power bandwidth, the averages a magnitude tolerance needs at
 * the expected coherence, the record that takes, and the errors it predicts (adviseRecipe, whose
 * sources are Bendat & Piersol's random-error formulas, Welch's overlap figures and common
 * practice for Δf ≤ B_r/4). The settings can be taken into the recipe.
 */
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { adviseRecipe, type Advice } from '@/shared/engine/advice';
import type { Recipe } from '@/shared/engine/recipe';
import { errorText } from '@/shared/ui/api/client';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { AppText, Button, Caution, TextField } from '@/shared/ui/components';
import { SelectField } from '@/shared/ui/screens/kit/choice-field';
import { FactRow } from '@/shared/ui/screens/kit/figure';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { parseNumber } from '@/shared/ui/screens/systems/number-field';
import { space } from '@/shared/ui/theme';

interface RecipeAdviceProps {
  labId: string;
  recipe: Recipe;
  canWrite: boolean;
  onUse: (settings: Partial<Recipe>) => void;
}

export function RecipeAdvice({ labId, recipe, canWrite, onUse }: RecipeAdviceProps) {
  const client = useQueryClient();
  const list = scenariosApi.useList(labId, { limit: 100 });
  const [scenarioId, setScenarioId] = useState<string | undefined>();
  const [target, setTarget] = useState(String(recipe.tolerances?.magnitudeDb ?? 1));
  const [advice, setAdvice] = useState<Advice | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const targetDb = parseNumber(target);
  const targetOk = targetDb !== undefined && targetDb > 0;
  const options = (list.data?.items ?? []).map((s) => ({ value: s.id, label: `${s.name} (v${s.latestVersion})` }));

  const advise = async () => {
    if (!scenarioId || !targetOk) return;
    setBusy(true);
    setProblem(null);
    setAdvice(null);
    try {
      const record = await client.fetchQuery({ queryKey: scenariosApi.keys.latest(labId, scenarioId), queryFn: ({ signal }) => scenariosApi.fetchLatest(labId, scenarioId, signal) });
      // Let the busy state paint before the engine works on the main thread.
      await new Promise((resolve) => setTimeout(resolve, 0));
      const window = recipe.window === 'kaiser' ? undefined : recipe.window;
      setAdvice(adviseRecipe(record.definition, { targetMagnitudeDb: targetDb, window, overlap: recipe.overlap }));
    } catch (err) {
      setProblem(err instanceof Error && err.name === 'EngineInputError' ? err.message : errorText(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Panel title="Advice for a scenario" testID="recipe-advice">
      <AppText variant="small" tone="muted">The engine proposes settings for a scenario of this lab and predicts the errors they give.</AppText>
      <SelectField label="Scenario" options={options} value={scenarioId} onChange={setScenarioId} placeholder={list.isPending ? 'Loading scenarios…' : 'Choose a scenario'} testID="advice-scenario" />
      <TextField label="Magnitude tolerance (dB)" value={target} onChangeText={setTarget} inputMode="decimal" error={targetOk ? undefined : 'Must be a number > 0'} />
      <Button label="Advise" variant="secondary" compact disabled={!scenarioId || !targetOk} busy={busy} busyLabel="Working it out…" onPress={() => void advise()} />
      {problem ? (
        <AppText variant="small" tone="fail" role="alert">{problem}</AppText>
      ) : null}
      {advice ? <AdviceFigures advice={advice} canWrite={canWrite} onUse={onUse} /> : null}
    </Panel>
  );
}

function AdviceFigures({ advice, canWrite, onUse }: { advice: Advice; canWrite: boolean; onUse: RecipeAdviceProps['onUse'] }) {
  const m = advice.governingMode;
  const r = advice.recipe;
  return (
    <View style={styles.figures} testID="advice-figures">
      {m ? <FactRow label="Governing mode (narrowest half-power bandwidth)" text={`${m.naturalFrequencyHz.toPrecision(4)} Hz, B_r ${m.halfPowerBandwidthHz.toPrecision(3)} Hz`} /> : null}
      <FactRow label="Line spacing Δf" value={advice.frequencyResolutionHz} unit="Hz" digits={4} />
      <FactRow label="Block length" text={`${advice.blockLength} samples · ${advice.blockDurationS.toPrecision(4)} s`} />
      <FactRow label="Window and overlap" text={`${advice.window}, ${Math.round(advice.overlap * 100)} %`} />
      <FactRow label="Blocks to average" value={advice.blocks} unit="" />
      <FactRow label="Equivalent independent averages" value={advice.effectiveAverages} unit="" digits={4} />
      <FactRow label="Record needed" text={`${advice.recordLengthS.toPrecision(4)} s · ${advice.recordSamples} samples`} />
      {advice.resolutionBias ? <FactRow label="Predicted resolution bias at the resonance" value={100 * advice.resolutionBias.kernel} unit="%" digits={3} /> : null}
      <FactRow label={`Predicted 95 % magnitude error at ${advice.worstLineHz.toPrecision(4)} Hz`} value={advice.predicted95Db} unit="dB" digits={3} />
      <FactRow label="Estimator" text={r.estimator} />
      {advice.notes.length ? (
        <View style={styles.notes}>
          {advice.notes.map((n) => (
            <AppText key={n} variant="small">{`• ${n}`}</AppText>
          ))}
        </View>
      ) : null}
      {advice.warnings.length ? (
        <Caution title="The engine warns">
          <View style={styles.notes}>
            {advice.warnings.map((w) => (
              <AppText key={w} variant="small">{`• ${w}`}</AppText>
            ))}
          </View>
        </Caution>
      ) : null}
      {canWrite ? (
        <Button
          label="Use these settings"
          variant="secondary"
          compact
          onPress={() =>
            onUse({ blockLength: r.blockLength, frequencyResolutionHz: undefined, window: r.window, overlap: r.overlap, averages: r.averages, estimator: r.estimator, band: r.band, transient: r.transient })
          }
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({ figures: { gap: space.xs }, notes: { gap: space.xs } });
