/** A page of audit entries: when, who, what, on which item, and the hash prefix. */
import { StyleSheet, View } from 'react-native';
import type { AuditEvent } from '@/shared/api/people';
import { AppText } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';

function changeText(e: AuditEvent): string | null {
  const show = (v: unknown) => (v === null || v === undefined ? null : JSON.stringify(v));
  const before = show(e.before);
  const after = show(e.after);
  if (!before && !after) return null;
  const clip = (s: string) => (s.length > 160 ? `${s.slice(0, 157)}…` : s);
  return [before ? `before ${clip(before)}` : null, after ? `after ${clip(after)}` : null].filter(Boolean).join(' · ');
}

export function AuditList({ items }: { items: AuditEvent[] }) {
  return (
    <View role="list" style={styles.list} testID="audit-list">
      {items.map((e) => (
        <View role="listitem" key={e.id} style={styles.item}>
          <View style={styles.row}>
            <AppText variant="number" tone="muted">{`#${e.id}`}</AppText>
            <AppText variant="bodyStrong" style={styles.flex}>{e.action}</AppText>
            <AppText variant="number" tone="muted">{formatDateTime(e.at)}</AppText>
          </View>
          <AppText variant="small">{`${e.actor ? e.actor.displayName ?? e.actor.email ?? e.actor.userId : 'System'} · ${e.targetType}${e.targetId ? ` ${e.targetId.slice(0, 8)}` : ''}`}</AppText>
          {changeText(e) ? <AppText variant="label" tone="muted">{changeText(e)}</AppText> : null}
          <AppText variant="label" tone="muted">{`hash ${e.hash.slice(0, 16)}… · previous ${e.prevHash ? `${e.prevHash.slice(0, 16)}…` : 'none (first entry)'}`}</AppText>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.none },
  item: { gap: space.hair, paddingVertical: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
  row: { flexDirection: 'row', alignItems: 'baseline', gap: space.sm, flexWrap: 'wrap' },
  flex: { flex: 1, minWidth: 160 },
});
