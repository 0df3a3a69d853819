import Svg, { Circle, Line, Path, Rect } from 'react-native-svg';
import { colors, layout } from '@/shared/ui/theme';
import type { AreaId } from '@/shared/ui/navigation/areas';

type IconName = AreaId | 'more';

/** Line glyphs for the areas, drawn on a 24-unit grid. Decorative: the label carries the name. */
const glyphs: Record<IconName, React.ReactNode> = {
  // A bench top on two trestles.
  bench: (
    <>
      <Line x1={3} y1={9} x2={21} y2={9} />
      <Path d="M6 9 L4 19 M6 9 L8 19 M18 9 L16 19 M18 9 L20 19" />
      <Line x1={5} y1={15} x2={7} y2={15} />
      <Line x1={17} y1={15} x2={19} y2={15} />
    </>
  ),
  // A mass on a spring and damper: the known-answer system.
  systems: (
    <>
      <Rect x={7} y={3} width={10} height={6} rx={1} />
      <Path d="M9 9 L9 11 L7 12.5 L11 14 L7 15.5 L11 17 L9 18 L9 20" />
      <Path d="M15 9 L15 13 M13 13 L17 13 M13.5 13 L13.5 16 L16.5 16 L16.5 13 M15 16 L15 20" />
      <Line x1={4} y1={20.5} x2={20} y2={20.5} />
    </>
  ),
  // A clean wave with noise beside it: conditions put on a system.
  scenarios: (
    <>
      <Path d="M3 12 C5 6, 7 6, 9 12 S13 18, 15 12" />
      <Path d="M15 12 L16 9 L17 14 L18 10 L19 13 L20 11 L21 12" />
    </>
  ),
  // Three settings lines with sliders.
  recipes: (
    <>
      <Line x1={4} y1={6} x2={20} y2={6} />
      <Line x1={4} y1={12} x2={20} y2={12} />
      <Line x1={4} y1={18} x2={20} y2={18} />
      <Circle cx={9} cy={6} r={2} />
      <Circle cx={15} cy={12} r={2} />
      <Circle cx={7} cy={18} r={2} />
    </>
  ),
  // A grid of runs, one of them still going.
  studies: (
    <>
      <Rect x={4} y={4} width={6} height={6} rx={1} />
      <Rect x={14} y={4} width={6} height={6} rx={1} />
      <Rect x={4} y={14} width={6} height={6} rx={1} />
      <Path d="M17 14 A3 3 0 1 1 14 17" />
    </>
  ),
  // A sealed page.
  standards: (
    <>
      <Path d="M6 3 L15 3 L19 7 L19 21 L6 21 Z" />
      <Line x1={9} y1={9} x2={15} y2={9} />
      <Circle cx={12} cy={15} r={2.5} />
      <Path d="M10.5 17 L10 20 L12 19 L14 20 L13.5 17" />
    </>
  ),
  // A tick over a signature line.
  reviews: (
    <>
      <Path d="M5 11 L10 16 L19 6" />
      <Line x1={4} y1={20} x2={20} y2={20} />
    </>
  ),
  // A small building with a door.
  lab: (
    <>
      <Path d="M3 21 L3 10 L12 4 L21 10 L21 21 Z" />
      <Rect x={10} y={14} width={4} height={7} />
    </>
  ),
  // The letter i in a circle.
  about: (
    <>
      <Circle cx={12} cy={12} r={9} />
      <Line x1={12} y1={11} x2={12} y2={17} />
      <Circle cx={12} cy={7.5} r={0.6} />
    </>
  ),
  more: (
    <>
      <Circle cx={5} cy={12} r={1.5} />
      <Circle cx={12} cy={12} r={1.5} />
      <Circle cx={19} cy={12} r={1.5} />
    </>
  ),
};

type AreaIconProps = { name: IconName; color?: string; size?: number };

export function AreaIcon({ name, color = colors.text, size = layout.iconSize }: AreaIconProps) {
  return (
    <Svg
      width={size}
      height={size}
      viewBox="0 0 24 24"
      fill="none"
      stroke={color}
      strokeWidth={1.6}
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden
     
    >
      {glyphs[name]}
    </Svg>
  );
}
