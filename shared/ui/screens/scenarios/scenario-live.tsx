/**
 * The scenario preview as one edits: the engine simulates the records for seed 1 in the browser
 * (settled for 400 ms) and shows a stretch of force and response, the exact FRF, the engine's
 * warnings and the time it took; saved scenarios also offer the full records as CSV.
 */
import { useMemo, useState } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { signalsCsvPath, exactCsvPath } from '@/shared/ui/api/scenarios';
import { AppText, Caution, TextField } from '@/shared/ui/components';
import { FrfPlot } from '@/shared/ui/plots';
import { Panel, TextLink } from '@/shared/ui/screens/kit/panel';
import { useDebounced } from '@/shared/ui/screens/systems/use-debounced';
import { curveColors, space } from '@/shared/ui/theme';
import { previewScenario } from './scenario-preview';
import type { ScenarioFormValues } from './scenario-form-values';
import { SignalsPlot } from './signals-plot';

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

export function ScenarioLive({ labId, saved }: { labId: string; saved: { id: string; version: number } | null }) {
  const { control } = useFormContext<ScenarioFormValues>();
  const definition = useWatch({ control, name: 'definition' });
  const settled = useDebounced(JSON.stringify(definition), 400);
  const preview = useMemo(() => previewScenario(JSON.parse(settled), 1, now), [settled]);
  if (!preview.ok) {
    return (
      <Panel title="Preview" testID="scenario-live">
        <AppText variant="body" testID="preview-problem">{`The preview waits for a valid scenario. ${preview.message}`}</AppText>
      </Panel>
    );
  }
  const zoomBands = preview.excitationBand ? [{ label: 'Excitation band', low: Math.max(preview.excitationBand.lowHz, 1e-3), high: preview.excitationBand.highHz }] : [];
  return (
    <View style={styles.live} testID="scenario-live">
      <SignalsPlot
        title="Signals, seed 1"
        subtitle={`The first ${preview.timeS.length} of ${preview.recordSamples} samples at ${preview.sampleRateHz} Hz. Simulated in this browser in ${Math.round(preview.millis)} ms.`}
        timeS={preview.timeS}
        input={preview.input}
        output={preview.output}
        outputUnit={preview.outputUnit}
        testID="scenario-signals"
      />
      <FrfPlot
        title="Exact FRF"
        subtitle={preview.referenceNote ?? 'The reference every estimate on this scenario is scored against.'}
        unit={preview.frfUnit}
        curves={[{ id: 'exact', label: 'Exact', color: curveColors.exact, dashed: true, frequenciesHz: preview.exact.frequenciesHz, frf: preview.exact.frf }]}
        zoomBands={zoomBands}
        testID="scenario-frf"
      />
      {preview.warnings.length ? (
        <Caution title="The engine notes" testID="scenario-warnings">
          <View style={styles.list}>
            {preview.warnings.map((w) => (
              <AppText key={w} variant="small">{`• ${w}`}</AppText>
            ))}
          </View>
        </Caution>
      ) : null}
      <ExportLinks labId={labId} saved={saved} />
    </View>
  );
}

function ExportLinks({ labId, saved }: { labId: string; saved: { id: string; version: number } | null }) {
  const [seedText, setSeedText] = useState('1');
  const seed = Number(seedText);
  const seedOk = Number.isInteger(seed) && seed >= 0 && seed <= 2 ** 31 - 1;
  return (
    <Panel title="Export" testID="scenario-export">
      {saved ? (
        <>
          <AppText variant="small" tone="muted">{`The whole record of version ${saved.version}, as CSV, for running through your own acquisition software.`}</AppText>
          <TextField label="Seed" value={seedText} onChangeText={setSeedText} inputMode="numeric" error={seedOk ? undefined : 'A whole number from 0 to 2147483647'} />
          {seedOk ? (
            <TextLink href={signalsCsvPath(labId, saved.id, { seed, version: saved.version })} external testID="signals-csv">
              {`Signals for seed ${seed} (CSV)`}
            </TextLink>
          ) : null}
          <TextLink href={exactCsvPath(labId, saved.id, saved.version)} external testID="exact-csv">
            Exact FRF (CSV)
          </TextLink>
        </>
      ) : (
        <AppText variant="small" tone="muted">Save the scenario to export its signals and exact FRF.</AppText>
      )}
    </Panel>
  );
}

const styles = StyleSheet.create({ live: { gap: space.lg }, list: { gap: space.xs } });
