import { StyleSheet, View } from 'react-native';
import { AppText, AreaIcon } from '@/shared/ui/components';
import { colors, layout, space, stroke } from '@/shared/ui/theme';
import { areaForPath, moreHref, tabAreas } from './areas';
import { NavLink } from './nav-link';

/** The phone's bottom bar: five areas and "More". The active one hangs a short plumb line. */
export function TabBar({ pathname }: { pathname: string }) {
  const current = areaForPath(pathname);
  const moreActive = pathname === moreHref || (current !== undefined && !current.inTabs);
  const items = [
    ...tabAreas.map((area) => ({ id: area.id, label: area.label, href: area.href, active: current?.id === area.id })),
    { id: 'more' as const, label: 'More', href: moreHref, active: moreActive },
  ];
  return (
    <View role="tablist" aria-label="Areas" style={styles.bar} testID="tab-bar">
      {items.map((item) => (
        <NavLink
          key={item.id}
          href={item.href}
          label={item.label}
          active={item.active}
          role="tab"
          testID={`tab-${item.id}`}
          containerStyle={styles.link}
          style={({ pressed }) => [styles.item, pressed && styles.itemPressed]}
        >
          {item.active ? (
            <View style={styles.marker}>
              <View style={styles.plumb} />
              <View style={styles.bob} />
            </View>
          ) : null}
          <AreaIcon name={item.id} color={item.active ? colors.text : colors.textMuted} />
          <AppText variant={item.active ? 'tabActive' : 'tab'} tone={item.active ? 'default' : 'muted'} numberOfLines={1}>
            {item.label}
          </AppText>
        </NavLink>
      ))}
    </View>
  );
}

const bobSize = space.sm - space.hair;

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    height: layout.tabBarHeight,
    backgroundColor: colors.surface,
    borderTopWidth: stroke.rule,
    borderTopColor: colors.border,
  },
  link: { flex: 1, minWidth: 0 },
  item: {
    flex: 1,
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.hair,
    paddingTop: space.md,
    minWidth: layout.minTouchTarget,
  },
  itemPressed: { backgroundColor: colors.surfaceSunken },
  // The plumb line: a thin brass line hanging from the bar's top edge to a small bob.
  marker: { position: 'absolute', top: 0, left: 0, right: 0, alignItems: 'center' },
  plumb: {
    width: stroke.plumb - 1,
    height: space.xs + space.hair,
    backgroundColor: colors.plumbLine,
  },
  bob: {
    marginTop: -bobSize / 2,
    width: bobSize,
    height: bobSize,
    transform: [{ rotate: '45deg' }],
    backgroundColor: colors.plumbLine,
  },
});
