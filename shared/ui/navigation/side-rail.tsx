import { StyleSheet, View } from 'react-native';
import { AppText, AreaIcon, PlumbMark, productName } from '@/shared/ui/components';
import { colors, layout, space, stroke } from '@/shared/ui/theme';
import { areaForPath, areas, type AreaGroup } from './areas';
import { NavLink } from './nav-link';

const groups: AreaGroup[] = ['Work', 'Evidence', 'Lab'];

/** The wide layout's navigation: every area, grouped; the active one carries the plumb line. */
export function SideRail({ pathname }: { pathname: string }) {
  const current = areaForPath(pathname);
  return (
    <View role="navigation" aria-label="Areas" style={styles.rail} testID="side-rail">
      <View style={styles.brand}>
        <PlumbMark height={28} />
        <AppText variant="heading">{productName}</AppText>
      </View>
      <View style={styles.nav}>
        {groups.map((group) => (
          <View key={group} style={styles.group}>
            <AppText variant="labelCaps" tone="muted" style={styles.groupLabel}>
              {group}
            </AppText>
            {areas
              .filter((area) => area.group === group)
              .map((area) => {
                const active = current?.id === area.id;
                return (
                  <NavLink
                    key={area.id}
                    href={area.href}
                    label={area.label}
                    active={active}
                    role="link"
                    testID={`rail-${area.id}`}
                    style={({ pressed, hovered }) => [
                      styles.item,
                      (hovered || pressed) && styles.itemHover,
                      active && styles.itemActive,
                    ]}
                  >
                    <View style={[styles.plumb, active && styles.plumbActive]} />
                    <AreaIcon name={area.id} color={active ? colors.text : colors.textMuted} />
                    <AppText variant={active ? 'bodyStrong' : 'body'} tone={active ? 'default' : 'muted'}>
                      {area.label}
                    </AppText>
                  </NavLink>
                );
              })}
          </View>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  rail: {
    width: layout.railWidth,
    backgroundColor: colors.surface,
    borderRightWidth: stroke.rule,
    borderRightColor: colors.border,
    paddingVertical: space.lg,
    gap: space.xl,
  },
  brand: {
    flexDirection: 'row',
    alignItems: 'flex-end',
    gap: space.sm,
    paddingHorizontal: space.xl,
    minHeight: layout.headerHeight - space.xl,
  },
  nav: { gap: space.lg },
  group: { gap: space.hair },
  groupLabel: { paddingHorizontal: space.xl, paddingBottom: space.xs },
  item: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchTarget,
    paddingLeft: space.xl,
    paddingRight: space.lg,
  },
  itemHover: { backgroundColor: colors.surfaceSunken },
  itemActive: { backgroundColor: colors.primaryTint },
  // The plumb line: a thin vertical brass line along the active item's left edge.
  plumb: { position: 'absolute', left: space.sm, top: space.xs, bottom: space.xs, width: stroke.plumb },
  plumbActive: { backgroundColor: colors.plumbLine },
});
