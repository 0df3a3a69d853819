import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { AppText, PlumbMark, productName } from '@/shared/ui/components';
import { colors, layout, space, stroke } from '@/shared/ui/theme';

/** The frame of the few pages a signed-out visitor may read (About). */
export function PublicFrame({ children }: { children: ReactNode }) {
  return (
    <View style={styles.page}>
      <View role="banner" style={styles.header}>
        <PlumbMark height={32} />
        <AppText variant="heading" style={styles.brand}>
          {productName}
        </AppText>
        <Link href="/sign-in" style={styles.link}>
          <AppText variant="bodyStrong" style={styles.linkText}>
            Sign in
          </AppText>
        </Link>
      </View>
      <View role="main" style={styles.main}>
        {children}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.background },
  header: {
    minHeight: layout.headerHeight,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.lg,
    backgroundColor: colors.surface,
    borderBottomWidth: stroke.rule,
    borderBottomColor: colors.border,
  },
  brand: { flex: 1 },
  link: { paddingVertical: space.md, paddingHorizontal: space.sm },
  linkText: { textDecorationLine: 'underline' },
  main: { flex: 1 },
});
