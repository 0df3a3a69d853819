/** The frame of the signed-out account pages: the mark, a title, one card, a way back to sign in. */
import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { AppText, PlumbMark, useDocumentTitle } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

export function AccountFrame({ title, intro, children }: { title: string; intro?: string; children: ReactNode }) {
  useDocumentTitle(title);
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
      <View style={styles.column}>
        <View style={styles.brand}>
          <PlumbMark height={56} />
          <View style={styles.flex}>
            <AppText variant="title" role="heading" aria-level={1} testID="screen-title">{title}</AppText>
            {intro ? <AppText variant="body" tone="muted">{intro}</AppText> : null}
          </View>
        </View>
        <View style={styles.card}>{children}</View>
        <Link href="/sign-in" style={styles.link}>
          <AppText variant="bodyStrong" style={styles.link}>Back to sign in</AppText>
        </Link>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.background },
  content: { flexGrow: 1, justifyContent: 'center', padding: space.lg, paddingVertical: space.xxxl },
  column: { width: '100%', maxWidth: layout.formMaxWidth, alignSelf: 'center', gap: space.xl },
  brand: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  flex: { flex: 1, gap: space.xs },
  card: { gap: space.lg, padding: space.xl, backgroundColor: colors.surface, borderWidth: stroke.rule, borderColor: colors.border, borderRadius: radius.md },
  link: { color: colors.text, textDecorationLine: 'underline', alignSelf: 'center' },
});
