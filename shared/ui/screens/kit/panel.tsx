/** Building blocks of the evidence screens: a titled panel, a heading block and a link row. */
import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

export function Panel({ title, aside, children, testID }: { title?: string; aside?: ReactNode; children: ReactNode; testID?: string }) {
  return (
    <View style={styles.panel} testID={testID}>
      {title ? (
        <View style={styles.panelHead}>
          <AppText variant="heading" role="heading" aria-level={2} style={styles.flex}>
            {title}
          </AppText>
          {aside}
        </View>
      ) : null}
      {children}
    </View>
  );
}

/** The top of a screen: eyebrow, the one level-1 heading, an intro and optional actions. */
export function PageHead({ title, eyebrow, intro, actions }: { title: string; eyebrow?: string; intro?: string; actions?: ReactNode }) {
  return (
    <View style={styles.head}>
      {eyebrow ? (
        <AppText variant="label" tone="muted">
          {eyebrow}
        </AppText>
      ) : null}
      <AppText variant="title" role="heading" aria-level={1} testID="screen-title">
        {title}
      </AppText>
      {intro ? (
        <AppText variant="body" tone="muted">
          {intro}
        </AppText>
      ) : null}
      {actions ? <View style={styles.actions}>{actions}</View> : null}
    </View>
  );
}

type RowLinkProps = { href: string; label: string; active?: boolean; children: ReactNode; testID?: string };

/** A list row that is a real link; the selected one carries the brass plumb line. */
export function RowLink({ href, label, active = false, children, testID }: RowLinkProps) {
  const current = active ? ({ 'aria-current': 'page' } as object) : {};
  return (
    <Link href={href} asChild>
      <Pressable role="link" accessibilityLabel={label} testID={testID} {...current}>
        {({ hovered, pressed }: { hovered?: boolean; pressed: boolean }) => (
          <View style={[styles.row, (hovered || pressed) && styles.rowHover, active && styles.rowActive]}>
            <View style={[styles.plumb, active && styles.plumbActive]} />
            {children}
          </View>
        )}
      </Pressable>
    </Link>
  );
}

/** An inline text link (same app, or a file the server sends, with `download`). */
export function TextLink({ href, children, external, testID }: { href: string; children: string; external?: boolean; testID?: string }) {
  if (external) {
    // Exports and PDFs are served by the API, outside the router.
    return (
      <AppText variant="bodyStrong" role="link" style={styles.link} testID={testID} {...({ href, hrefAttrs: { target: '_blank', rel: 'noopener' } } as object)}>
        {children}
      </AppText>
    );
  }
  return (
    <Link href={href} style={styles.link} testID={testID}>
      <AppText variant="bodyStrong" style={styles.link}>
        {children}
      </AppText>
    </Link>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1 },
  panel: {
    gap: space.md,
    padding: space.lg,
    backgroundColor: colors.surface,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.md,
  },
  panelHead: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  head: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, marginTop: space.xs },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchTarget + space.sm,
    paddingVertical: space.sm,
    paddingLeft: space.lg,
    paddingRight: space.md,
    backgroundColor: colors.surface,
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.sm,
  },
  rowHover: { backgroundColor: colors.surfaceSunken },
  rowActive: { backgroundColor: colors.primaryTint, borderColor: colors.borderStrong },
  plumb: { position: 'absolute', left: space.xs, top: space.sm, bottom: space.sm, width: stroke.plumb },
  plumbActive: { backgroundColor: colors.plumbLine },
  link: { color: colors.text, textDecorationLine: 'underline' },
});
