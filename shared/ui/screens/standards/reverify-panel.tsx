/**
 * Re-runs a standard's evidence on the engine the server runs today and says, in words, whether
 * every stored number came back the same. It asks first: the server re-runs every seed.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Reverification } from '@/shared/api/approval';
import { errorText } from '@/shared/ui/api/client';
import { useReverifyStandard } from '@/shared/ui/api/standards';
import { AppText, Button } from '@/shared/ui/components';
import { useLabRole } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { formatDateTime, formatNumber } from '../kit/figure';
import { Panel } from '../kit/panel';

/** Roles allowed 'reverify.run' in the server's permission table. */
const mayReverify = new Set(['admin', 'analyst']);

function valueText(value: number | string | boolean | null): string {
  if (value === null) return 'no value';
  return typeof value === 'number' ? formatNumber(value, 6) : String(value);
}

/** The outcome as one sentence, then where the largest change sits. */
export function reverifyWords(r: Reverification): { headline: string; detail: string | null } {
  const engines = r.storedEngineVersions.join(', ') || 'unknown';
  const runs = `${r.runs} run${r.runs === 1 ? '' : 's'} on engine ${r.engineVersion} (evidence made on ${engines})`;
  if (r.verdict === 'identical') return { headline: `Identical: every stored number came back bit for bit over ${runs}.`, detail: null };
  const c = r.largestChange;
  const where = c
    ? `Largest change: ${c.quantity} in ${c.scenario}${c.frequencyHz === null ? '' : ` at ${formatNumber(c.frequencyHz, 4)} Hz`}, stored ${valueText(c.stored)}, now ${valueText(c.recomputed)}${c.difference === null ? ' (not comparable)' : ` (difference ${formatNumber(c.difference)})`}.`
    : null;
  if (r.verdict === 'within-tolerance') {
    return { headline: `Within ${formatNumber(r.tolerance)}: no number moved by more than ${formatNumber(r.tolerance)} relative, over ${runs}.`, detail: where };
  }
  const changed = r.lines.filter((line) => line.verdict === 'changed').length;
  return { headline: `Changed: ${changed} of ${r.lines.length} compared lines differ by more than ${formatNumber(r.tolerance)}, over ${runs}.`, detail: where };
}

export function ReverifyPanel({ labId, standardId }: { labId: string; standardId: string }) {
  const role = useLabRole();
  const [asking, setAsking] = useState(false);
  const reverify = useReverifyStandard(labId, standardId);
  if (!role || !mayReverify.has(role)) return null;
  const words = reverify.data ? reverifyWords(reverify.data) : null;
  return (
    <Panel title="Re-verification" testID="reverify-panel">
      <AppText variant="body" tone="muted">
        Runs the evidence again with the same seeds on the engine in service now and compares every stored number.
      </AppText>
      <View style={styles.actions}>
        <Button
          label="Re-run on today's engine…"
          variant="secondary"
          busy={reverify.isPending}
          busyLabel="Re-running the evidence…"
          onPress={() => setAsking(true)}
          testID="reverify-start"
        />
      </View>
      {reverify.isPending ? (
        <AppText variant="body" role="status" testID="reverify-progress">
          Re-running every study of the evidence; this can take a few minutes. Keep this page open.
        </AppText>
      ) : null}
      {reverify.isError ? (
        <AppText variant="body" tone="fail" role="alert" testID="reverify-error">{errorText(reverify.error)}</AppText>
      ) : null}
      {words && reverify.data ? (
        <View style={styles.outcome} role="status" testID="reverify-outcome">
          <AppText variant="bodyStrong" tone={reverify.data.verdict === 'changed' ? 'fail' : 'pass'}>{words.headline}</AppText>
          {words.detail ? <AppText variant="body">{words.detail}</AppText> : null}
          <AppText variant="small" tone="muted">{`Checked ${formatDateTime(reverify.data.at)}`}</AppText>
        </View>
      ) : null}
      <ConfirmDialog
        visible={asking}
        title="Re-run this standard's evidence?"
        body="Every study of the evidence is run again with its stored seeds. This can take a while; the standard itself does not change."
        confirmLabel="Re-run it"
        onCancel={() => setAsking(false)}
        onConfirm={() => {
          setAsking(false);
          reverify.mutate();
        }}
        testID="reverify-dialog"
      />
    </Panel>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row' },
  outcome: { gap: space.xs },
});
