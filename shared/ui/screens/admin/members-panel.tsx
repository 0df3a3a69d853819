/** Members and their roles; a role change asks first (the server keeps the last admin). */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Role } from '@/shared/api/auth';
import type { Member } from '@/shared/api/people';
import { useChangeRole, useMembers } from '@/shared/ui/api/members';
import { AppText } from '@/shared/ui/components';
import { roleWords } from '@/shared/ui/lab-context';
import { colors, space, stroke } from '@/shared/ui/theme';
import { SelectField } from '../kit/choice-field';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { formatDate } from '../kit/figure';
import { Panel } from '../kit/panel';
import { QueryView } from '../kit/query-view';

export const roleOptions = (Object.keys(roleWords) as Role[]).map((value) => ({ value, label: roleWords[value] }));

export function MembersPanel({ labId, myUserId }: { labId: string; myUserId: string }) {
  const members = useMembers(labId);
  const change = useChangeRole(labId);
  const [pending, setPending] = useState<{ member: Member; role: Role } | null>(null);
  return (
    <Panel title="Members and roles" testID="members-panel">
      <QueryView query={members} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No members', body: 'Invite people below.' }}>
        {(d) => (
          <View style={styles.list}>
            {d.items.map((m) => (
              <View key={m.userId} style={styles.row} testID={`member-${m.email}`}>
                <View style={styles.text}>
                  <AppText variant="bodyStrong">{`${m.displayName}${m.userId === myUserId ? ' (you)' : ''}`}</AppText>
                  <AppText variant="small" tone="muted">{`${m.email} · member since ${formatDate(m.joinedAt)}`}</AppText>
                </View>
                <View style={styles.select}>
                  <SelectField label={`Role of ${m.displayName}`} value={m.role} options={roleOptions} onChange={(role) => role !== m.role && setPending({ member: m, role })} />
                </View>
              </View>
            ))}
          </View>
        )}
      </QueryView>
      <ConfirmDialog
        visible={pending !== null}
        title="Change this member's role?"
        body={pending ? `${pending.member.displayName} goes from ${roleWords[pending.member.role]} to ${roleWords[pending.role]}. What they may do in the lab changes at once, and the change is recorded in the audit trail.` : ''}
        confirmLabel="Change the role"
        busy={change.isPending}
        busyLabel="Changing…"
        error={change.error}
        onCancel={() => { setPending(null); change.reset(); }}
        onConfirm={() => pending && change.mutate({ userId: pending.member.userId, role: pending.role }, { onSuccess: () => setPending(null) })}
      />
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.none },
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md, paddingVertical: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
  text: { flex: 1, minWidth: 200, gap: space.hair },
  select: { minWidth: 180 },
});
