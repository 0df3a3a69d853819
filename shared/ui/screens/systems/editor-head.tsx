/** The head of an editor pane: an eyebrow and a level-2 heading (the list pane holds the page's h1). */
import { StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';

export function EditorHead({ title, eyebrow }: { title: string; eyebrow: string }) {
  return (
    <View style={styles.head}>
      <AppText variant="label" tone="muted">
        {eyebrow}
      </AppText>
      <AppText variant="title" role="heading" aria-level={2} testID="editor-title">
        {title}
      </AppText>
    </View>
  );
}

const styles = StyleSheet.create({ head: { gap: space.xs } });
