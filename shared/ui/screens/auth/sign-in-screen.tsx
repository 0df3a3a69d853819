import { Link } from 'expo-router';
import { ScrollView, StyleSheet, View } from 'react-native';
import { errorText } from '@/shared/ui/api/client';
import { useSession } from '@/shared/ui/api/use-session';
import { AppText, Button, PlumbMark, productName, useDocumentTitle } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';
import { SignInForm } from './sign-in-form';

export function SignInScreen() {
  useDocumentTitle('Sign in');
  const session = useSession();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
      <View style={styles.column}>
        <View style={styles.brand}>
          <PlumbMark height={72} />
          <View style={styles.brandText}>
            <AppText variant="display" role="heading" aria-level={1} testID="screen-title">
              {productName}
            </AppText>
            <AppText variant="bodyLarge" tone="muted">
              Prove your lab&apos;s FRF processing on systems whose answer is known exactly.
            </AppText>
          </View>
        </View>

        {session.status === 'unreachable' ? (
          <View style={styles.notice} role="alert" testID="server-notice">
            <AppText variant="small">{errorText(session.error)}</AppText>
            <Button label="Try again" variant="secondary" compact onPress={session.retry} />
          </View>
        ) : null}

        <View style={styles.card}>
          <AppText variant="heading" role="heading" aria-level={2}>
            Sign in to your lab
          </AppText>
          <SignInForm />
          <Link href="/reset-password" style={styles.link} testID="forgot-password-link">
            Forgot your password?
          </Link>
        </View>

        <AppText variant="small" tone="muted" style={styles.caution}>
          Synthetic checks verify the processing, not your transducers, fixture or set-up.{' '}
          <Link href="/about" style={styles.link} testID="caution-link">
            Read the cautions
          </Link>
        </AppText>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.background },
  content: { flexGrow: 1, justifyContent: 'center', padding: space.lg, paddingVertical: space.xxxl },
  column: { width: '100%', maxWidth: layout.formMaxWidth, alignSelf: 'center', gap: space.xl },
  brand: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  brandText: { flex: 1, gap: space.xs },
  notice: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.sm,
    borderLeftWidth: stroke.plumb,
    borderLeftColor: colors.warning,
    backgroundColor: colors.warningTint,
    alignItems: 'flex-start',
  },
  card: {
    gap: space.lg,
    padding: space.xl,
    backgroundColor: colors.surface,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.md,
  },
  caution: { textAlign: 'center' },
  link: { color: colors.text, textDecorationLine: 'underline' },
});
