import { zodResolver } from '@hookform/resolvers/zod';
import { useRef } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View, type TextInput } from 'react-native';
import type { z } from 'zod';
import { signInRequestSchema, type SignInRequest } from '@/shared/api/auth';
import { errorText } from '@/shared/ui/api/client';
import { useSignIn } from '@/shared/ui/api/use-session';
import { AppText, Button, TextField } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';

type SignInFields = z.input<typeof signInRequestSchema>;

/**
 * E-mail and password, checked with the shared schema before anything is sent. On success the
 * session query holds the new user and the (auth) layout moves on; this form never navigates.
 */
export function SignInForm() {
  const signIn = useSignIn();
  const passwordRef = useRef<TextInput>(null);
  const {
    control,
    handleSubmit,
    formState: { errors },
  } = useForm<SignInFields, unknown, SignInRequest>({
    resolver: zodResolver(signInRequestSchema),
    defaultValues: { email: '', password: '' },
  });
  const submit = handleSubmit((values) => signIn.mutate(values));

  return (
    <View style={styles.form} testID="sign-in-form">
      <Controller
        control={control}
        name="email"
        render={({ field }) => (
          <TextField
            ref={field.ref}
            label="E-mail"
            value={field.value}
            onChangeText={(text) => {
              field.onChange(text);
              if (signIn.isError) signIn.reset();
            }}
            onBlur={field.onBlur}
            error={errors.email?.message}
            autoCapitalize="none"
            autoCorrect={false}
            autoComplete="email"
            inputMode="email"
            keyboardType="email-address"
            returnKeyType="next"
            onSubmitEditing={() => passwordRef.current?.focus()}
            testID="sign-in-email"
          />
        )}
      />
      <Controller
        control={control}
        name="password"
        render={({ field }) => (
          <TextField
            ref={(node) => {
              passwordRef.current = node;
              field.ref(node);
            }}
            label="Password"
            value={field.value}
            onChangeText={(text) => {
              field.onChange(text);
              if (signIn.isError) signIn.reset();
            }}
            onBlur={field.onBlur}
            error={errors.password?.message}
            secureTextEntry
            autoComplete="current-password"
            returnKeyType="go"
            onSubmitEditing={() => void submit()}
            testID="sign-in-password"
          />
        )}
      />
      {signIn.isError ? (
        <View style={styles.serverError} role="alert" testID="sign-in-error">
          <AppText variant="bodyStrong" tone="fail" aria-hidden>
            !
          </AppText>
          <AppText variant="body" tone="fail" style={styles.serverErrorText}>
            {errorText(signIn.error)}
          </AppText>
        </View>
      ) : null}
      <Button
        label="Sign in"
        busy={signIn.isPending}
        busyLabel="Signing in…"
        onPress={() => void submit()}
        testID="sign-in-submit"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  serverError: {
    flexDirection: 'row',
    gap: space.sm,
    padding: space.md,
    borderLeftWidth: stroke.plumb,
    borderLeftColor: colors.fail,
    borderRadius: radius.sm,
    backgroundColor: colors.failTint,
  },
  serverErrorText: { flex: 1 },
});
