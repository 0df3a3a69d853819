/** The audit trail's integrity: the server recomputes the hash chain; the answer is said plainly. */
import { StyleSheet, View } from 'react-native';
import type { AuditVerify } from '@/shared/api/people';
import { useAuditVerify } from '@/shared/ui/api/audit';
import { AppText, Button, StatusBadge } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { ErrorBox, LoadingRow } from '../kit/query-view';

const reasons = {
  hash_mismatch: 'its contents no longer match its stored hash (the entry was changed after it was written)',
  link_mismatch: 'it does not point to the entry before it (an entry was removed or put in between)',
} as const;

export function integritySentence(v: AuditVerify): string {
  if (v.ok) return `The chain is intact: all ${v.checked} entries were checked and each hash matches its contents and the entry before it.`;
  if (!v.firstBroken) return `The chain is broken: ${v.checked} entries were checked.`;
  return `The chain is broken at entry ${v.firstBroken.id}: ${reasons[v.firstBroken.reason]}. ${v.checked} entries were checked.`;
}

export function IntegrityCheck({ labId }: { labId: string }) {
  const verify = useAuditVerify(labId);
  let body;
  if (verify.isError) body = <ErrorBox error={verify.error} title="The integrity check could not be run" onRetry={() => void verify.refetch()} />;
  else if (!verify.data) body = <LoadingRow label="Checking the hash chain…" />;
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
