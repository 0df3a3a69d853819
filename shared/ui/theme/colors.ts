/**
 * Plumbline's colours. `palette` holds the raw values from the product's direction; `colors`
 * names them by job. Screens and components use `colors` (or `curveColors` in plots), never hex.
 */
export const palette = {
  paper: '#F6F3EC',
  paperRaised: '#FCFAF5',
  paperSunken: '#ECE6D9',
  rule: '#D8D0BF',
  ruleStrong: '#A89C84',
  ink: '#1B2A3A',
  inkDeep: '#111B26',
  inkMuted: '#4F5D6B',
  brass: '#B07D2B',
  brassPressed: '#9A6C22',
  brassTint: '#F1E6D1',
  teal: '#1F7A8C',
  vermilion: '#C2452D',
  violet: '#6B4FA0',
  moss: '#4A7C3A',
  pass: '#2E7D5B',
  passTint: '#E2EEE7',
  fail: '#B3261E',
  failTint: '#F6E0DD',
  warning: '#C98A04',
  warningTint: '#F6EACB',
  neutralTint: '#E8E3D8',
} as const;

export const colors = {
  background: palette.paper,
  surface: palette.paperRaised,
  surfaceSunken: palette.paperSunken,
  border: palette.rule,
  borderStrong: palette.ruleStrong,
  text: palette.ink,
  textMuted: palette.inkMuted,
  /** Fill of the one primary action on a screen, and the plumb-line marker. */
  primary: palette.brass,
  primaryPressed: palette.brassPressed,
  /** Text on a brass fill: deep ink, because ink alone on brass is just under 4.5:1. */
  onPrimary: palette.inkDeep,
  primaryTint: palette.brassTint,
  plumbLine: palette.brass,
  focus: palette.teal,
  pass: palette.pass,
  passTint: palette.passTint,
  fail: palette.fail,
  failTint: palette.failTint,
  warning: palette.warning,
  warningTint: palette.warningTint,
  neutral: palette.inkMuted,
  neutralTint: palette.neutralTint,
} as const;

/** Curve colours for FRF plots: the exact FRF is ink and dashed; bands are 15 % fills. */
export const curveColors = {
  exact: palette.ink,
  h1: palette.teal,
  h2: palette.vermilion,
  hv: palette.violet,
  coherence: palette.moss,
  tolerance: palette.brass,
  bandOpacity: 0.15,
} as const;
