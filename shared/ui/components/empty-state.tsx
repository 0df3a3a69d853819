import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { AppText } from './app-text';
import { PlumbMark } from './plumb-mark';

type EmptyStateProps = {
  title: string;
  body: string;
  /** An optional action under the text (a Button). */
  action?: ReactNode;
  testID?: string;
};

/** What a screen shows before it has anything: what will appear here, and how it gets here. */
export function EmptyState({ title, body, action, testID }: EmptyStateProps) {
  return (
    <View style={styles.box} testID={testID}>
      <PlumbMark height={56} />
      <View style={styles.text}>
        <AppText variant="heading" role="heading" aria-level={2}>
          {title}
        </AppText>
        <AppText variant="body" tone="muted">
          {body}
        </AppText>
        {action ? <View style={styles.action}>{action}</View> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    flexDirection: 'row',
    gap: space.lg,
    padding: space.xl,
    borderWidth: stroke.rule,
    borderStyle: 'dashed',
    borderColor: colors.borderStrong,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
  },
  text: { flex: 1, gap: space.sm },
  action: { marginTop: space.sm, alignItems: 'flex-start' },
});
