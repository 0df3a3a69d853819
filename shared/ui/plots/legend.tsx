/** The legend under a plot: a line sample (dashed for the exact FRF, a swatch for a band) and a name. */
import { StyleSheet, View } from 'react-native';
import Svg, { Line, Rect } from 'react-native-svg';
import { AppText } from '@/shared/ui/components';
import { space, stroke } from '@/shared/ui/theme';
import { webData } from './web-data';

export interface LegendEntry {
  id: string;
  label: string;
  color: string;
  kind: 'line' | 'dashed' | 'band' | 'limit' | 'points';
}

export function Legend({ entries }: { entries: readonly LegendEntry[] }) {
  if (entries.length === 0) return null;
  return (
    <View style={styles.row} role="list" aria-label="Legend">
      {entries.map((e) => (
        <View
          key={e.id}
          role="listitem"
          style={styles.item}
          {...webData({ legendLabel: e.label, legendColor: e.color, legendKind: e.kind })}
        >
          <Svg width={24} height={12} aria-hidden>
            {e.kind === 'band' ? (
              <Rect x={0} y={1} width={24} height={10} fill={e.color} fillOpacity={0.15} stroke={e.color} strokeWidth={0.5} />
            ) : e.kind === 'points' ? (
              <Rect x={9} y={3} width={6} height={6} rx={3} fill={e.color} />
            ) : (
              <Line
                x1={0}
                x2={24}
                y1={6}
                y2={6}
                stroke={e.color}
                strokeWidth={e.kind === 'limit' ? stroke.focus : 2}
                strokeDasharray={e.kind === 'dashed' ? '6 4' : e.kind === 'limit' ? '2 3' : undefined}
              />
            )}
          </Svg>
          <AppText variant="small">{e.label}</AppText>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  item: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
