/**
 * /accept-invitation?token=…: what the invitation offers, then a display name and a new password
 * (new account) or the current password (existing account). Accepting signs the invitee in.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams } from 'expo-router';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';
import { acceptInvitationRequestSchema, type InvitationPreview } from '@/shared/api/people';
import { errorText } from '@/shared/ui/api/client';
import { useAcceptInvitation, useInvitationPreview } from '@/shared/ui/api/invitations';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { roleWords } from '@/shared/ui/lab-context';
import { space } from '@/shared/ui/theme';
import { FactRow, formatDateTime } from '../kit/figure';
import { ErrorBox, LoadingRow } from '../kit/query-view';
import { AccountFrame } from './account-frame';
import { checkNewPassword, passwordHint } from './password-fields';

type Fields = { displayName: string; password: string; repeat: string };

/**
 * One form for both cases, so the page never tells whether the address already has an account:
 * a name (and a new password, twice) for a new account; no name and the current password for an
 * existing one. The server decides which applies.
 */
export const acceptSchema = (email: string) =>
  acceptInvitationRequestSchema
    .extend({ displayName: z.string().trim().max(100), repeat: z.string() })
    .superRefine((v, ctx) => {
      if (v.displayName.length > 0) checkNewPassword(v, email, ctx);
    });

function AcceptForm({ token, preview }: { token: string; preview: InvitationPreview }) {
  const accept = useAcceptInvitation(token);
  const { control, handleSubmit, watch, formState: { errors } } = useForm<Fields>({
    resolver: zodResolver(acceptSchema(preview.email) as z.ZodType<Fields, Fields>),
    defaultValues: { displayName: '', password: '', repeat: '' },
  });
  const isNew = watch('displayName').trim().length > 0;
  const submit = handleSubmit((v) => accept.mutate(v.displayName.trim() ? { displayName: v.displayName.trim(), password: v.password } : { password: v.password }));
  return (
    <View style={styles.form} testID="accept-form">
      <AppText variant="body">
        New to Plumbline: enter your name and choose a password. Already have a Plumbline account with this address: leave the name empty and enter its password.
      </AppText>
      <Controller control={control} name="displayName" render={({ field }) => (
        <TextField label="Your name" hint="Only for a new account: as colleagues and the audit trail will show it." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.displayName?.message} autoComplete="name" testID="accept-name" />
      )} />
      <Controller control={control} name="password" render={({ field }) => (
        <TextField label={isNew ? 'New password' : 'Your password'} hint={isNew ? passwordHint : undefined} value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.password?.message} secureTextEntry autoComplete={isNew ? 'new-password' : 'current-password'} testID="accept-password" />
      )} />
      {isNew ? (
        <Controller control={control} name="repeat" render={({ field }) => (
          <TextField label="New password again" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.repeat?.message} secureTextEntry autoComplete="new-password" testID="accept-repeat" />
        )} />
      ) : null}
      {accept.isError ? <AppText variant="body" tone="fail" role="alert" testID="accept-error">{errorText(accept.error)}</AppText> : null}
      <Button label="Join the lab" busy={accept.isPending} busyLabel="Joining…" onPress={() => void submit()} testID="accept-submit" />
    </View>
  );
}

export function AcceptInvitationScreen() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  const value = typeof token === 'string' ? token : '';
  const preview = useInvitationPreview(value);
  let body;
  if (!value) body = <AppText variant="body" role="alert">This link has no invitation in it. Open the link from your invitation mail again.</AppText>;
  else if (preview.isError) body = <ErrorBox error={preview.error} title="This invitation cannot be used" />;
  else if (!preview.data) body = <LoadingRow label="Reading the invitation…" />;
  else
    body = (
      <>
        <View testID="invitation-preview">
          <FactRow label="Lab" text={preview.data.labName} />
          <FactRow label="Role" text={roleWords[preview.data.role]} />
          <FactRow label="E-mail" text={preview.data.email} />
          <FactRow label="Valid until" text={formatDateTime(preview.data.expiresAt)} />
        </View>
        <AcceptForm token={value} preview={preview.data} />
      </>
    );
  return <AccountFrame title="Join a lab" intro="You were invited to work in a lab on Plumbline.">{body}</AccountFrame>;
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
