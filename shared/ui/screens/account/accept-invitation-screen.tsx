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

/** New accounts: the server's accept schema with a required name, plus the password rule. */
export const newAccountSchema = (email: string) =>
  acceptInvitationRequestSchema
    .extend({ displayName: z.string().trim().min(1, 'Enter your name').max(100), repeat: z.string() })
    .superRefine((v, ctx) => checkNewPassword(v, email, ctx));
/** Existing accounts: only the current password. */
export const existingAccountSchema = acceptInvitationRequestSchema.pick({ password: true }).extend({ displayName: z.string(), repeat: z.string() });

function AcceptForm({ token, preview }: { token: string; preview: InvitationPreview }) {
  const accept = useAcceptInvitation(token);
  const schema = preview.accountExists ? existingAccountSchema : newAccountSchema(preview.email);
  const { control, handleSubmit, formState: { errors } } = useForm<Fields>({
    resolver: zodResolver(schema as z.ZodType<Fields, Fields>),
    defaultValues: { displayName: '', password: '', repeat: '' },
  });
  const submit = handleSubmit((v) => accept.mutate(preview.accountExists ? { password: v.password } : { displayName: v.displayName, password: v.password }));
  return (
    <View style={styles.form} testID="accept-form">
      {preview.accountExists ? (
        <AppText variant="body">You already have a Plumbline account with this address. Enter its password to join the lab.</AppText>
      ) : (
        <Controller control={control} name="displayName" render={({ field }) => (
          <TextField label="Your name" hint="As colleagues and the audit trail will show it." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.displayName?.message} autoComplete="name" testID="accept-name" />
        )} />
      )}
      <Controller control={control} name="password" render={({ field }) => (
        <TextField label={preview.accountExists ? 'Your password' : 'New password'} hint={preview.accountExists ? undefined : passwordHint} value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.password?.message} secureTextEntry autoComplete={preview.accountExists ? 'current-password' : 'new-password'} testID="accept-password" />
      )} />
      {preview.accountExists ? null : (
        <Controller control={control} name="repeat" render={({ field }) => (
          <TextField label="New password again" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.repeat?.message} secureTextEntry autoComplete="new-password" testID="accept-repeat" />
        )} />
      )}
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
