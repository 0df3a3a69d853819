import { StyleSheet, View } from 'react-native';
import Svg, { Circle, Path } from 'react-native-svg';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import { AppText } from './app-text';

export type StatusTone = 'pass' | 'fail' | 'warning' | 'neutral';

/** Words used when a caller passes an empty label: a badge is never colour alone. */
export const defaultStatusWords: Record<StatusTone, string> = {
  pass: 'Pass',
  fail: 'Fail',
  warning: 'Warning',
  neutral: 'Note',
};

const toneStyle: Record<StatusTone, { color: string; tint: string }> = {
  pass: { color: colors.pass, tint: colors.passTint },
  fail: { color: colors.fail, tint: colors.failTint },
  warning: { color: colors.warning, tint: colors.warningTint },
  neutral: { color: colors.neutral, tint: colors.neutralTint },
};

// Each tone has its own shape too, so the badge reads in greyscale.
function ToneMark({ tone }: { tone: StatusTone }) {
  const { color } = toneStyle[tone];
  return (
    <Svg width={12} height={12} viewBox="0 0 12 12" aria-hidden>
      {tone === 'pass' ? (
        <Path d="M2 6.5 L5 9.5 L10 2.5" stroke={color} strokeWidth={2} fill="none" strokeLinecap="round" />
      ) : tone === 'fail' ? (
        <Path d="M2.5 2.5 L9.5 9.5 M9.5 2.5 L2.5 9.5" stroke={color} strokeWidth={2} strokeLinecap="round" />
      ) : tone === 'warning' ? (
        <Path d="M6 1 L11.5 11 L0.5 11 Z" fill={color} />
      ) : (
        <Circle cx={6} cy={6} r={4} stroke={color} strokeWidth={1.5} fill="none" />
      )}
    </Svg>
  );
}

type StatusBadgeProps = { tone: StatusTone; label: string; testID?: string };

export function StatusBadge({ tone, label, testID }: StatusBadgeProps) {
  const word = label.trim() || defaultStatusWords[tone];
  const { color, tint } = toneStyle[tone];
  return (
    <View style={[styles.badge, { borderColor: color, backgroundColor: tint }]} testID={testID}>
      <ToneMark tone={tone} />
      <AppText variant="smallStrong">{word}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  badge: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs,
    paddingHorizontal: space.sm,
    paddingVertical: space.hair,
    borderWidth: stroke.rule,
    borderRadius: radius.round,
  },
});
