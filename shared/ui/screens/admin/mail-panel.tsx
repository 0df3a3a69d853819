/** Sent mail, readable while Plumbline delivers to its local fake mail server. */
import { StyleSheet, View } from 'react-native';
import { isApiStatus } from '@/shared/ui/api/client';
import { useSentMail } from '@/shared/ui/api/members';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { formatDateTime } from '../kit/figure';
import { Panel } from '../kit/panel';
import { QueryView } from '../kit/query-view';

export function MailPanel({ labId }: { labId: string }) {
  const mail = useSentMail(labId);
  if (isApiStatus(mail.error, 409)) {
    return (
      <Panel title="Sent mail">
        <AppText variant="body">Mail goes to a real mail server; read it in the recipients&apos; mailboxes.</AppText>
      </Panel>
    );
  }
  return (
    <Panel title="Sent mail" testID="mail-panel">
      <AppText variant="small" tone="muted">Shown while mail goes to Plumbline&apos;s local fake mail server. Invitation and password reset links are withheld here: only the recipient receives them.</AppText>
      <QueryView query={mail} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No mail sent yet', body: 'Invitations, reset links and review notices will be listed here.' }}>
        {(d) => (
          <View>
            {d.items.map((m) => (
              <View key={m.id} style={styles.item}>
                <View style={styles.row}>
                  <AppText variant="bodyStrong" style={styles.flex}>{m.subject}</AppText>
                  <StatusBadge tone={m.status === 'sent' ? 'pass' : m.status === 'failed' ? 'fail' : 'neutral'} label={m.status === 'sent' ? 'Sent' : m.status === 'failed' ? 'Failed' : 'Queued'} />
                </View>
                <AppText variant="small" tone="muted">{`To ${m.to} · ${formatDateTime(m.sentAt ?? m.createdAt)}`}</AppText>
                <AppText variant="small" selectable numberOfLines={6}>{m.text}</AppText>
                {m.error ? <AppText variant="small" tone="fail">{m.error}</AppText> : null}
              </View>
            ))}
          </View>
        )}
      </QueryView>
    </Panel>
  );
}

const styles = StyleSheet.create({
  item: { gap: space.xs, paddingVertical: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  flex: { flex: 1 },
});
