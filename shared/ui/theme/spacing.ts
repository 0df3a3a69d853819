/** Spacing scale (px). Multiples of 4 with two finer steps for hairline layouts. */
export const space = {
  none: 0,
  hair: 2,
  xs: 4,
  sm: 8,
  md: 12,
  lg: 16,
  xl: 24,
  xxl: 32,
  xxxl: 48,
} as const;

export const radius = { sm: 4, md: 8, round: 999 } as const;

/** Stroke widths: `rule` for borders, `plumb` for the brass plumb-line marker. */
export const stroke = { rule: 1, plumb: 3, focus: 2 } as const;

/** Layout sizes shared by the shell and the screens. */
export const layout = {
  /** At this window width and above the side rail replaces the bottom tab bar. */
  wideBreakpoint: 1024,
  railWidth: 232,
  tabBarHeight: 60,
  headerHeight: 60,
  /** Reading width of a screen's column. */
  contentMaxWidth: 760,
  formMaxWidth: 420,
  minTouchTarget: 44,
  iconSize: 22,
} as const;
