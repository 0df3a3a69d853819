/**
 * The quick what-if bench: one scenario (built in, or one of the lab's with stationary
 * excitation), the bench's settings, and plots that update in the browser within about a second —
 * "what if the noise sits on the force channel?", "what if the cables add a delay?".
 */
import { useEffect, useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { parseScenario } from '@/shared/engine/scenario';
import { buildSystem } from '@/shared/engine/systems';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { AppText, Caution } from '@/shared/ui/components';
import { useLabId } from '@/shared/ui/lab-context';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { ChoiceChips, SelectField } from '@/shared/ui/screens/kit/choice-field';
import { PageHead, Panel, TextLink } from '@/shared/ui/screens/kit/panel';
import { Column } from '@/shared/ui/screens/kit/two-pane';
import { space } from '@/shared/ui/theme';
import { BUILTIN_SCENARIOS, startingSettings } from './builtin-scenarios';
import { WhatIfControls } from './what-if-controls';
import { WhatIfPlots } from './what-if-plots';
import { runWhatIf, type WhatIfResult, type WhatIfSettings } from './what-if-run';

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

export function WhatIfScreen() {
  const labId = useLabId();
  const wide = useWideLayout();
  const [source, setSource] = useState<string>(BUILTIN_SCENARIOS[0].id);
  const builtin = BUILTIN_SCENARIOS.find((b) => b.id === source);
  const labScenario = scenariosApi.useLatest(labId, builtin ? '' : source);
  const list = scenariosApi.useList(labId, { limit: 100 });
  const definition = builtin ? builtin.definition : labScenario.data?.definition;
  const base = useMemo(() => (definition ? safe(() => parseScenario(definition)) : null), [definition]);
  const starting = useMemo(() => (base?.ok ? (safe(() => startingSettings(definition)).value ?? null) : null), [base, definition]);
  // The user's changes belong to the scenario they were made on: another scenario starts afresh.
  const [edited, setEdited] = useState<{ from: WhatIfSettings; settings: WhatIfSettings } | null>(null);
  const settings = edited && edited.from === starting ? edited.settings : starting;
  const setSettings = (next: WhatIfSettings) => {
    if (starting) setEdited({ from: starting, settings: next });
  };
  const { result, error, busy } = useWhatIf(definition, settings);
  const zoomBands = useMemo(() => (base?.ok ? modeBands(base.value) : []), [base]);
  const labOptions = (list.data?.items ?? []).map((s) => ({ value: s.id, label: s.name }));

  return (
    <Column title="What-if bench">
      <PageHead
        eyebrow="Bench"
        title="What-if bench"
        intro="Move the noise, add a delay, change the block, window or estimator: the engine simulates and processes one seed here in the browser and redraws the plots."
      />
      <TextLink href="/">← Back to the Bench</TextLink>
      <Panel title="Scenario">
        <ChoiceChips label="Built in" options={BUILTIN_SCENARIOS.map((b) => ({ value: b.id, label: b.label }))} value={builtin ? source : undefined} onChange={setSource} />
        {labOptions.length ? <SelectField label="Or one of the lab's scenarios" options={labOptions} value={builtin ? undefined : source} onChange={setSource} /> : null}
        {base?.ok ? <AppText variant="small" tone="muted">{base.value.description ?? base.value.name}</AppText> : null}
        {base && !base.ok ? <AppText variant="small" tone="fail" role="alert">{base.message}</AppText> : null}
        {!builtin && labScenario.isPending ? <AppText variant="small" tone="muted">Loading the scenario…</AppText> : null}
      </Panel>
      {settings && base?.ok ? (
        <View style={[styles.bench, wide && styles.benchWide]}>
          <View style={[styles.gap, wide && styles.controlsWide]}>
            <WhatIfControls settings={settings} sampleRateHz={base.value.acquisition.sampleRateHz} baseDurationS={base.value.acquisition.durationS} onChange={setSettings} />
          </View>
          <View style={[styles.gap, wide && styles.resultsWide]}>
            <AppText variant="small" tone="muted" role="status" testID="what-if-status">
              {busy ? 'Updating…' : result ? 'Up to date' : ''}
            </AppText>
            {error ? <Caution title="The engine refused these settings">{error}</Caution> : null}
            {result ? <WhatIfPlots result={result} settings={settings} zoomBands={zoomBands} /> : null}
            {result?.warnings.length ? (
              <Caution title="The engine notes">
                <View style={styles.notes}>
                  {result.warnings.map((w) => (
                    <AppText key={w} variant="small">{`• ${w}`}</AppText>
                  ))}
                </View>
              </Caution>
            ) : null}
          </View>
        </View>
      ) : null}
    </Column>
  );
}

function safe<T>(fn: () => T): { ok: true; value: T } | { ok: false; message: string; value?: undefined } {
  try {
    return { ok: true, value: fn() };
  } catch (err) {
    return { ok: false, message: err instanceof Error ? err.message : 'not a valid scenario' };
  }
}

function modeBands(s: ReturnType<typeof parseScenario>) {
  return buildSystem(s.system).modes.map((m, i) => ({
    label: `Mode ${i + 1}`,
    low: m.naturalFrequencyHz - 6 * m.halfPowerBandwidthHz,
    high: m.naturalFrequencyHz + 6 * m.halfPowerBandwidthHz,
  }));
}

/**
 * Runs the bench after the settings change, off the event that changed them, and keeps the last
 * result on screen. `settings` keeps its identity until the user changes something.
 */
function useWhatIf(definition: unknown, settings: WhatIfSettings | null) {
  const [state, setState] = useState<{ result: WhatIfResult | null; error: string | null; busy: boolean }>({ result: null, error: null, busy: false });
  useEffect(() => {
    if (!settings || !definition) return;
    setState((s) => ({ ...s, busy: true }));
    const timer = setTimeout(() => {
      try {
        const result = runWhatIf(definition, settings, now);
        setState({ result, error: null, busy: false });
      } catch (err) {
        setState((s) => ({ ...s, error: err instanceof Error ? err.message : 'The bench could not run.', busy: false }));
      }
    }, 30);
    return () => clearTimeout(timer);
  }, [definition, settings]);
  return state;
}

const styles = StyleSheet.create({
  bench: { gap: space.lg },
  // On a wide screen the settings sit beside the plots, so a change and its effect are in view together.
  benchWide: { flexDirection: 'row', alignItems: 'flex-start' },
  controlsWide: { width: 340, flexShrink: 0 },
  resultsWide: { flex: 1, minWidth: 0 },
  gap: { gap: space.lg },
  notes: { gap: space.xs },
});
