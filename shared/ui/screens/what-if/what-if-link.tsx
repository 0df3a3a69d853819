/** The Bench's way into the what-if bench: a real link (keyboard and middle-click work), drawn as a quiet button. */
import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { AppText, PlumbMark } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

export const WHAT_IF_HREF = '/bench/what-if';

export function WhatIfLink() {
  return (
    <Link href={WHAT_IF_HREF} asChild>
      <Pressable role="link" accessibilityLabel="Open the what-if bench" testID="what-if-link" style={styles.outer}>
        {({ hovered, pressed }: { hovered?: boolean; pressed: boolean }) => (
          <View style={[styles.link, (hovered || pressed) && styles.hover]}>
            <PlumbMark height={28} />
            <View style={styles.text}>
              <AppText variant="bodyStrong">What-if bench</AppText>
              <AppText variant="small" tone="muted">
                Move the noise, add a delay, change block, window or estimator; see it in a second.
              </AppText>
            </View>
            <AppText variant="bodyStrong" aria-hidden>
              →
            </AppText>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  // The heading's action row wraps: the link takes a line of its own and its text wraps inside.
  outer: { width: '100%', maxWidth: 560 },
  link: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchTarget,
    paddingVertical: space.sm,
    paddingHorizontal: space.md,
    borderWidth: stroke.rule,
    borderColor: colors.borderStrong,
    borderRadius: radius.sm,
    backgroundColor: colors.surface,
  },
  hover: { backgroundColor: colors.surfaceSunken },
  text: { flexShrink: 1 },
});
