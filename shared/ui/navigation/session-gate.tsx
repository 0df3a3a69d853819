import { useRef, type ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { useSession } from '@/shared/ui/api/use-session';
import { AppText, PlumbMark, productName } from '@/shared/ui/components';
import { colors, space } from '@/shared/ui/theme';

/**
 * Holds the app back until the server has first said who is signed in, so no screen flashes
 * before a redirect. Later re-checks do not unmount the app; the group gates (route-gates.tsx)
 * route by the answer.
 */
export function SessionGate({ children }: { children: ReactNode }) {
  const session = useSession();
  const answered = useRef(false);
  if (session.status !== 'loading') answered.current = true;
  if (!answered.current) return <SessionSplash />;
  return <>{children}</>;
}

export function SessionSplash() {
  return (
    <View style={styles.splash} aria-busy>
      <PlumbMark height={64} />
      <AppText variant="heading">{productName}</AppText>
      <View style={styles.row}>
        <ActivityIndicator size="small" color={colors.textMuted} />
        <AppText variant="small" tone="muted">
          Checking your session…
        </AppText>
      </View>
    </View>
  );
}

/** Pages a signed-out visitor may open. */
export const publicPaths: readonly string[] = ['/about'];

/** Where the sign-in screen sends the user afterwards: only paths inside the app. */
export function safeNextPath(next: unknown): string {
  const value = Array.isArray(next) ? next[0] : next;
  if (typeof value !== 'string' || !value.startsWith('/') || value.startsWith('//')) return '/';
  if (value.startsWith('/sign-in')) return '/';
  return value;
}

export function signInHref(pathname: string): string {
  return pathname === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(pathname)}`;
}

const styles = StyleSheet.create({
  splash: {
    flex: 1,
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.md,
    backgroundColor: colors.background,
  },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
