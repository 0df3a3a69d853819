/**
 * /reset-password: ask for a reset link by e-mail; /reset-password?token=…: set a new password
 * (the server's rule), which ends every session of the account.
 */
import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams } from 'expo-router';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';
import { passwordResetRequestSchema } from '@/shared/api/people';
import { errorText } from '@/shared/ui/api/client';
import { useConfirmPasswordReset, useRequestPasswordReset } from '@/shared/ui/api/invitations';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';
import { TextLink } from '../kit/panel';
import { AccountFrame } from './account-frame';
import { newPasswordSchema, passwordHint } from './password-fields';

function RequestForm() {
  const request = useRequestPasswordReset();
  const { control, handleSubmit, formState: { errors } } = useForm<z.input<typeof passwordResetRequestSchema>, unknown, z.output<typeof passwordResetRequestSchema>>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });
  if (request.isSuccess) return <AppText variant="body" role="status" testID="reset-requested">{request.data.message}</AppText>;
  return (
    <View style={styles.form} testID="reset-request-form">
      <Controller control={control} name="email" render={({ field }) => (
        <TextField label="E-mail" hint="We send a single-use link to this address if it has an account." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.email?.message} autoCapitalize="none" inputMode="email" autoComplete="email" testID="reset-email" />
      )} />
      {request.isError ? <AppText variant="body" tone="fail" role="alert">{errorText(request.error)}</AppText> : null}
      <Button label="Send the reset link" busy={request.isPending} busyLabel="Sending…" onPress={() => void handleSubmit((v) => request.mutate(v.email))()} testID="reset-request-submit" />
    </View>
  );
}

type NewFields = { password: string; repeat: string };

function NewPasswordForm({ token }: { token: string }) {
  const confirm = useConfirmPasswordReset();
  const { control, handleSubmit, formState: { errors } } = useForm<NewFields>({
    resolver: zodResolver(newPasswordSchema('')),
    defaultValues: { password: '', repeat: '' },
  });
  if (confirm.isSuccess) {
    return (
      <View style={styles.form} role="status" testID="reset-done">
        <AppText variant="body">Your new password is set. Every earlier session of your account has ended.</AppText>
        <TextLink href="/sign-in">Sign in with the new password</TextLink>
      </View>
    );
  }
  return (
    <View style={styles.form} testID="reset-confirm-form">
      <Controller control={control} name="password" render={({ field }) => (
        <TextField label="New password" hint={passwordHint} value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.password?.message} secureTextEntry autoComplete="new-password" testID="reset-password" />
      )} />
      <Controller control={control} name="repeat" render={({ field }) => (
        <TextField label="New password again" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={errors.repeat?.message} secureTextEntry autoComplete="new-password" testID="reset-repeat" />
      )} />
      {confirm.isError ? <AppText variant="body" tone="fail" role="alert" testID="reset-error">{errorText(confirm.error)}</AppText> : null}
      <Button label="Set the new password" busy={confirm.isPending} busyLabel="Saving…" onPress={() => void handleSubmit((v) => confirm.mutate({ token, password: v.password }))()} testID="reset-confirm-submit" />
    </View>
  );
}

export function ResetPasswordScreen() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  const value = typeof token === 'string' ? token : '';
  return value ? (
    <AccountFrame title="Set a new password" intro="Choose a new password for your Plumbline account.">
      <NewPasswordForm token={value} />
    </AccountFrame>
  ) : (
    <AccountFrame title="Reset your password" intro="Forgot it? We mail you a link to set a new one.">
      <RequestForm />
    </AccountFrame>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
