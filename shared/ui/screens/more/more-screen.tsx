import { StyleSheet, View } from 'react-native';
import { AppText, AreaIcon, Screen } from '@/shared/ui/components';
import { moreAreas } from '@/shared/ui/navigation/areas';
import { NavLink } from '@/shared/ui/navigation/nav-link';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

/** On a phone, the areas that do not fit in the tab bar. */
export function MoreScreen() {
  return (
    <Screen title="More" intro="The other areas of Plumbline.">
      <View style={styles.list}>
        {moreAreas.map((area, index) => (
          <NavLink
            key={area.id}
            href={area.href}
            label={area.label}
            active={false}
            role="link"
            testID={`more-${area.id}`}
            style={({ pressed, hovered }) => [
              styles.row,
              index > 0 && styles.rowRule,
              (pressed || hovered) && styles.rowPressed,
            ]}
          >
            <AreaIcon name={area.id} />
            <View style={styles.text}>
              <AppText variant="bodyStrong">{area.label}</AppText>
              <AppText variant="small" tone="muted" numberOfLines={2}>
                {area.purpose}
              </AppText>
            </View>
            <AppText variant="heading" tone="muted" aria-hidden>
              ›
            </AppText>
          </NavLink>
        ))}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: {
    borderWidth: stroke.rule,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    overflow: 'hidden',
  },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    minHeight: layout.minTouchTarget + space.lg,
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
  },
  rowRule: { borderTopWidth: stroke.rule, borderTopColor: colors.border },
  rowPressed: { backgroundColor: colors.surfaceSunken },
  text: { flex: 1, gap: space.hair },
});
