import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Line, Path } from 'react-native-svg';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { AppText } from './app-text';

type CautionProps = {
  /** Defaults to "Caution"; the word is always shown next to the mark. */
  title?: string;
  children: ReactNode;
  testID?: string;
};

/** A boxed caution: warning-coloured edge, a triangle mark and the word, then the text. */
export function Caution({ title = 'Caution', children, testID }: CautionProps) {
  return (
    <View style={styles.box} role="note" aria-label={title} testID={testID}>
      <View style={styles.head}>
        <Svg width={18} height={18} viewBox="0 0 24 24" aria-hidden>
          <Path d="M12 3 L22 20 L2 20 Z" fill={colors.warning} />
          <Line x1={12} y1={9} x2={12} y2={14} stroke={colors.onPrimary} strokeWidth={2} />
          <Line x1={12} y1={16.5} x2={12} y2={17.5} stroke={colors.onPrimary} strokeWidth={2} />
        </Svg>
        <AppText variant="bodyStrong">{title}</AppText>
      </View>
      {typeof children === 'string' ? <AppText variant="body">{children}</AppText> : children}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.sm,
    padding: space.lg,
    borderLeftWidth: stroke.plumb + 1,
    borderLeftColor: colors.warning,
    borderRadius: radius.sm,
    backgroundColor: colors.warningTint,
  },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
