import Svg, { Circle, Line, Path } from 'react-native-svg';
import { colors, stroke } from '@/shared/ui/theme';

type PlumbMarkProps = {
  /** Total height in px; the bob is drawn at the bottom. */
  height?: number;
  color?: string;
};

/**
 * Plumbline's signature: a thin vertical line hanging from a short bar, ending in a bob.
 * Decorative only; screen readers skip it.
 */
export function PlumbMark({ height = 40, color = colors.plumbLine }: PlumbMarkProps) {
  const width = Math.max(12, Math.round(height * 0.3));
  const cx = width / 2;
  const bob = Math.max(3, width * 0.28);
  const bobTop = height - bob * 2.6;
  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} aria-hidden>
      <Line x1={0} y1={1} x2={width} y2={1} stroke={color} strokeWidth={stroke.rule * 2} />
      <Line x1={cx} y1={1} x2={cx} y2={bobTop} stroke={color} strokeWidth={stroke.rule * 1.5} />
      <Path
        d={`M ${cx - bob} ${bobTop + bob} L ${cx} ${bobTop} L ${cx + bob} ${bobTop + bob} L ${cx} ${height - 0.5} Z`}
        fill={color}
      />
      <Circle cx={cx} cy={bobTop + bob} r={bob * 0.35} fill={colors.surface} />
    </Svg>
  );
}
