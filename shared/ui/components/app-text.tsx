import type { ReactNode } from 'react';
import { StyleSheet, Text, type TextProps } from 'react-native';
import { colors, typeScale, type TypeVariant } from '@/shared/ui/theme';

type Tone = 'default' | 'muted' | 'fail' | 'pass' | 'onPrimary';

const toneColor: Record<Tone, string> = {
  default: colors.text,
  muted: colors.textMuted,
  fail: colors.fail,
  pass: colors.pass,
  onPrimary: colors.onPrimary,
};

export type AppTextProps = TextProps & {
  variant?: TypeVariant;
  tone?: Tone;
  children?: ReactNode;
};

/** Text in one of the theme's type styles. Every piece of text in the client goes through it. */
export function AppText({ variant = 'body', tone = 'default', style, ...rest }: AppTextProps) {
  return <Text {...rest} style={[styles.base, typeScale[variant], { color: toneColor[tone] }, style]} />;
}

const styles = StyleSheet.create({ base: { color: colors.text } });
