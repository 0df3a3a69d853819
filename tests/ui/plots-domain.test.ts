/** The y-range a plot fits to: curves and rules set it; bands may widen it only so far. */
import { yExtent } from '@/shared/ui/plots/domain';
import type { PlotBand, PlotSeries } from '@/shared/ui/plots/types';

const x = Float64Array.from([1, 2, 3, 4]);
const curve = { id: 'h1', label: 'H1', color: '#000', x, y: Float64Array.from([-100, -90, -110, -100]) } as unknown as PlotSeries;
const band = (low: number[], high: number[]) =>
  ({ id: 'b', label: 'band', color: '#000', x, low: Float64Array.from(low), high: Float64Array.from(high) }) as unknown as PlotBand;

it('fits the curves with a 5 % margin when there is no band', () => {
  expect(yExtent([curve], [], [], [1, 4])).toEqual([-111, -89]);
});

it('lets a modest band widen the range to hold it whole', () => {
  const r = yExtent([curve], [band([-115, -95, -112, -104], [-95, -85, -105, -96])], [], [1, 4])!;
  expect(r[0]).toBeCloseTo(-115 - 0.05 * 30, 9);
  expect(r[1]).toBeCloseTo(-85 + 0.05 * 30, 9);
});

it('does not let a band 120 dB deep crush the curves (widening capped at their own span)', () => {
  const r = yExtent([curve], [band([-230, -95, -112, -104], [-95, -85, -105, -96])], [], [1, 4])!;
  // curves span 20 dB, so the band may take the range down to -130 dB at most
  expect(r[0]).toBeCloseTo(-130 - 0.05 * 45, 9);
  expect(r[1]).toBeCloseTo(-85 + 0.05 * 45, 9);
});

it('fits a band alone when nothing else is drawn', () => {
  expect(yExtent([], [band([0, 0, 0, 0], [10, 10, 10, 10])], [], [1, 4])).toEqual([-0.5, 10.5]);
});
