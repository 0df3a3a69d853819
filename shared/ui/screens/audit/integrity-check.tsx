/** The audit trail's integrity: the server checks the keyed chain, the checkpoints and the signatures; the answer is said plainly. */
import { StyleSheet, View } from 'react-native';
import type { AuditBreakReason, AuditVerify } from '@/shared/api/people';
import { useAuditVerify } from '@/shared/ui/api/audit';
import { AppText, Button, StatusBadge } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { ErrorBox, LoadingRow } from '../kit/query-view';

const headline: Record<AuditBreakReason, string> = {
  hash_mismatch: 'an entry was changed',
  link_mismatch: 'an entry was removed or put in between',
  seal_mismatch: 'the seal over the entries from before the audit key does not hold',
  checkpoint_file: 'the checkpoint file was changed',
  no_checkpoint: 'no checkpoint vouches for the entries',
  checkpoint_mismatch: 'the entries differ from what the checkpoints recorded',
  missing_events: 'entries are missing at the end',
  signature_mismatch: 'a signature does not hold',
};

const shortHash = (h: string) => `${h.slice(0, 16)}…`;

/** The check's outcome in plain words: intact with its count and checkpoint, or where and what broke. */
export function integritySentence(v: AuditVerify): string {
  if (v.ok) {
    const checkpoint = v.checkpoint
      ? ` The newest checkpoint outside the database (${formatDateTime(v.checkpoint.at)}) records ${v.checkpoint.events} entries, head ${shortHash(v.checkpoint.head)}.`
      : '';
    const signatures = v.signatures ? ` ${v.signatures} signature${v.signatures === 1 ? '' : 's'} re-computed and matched with the trail.` : '';
    return `The trail is intact: all ${v.checked} entries were checked against their keyed hashes.${checkpoint}${signatures}`;
  }
  if (!v.firstBroken) return `The trail is broken: ${v.checked} entries were checked.`;
  const where = v.firstBroken.id === null ? '' : ` at entry ${v.firstBroken.id}`;
  return `The trail is broken${where}: ${headline[v.firstBroken.reason]}. ${v.firstBroken.detail}`;
}

export function IntegrityCheck({ labId }: { labId: string }) {
  const verify = useAuditVerify(labId);
  let body;
  if (verify.isError) body = <ErrorBox error={verify.error} title="The integrity check could not be run" onRetry={() => void verify.refetch()} />;
  else if (!verify.data) body = <LoadingRow label="Checking the trail…" />;
  else {
    const v = verify.data;
    body = (
      <View style={[styles.box, v.ok ? styles.ok : styles.broken]} role="status" testID="integrity-result">
        <StatusBadge tone={v.ok ? 'pass' : 'fail'} label={v.ok ? 'Intact' : 'Broken'} />
        <AppText variant="body">{integritySentence(v)}</AppText>
      </View>
    );
  }
  return (
    <View style={styles.wrap}>
      <View style={styles.row}>
        <AppText variant="heading" role="heading" aria-level={2} style={styles.flex}>Integrity check</AppText>
        <Button label="Check again" variant="secondary" compact busy={verify.isFetching} busyLabel="Checking…" onPress={() => void verify.refetch()} />
      </View>
      {body}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  flex: { flex: 1 },
  box: { gap: space.sm, padding: space.lg, borderRadius: radius.sm, borderLeftWidth: stroke.plumb },
  ok: { backgroundColor: colors.passTint, borderLeftColor: colors.pass },
  broken: { backgroundColor: colors.failTint, borderLeftColor: colors.fail },
});
