/**
 * List and detail. At ≥ 1024 px both panes show side by side; on a phone the detail, when one is
 * chosen, takes the whole column and the list is one link away.
 */
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { useDocumentTitle } from '@/shared/ui/components';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { colors, layout, space, stroke } from '@/shared/ui/theme';

type TwoPaneProps = {
  title: string;
  list: ReactNode;
  detail?: ReactNode;
  /** On a phone, show the list (default: the detail when there is one). */
  phoneShowsList?: boolean;
};

export function TwoPane({ title, list, detail, phoneShowsList }: TwoPaneProps) {
  useDocumentTitle(title);
  const wide = useWideLayout();
  if (!wide) {
    return (
      <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
        <View style={styles.column}>{(phoneShowsList ?? !detail) ? list : detail}</View>
      </ScrollView>
    );
  }
  return (
    <View style={styles.row} testID="two-pane">
      <ScrollView style={styles.listPane} contentContainerStyle={styles.content}>
        <View style={styles.listColumn}>{list}</View>
      </ScrollView>
      {detail ? (
        <ScrollView style={styles.detailPane} contentContainerStyle={styles.content}>
          <View style={styles.column}>{detail}</View>
        </ScrollView>
      ) : null}
    </View>
  );
}

/** A scrolling single column for screens that have no list beside them. */
export function Column({ title, children }: { title: string; children: ReactNode }) {
  useDocumentTitle(title);
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
      <View style={[styles.column, styles.wideColumn]}>{children}</View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.background },
  row: { flex: 1, flexDirection: 'row', backgroundColor: colors.background },
  listPane: {
    flexGrow: 0,
    flexShrink: 0,
    width: 400,
    borderRightWidth: stroke.rule,
    borderRightColor: colors.border,
  },
  detailPane: { flex: 1 },
  content: { paddingHorizontal: space.lg, paddingTop: space.xl, paddingBottom: space.xxxl },
  listColumn: { width: '100%', gap: space.lg },
  column: { width: '100%', maxWidth: layout.contentMaxWidth + 200, alignSelf: 'center', gap: space.xl },
  wideColumn: { maxWidth: layout.contentMaxWidth + 200 },
});
