/** Invite by e-mail with a role (checked with the server's schema); revoke a pending one, asking first. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';
import { createInvitationRequestSchema, type CreateInvitationRequest, type Invitation } from '@/shared/api/people';
import { errorText } from '@/shared/ui/api/client';
import { useInvitations, useInvite, useRevokeInvitation } from '@/shared/ui/api/invitations';
import { AppText, Button, StatusBadge, TextField, type StatusTone } from '@/shared/ui/components';
import { roleWords } from '@/shared/ui/lab-context';
import { colors, space, stroke } from '@/shared/ui/theme';
import { ChoiceChips } from '../kit/choice-field';
import { ConfirmDialog } from '../kit/confirm-dialog';
import { formatDateTime } from '../kit/figure';
import { Panel } from '../kit/panel';
import { QueryView } from '../kit/query-view';
import { roleOptions } from './members-panel';

const statusTone: Record<Invitation['status'], StatusTone> = { pending: 'neutral', accepted: 'pass', revoked: 'warning', expired: 'warning' };
const statusWord: Record<Invitation['status'], string> = { pending: 'Pending', accepted: 'Accepted', revoked: 'Revoked', expired: 'Expired' };

type Fields = z.input<typeof createInvitationRequestSchema>;

export function InviteForm({ labId }: { labId: string }) {
  const invite = useInvite(labId);
  const { control, handleSubmit, reset, formState: { errors } } = useForm<Fields, unknown, CreateInvitationRequest>({
    resolver: zodResolver(createInvitationRequestSchema),
    defaultValues: { email: '', role: 'analyst' },
  });
  const submit = handleSubmit((values) => invite.mutate(values, { onSuccess: () => reset({ email: '', role: values.role }) }));
  return (
    <View style={styles.form} testID="invite-form">
      <Controller control={control} name="email" render={({ field }) => (
        <TextField label="E-mail to invite" value={field.value} onChangeText={(t) => { field.onChange(t); invite.reset(); }} onBlur={field.onBlur} error={errors.email?.message} autoCapitalize="none" inputMode="email" testID="invite-email" />
      )} />
      <Controller control={control} name="role" render={({ field }) => (
        <ChoiceChips label="Role" options={roleOptions} value={field.value} onChange={field.onChange} error={errors.role?.message} />
      )} />
      {invite.isError ? <AppText variant="small" tone="fail" role="alert">{errorText(invite.error)}</AppText> : null}
      {invite.isSuccess ? <AppText variant="small" role="status">{`Invitation sent to ${invite.data.email}; the link is valid for 72 hours.`}</AppText> : null}
      <View style={styles.row}><Button label="Send the invitation" variant="secondary" busy={invite.isPending} busyLabel="Sending…" onPress={() => void submit()} testID="invite-submit" /></View>
    </View>
  );
}

export function InvitationsPanel({ labId }: { labId: string }) {
  const invitations = useInvitations(labId);
  const revoke = useRevokeInvitation(labId);
  const [asking, setAsking] = useState<Invitation | null>(null);
  return (
    <Panel title="Invitations" testID="invitations-panel">
      <InviteForm labId={labId} />
      <QueryView query={invitations} isEmpty={(d) => d.items.length === 0} empty={{ title: 'No invitations yet', body: 'Invitations you send are listed here with their status.' }}>
        {(d) => (
          <View>
            {d.items.map((i) => (
              <View key={i.id} style={styles.item}>
                <View style={styles.text}>
                  <AppText variant="bodyStrong">{`${i.email} · ${roleWords[i.role]}`}</AppText>
                  <AppText variant="small" tone="muted">{`Sent ${formatDateTime(i.createdAt)}${i.invitedBy ? ` by ${i.invitedBy.displayName}` : ''} · expires ${formatDateTime(i.expiresAt)}`}</AppText>
                  <StatusBadge tone={statusTone[i.status]} label={statusWord[i.status]} />
                </View>
                {i.status === 'pending' ? <Button label={`Revoke ${i.email}`} variant="secondary" compact onPress={() => setAsking(i)} /> : null}
              </View>
            ))}
          </View>
        )}
      </QueryView>
      <ConfirmDialog
        visible={asking !== null}
        title="Revoke this invitation?"
        body={asking ? `The link sent to ${asking.email} stops working. You can invite the address again later.` : ''}
        confirmLabel="Revoke it"
        busy={revoke.isPending}
        busyLabel="Revoking…"
        error={revoke.error}
        onCancel={() => { setAsking(null); revoke.reset(); }}
        onConfirm={() => asking && revoke.mutate(asking.id, { onSuccess: () => setAsking(null) })}
      />
    </Panel>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  row: { flexDirection: 'row' },
  item: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md, paddingVertical: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
  text: { flex: 1, minWidth: 200, gap: space.xs },
});
