/**
 * Contrast of the theme's text pairings against WCAG 2.2 success criterion 1.4.3: at least
 * 4.5:1 for body text. Relative luminance and contrast ratio as defined in WCAG 2.2.
 */
import { colors } from '@/shared/ui/theme';

function channel(value: number) {
  const c = value / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

function luminance(hex: string) {
  const n = Number.parseInt(hex.slice(1), 16);
  return 0.2126 * channel((n >> 16) & 255) + 0.7152 * channel((n >> 8) & 255) + 0.0722 * channel(n & 255);
}

function contrast(a: string, b: string) {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('theme contrast', () => {
  test('the helper reproduces the known extremes', () => {
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 5);
    expect(contrast('#777777', '#777777')).toBeCloseTo(1, 5);
  });

  test.each([
    ['text on background', colors.text, colors.background],
    ['text on surface', colors.text, colors.surface],
    ['muted text on background', colors.textMuted, colors.background],
    ['muted text on surface', colors.textMuted, colors.surface],
    ['label on the brass primary button', colors.onPrimary, colors.primary],
    ['error text on background', colors.fail, colors.background],
    ['error text on its tint', colors.fail, colors.failTint],
    ['text on the caution tint', colors.text, colors.warningTint],
    ['text on the pass tint', colors.text, colors.passTint],
    ['text on the active rail item', colors.text, colors.primaryTint],
  ])('%s is at least 4.5:1', (_name, foreground, background) => {
    expect(contrast(foreground, background)).toBeGreaterThanOrEqual(4.5);
  });
});
