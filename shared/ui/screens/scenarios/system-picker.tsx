/**
 * The scenario's system: a copy of one of the lab's systems (a scenario keeps its own copy, so a
 * later edit of the system does not change evidence already gathered), with a one-line summary of
 * the copy it holds now.
 */
import { useQueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { buildSystem } from '@/shared/engine/systems';
import type { SystemSpec } from '@/shared/engine/systems/schema';
import { errorText } from '@/shared/ui/api/client';
import { systemsApi } from '@/shared/ui/api/systems';
import { AppText, Button } from '@/shared/ui/components';
import { SelectField } from '@/shared/ui/screens/kit/choice-field';
import { space } from '@/shared/ui/theme';
import type { ScenarioFormValues } from './scenario-form-values';

const kindWords = { sdof: 'Single mass', modal: 'Modal', physical: 'Masses, springs, dampers' } as const;

/** "Modal · receptance m/N · modes at 36.0, 46.0, 53.0 Hz", or the engine's complaint. */
export function systemSummary(spec: SystemSpec | undefined): string {
  if (!spec) return 'No system yet';
  try {
    const s = buildSystem(spec);
    const modes = s.modes.map((m) => m.naturalFrequencyHz.toPrecision(4)).join(', ');
    return `${kindWords[spec.kind]} · ${spec.quantity} ${s.unit} · ${s.modes.length === 1 ? 'mode' : 'modes'} at ${modes} Hz`;
  } catch (err) {
    return `${kindWords[spec.kind] ?? 'System'}: ${err instanceof Error ? err.message : 'not valid'}`;
  }
}

export function SystemPicker({ labId, canWrite }: { labId: string; canWrite: boolean }) {
  const { control, setValue } = useFormContext<ScenarioFormValues>();
  const system = (useWatch({ control, name: 'definition' }) as { system: SystemSpec }).system;
  const list = systemsApi.useList(labId, { limit: 100 });
  const client = useQueryClient();
  const [chosen, setChosen] = useState<string | undefined>();
  const [copied, setCopied] = useState<string | null>(null);
  const [problem, setProblem] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const summary = useMemo(() => systemSummary(system), [system]);
  const options = (list.data?.items ?? []).map((s) => ({ value: s.id, label: `${s.name} (v${s.latestVersion})` }));
  const copy = async () => {
    if (!chosen) return;
    setBusy(true);
    setProblem(null);
    try {
      const record = await client.fetchQuery({ queryKey: systemsApi.keys.latest(labId, chosen), queryFn: ({ signal }) => systemsApi.fetchLatest(labId, chosen, signal) });
      setValue('definition.system', record.definition, { shouldDirty: true, shouldValidate: false });
      setCopied(`Copied from ${record.name}, version ${record.version.version}`);
    } catch (err) {
      setProblem(err);
    } finally {
      setBusy(false);
    }
  };
  return (
    <View style={styles.fields}>
      <AppText variant="body" testID="scenario-system-summary">{summary}</AppText>
      {copied ? (
        <AppText variant="small" tone="pass" role="status">{`✓ ${copied}`}</AppText>
      ) : null}
      {canWrite ? (
        <View style={styles.row}>
          <View style={styles.grow}>
            <SelectField label="Take the system from" options={options} value={chosen} onChange={setChosen} placeholder={list.isPending ? 'Loading systems…' : 'Choose a system'} testID="system-select" />
          </View>
          <Button label="Use this system" variant="secondary" compact disabled={!chosen} busy={busy} busyLabel="Copying…" onPress={() => void copy()} />
        </View>
      ) : null}
      {list.isError ? <AppText variant="small" tone="fail">{`The lab's systems could not be listed: ${errorText(list.error)}`}</AppText> : null}
      {problem ? <AppText variant="small" tone="fail" role="alert">{errorText(problem)}</AppText> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  grow: { flex: 1, minWidth: 200 },
});
