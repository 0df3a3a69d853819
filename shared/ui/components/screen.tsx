import { useEffect, type ReactNode } from 'react';
import { Platform, ScrollView, StyleSheet, View } from 'react-native';
import { colors, layout, space } from '@/shared/ui/theme';
import { AppText } from './app-text';

type ScreenProps = {
  title: string;
  /** A small mono line above the title, e.g. the area's group. */
  eyebrow?: string;
  /** One or two sentences under the title. */
  intro?: string;
  children?: ReactNode;
};

export const productName = 'Plumbline';

/** Sets the browser tab's title; a no-op off the web. */
export function useDocumentTitle(title: string) {
  useEffect(() => {
    if (Platform.OS === 'web' && typeof document !== 'undefined') {
      document.title = title === productName ? productName : `${title} · ${productName}`;
    }
  }, [title]);
}

/** A screen's scrolling column with its title as the page's only level-1 heading. */
export function Screen({ title, eyebrow, intro, children }: ScreenProps) {
  useDocumentTitle(title);
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
      <View style={styles.column}>
        <View style={styles.head}>
          {eyebrow ? <AppText variant="label" tone="muted">{eyebrow}</AppText> : null}
          <AppText variant="title" role="heading" aria-level={1} testID="screen-title">
            {title}
          </AppText>
          {intro ? (
            <AppText variant="bodyLarge" tone="muted">
              {intro}
            </AppText>
          ) : null}
        </View>
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.background },
  content: { paddingHorizontal: space.lg, paddingTop: space.xl, paddingBottom: space.xxxl },
  column: { width: '100%', maxWidth: layout.contentMaxWidth, alignSelf: 'center', gap: space.xl },
  head: { gap: space.sm },
});
