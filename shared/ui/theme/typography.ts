import { Platform, type TextStyle } from 'react-native';

/**
 * Font family names. They are the keys given to `useFonts` in app/_layout.tsx, so the loaded
 * faces and the names used in styles cannot drift apart. Only these four faces are loaded.
 */
export const fontFaces = {
  sansRegular: 'AtkinsonHyperlegibleNext_400Regular',
  sansBold: 'AtkinsonHyperlegibleNext_700Bold',
  monoRegular: 'IBMPlexMono_400Regular',
  monoMedium: 'IBMPlexMono_500Medium',
} as const;

// On the web a fallback stack keeps the page readable if a face fails to load.
const withFallback = (face: string, fallback: string) =>
  Platform.select({ web: `${face}, ${fallback}`, default: face });

export const fontFamily = {
  sans: withFallback(fontFaces.sansRegular, 'system-ui, sans-serif'),
  sansBold: withFallback(fontFaces.sansBold, 'system-ui, sans-serif'),
  mono: withFallback(fontFaces.monoRegular, 'ui-monospace, monospace'),
  monoMedium: withFallback(fontFaces.monoMedium, 'ui-monospace, monospace'),
} as const;

/** The type scale. `label` is the small mono caption for eyebrows and units; `labelCaps` heads groups. */
export const typeScale = {
  display: { fontFamily: fontFamily.sansBold, fontSize: 32, lineHeight: 38 },
  title: { fontFamily: fontFamily.sansBold, fontSize: 26, lineHeight: 32 },
  heading: { fontFamily: fontFamily.sansBold, fontSize: 19, lineHeight: 26 },
  bodyLarge: { fontFamily: fontFamily.sans, fontSize: 18, lineHeight: 27 },
  body: { fontFamily: fontFamily.sans, fontSize: 16, lineHeight: 24 },
  bodyStrong: { fontFamily: fontFamily.sansBold, fontSize: 16, lineHeight: 24 },
  small: { fontFamily: fontFamily.sans, fontSize: 14, lineHeight: 20 },
  smallStrong: { fontFamily: fontFamily.sansBold, fontSize: 14, lineHeight: 20 },
  tab: { fontFamily: fontFamily.sans, fontSize: 12, lineHeight: 16 },
  tabActive: { fontFamily: fontFamily.sansBold, fontSize: 12, lineHeight: 16 },
  label: { fontFamily: fontFamily.monoMedium, fontSize: 12, lineHeight: 16, letterSpacing: 0.4 },
  labelCaps: {
    fontFamily: fontFamily.monoMedium,
    fontSize: 12,
    lineHeight: 16,
    letterSpacing: 0.8,
    textTransform: 'uppercase',
  },
  number: { fontFamily: fontFamily.mono, fontSize: 14, lineHeight: 20 },
} as const satisfies Record<string, TextStyle>;

export type TypeVariant = keyof typeof typeScale;
