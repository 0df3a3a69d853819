/**
 * Ticks and number formatting (shared/ui/plots/ticks.ts). Expected tick values follow d3's
 * documented rule: linear ticks are 1, 2 or 5 × 10^k steps inside the domain (d3-array `ticks`);
 * log ticks are the integer multiples of each power of ten (d3-scale `log.ticks`). Labels are
 * checked by hand.
 */
import { axisTicks, formatPlain, formatReadout, formatWithUnit, makeScale, MINUS, tickCountFor } from '@/shared/ui/plots/ticks';

describe('linear ticks', () => {
  test('0…100 Hz in five steps of 20', () => {
    const ticks = axisTicks(makeScale('linear', [0, 100], [0, 300]), 'linear', 5);
    expect(ticks.map((t) => t.value)).toEqual([0, 20, 40, 60, 80, 100]);
    expect(ticks.map((t) => t.label)).toEqual(['0', '20', '40', '60', '80', '100']);
  });

  test('a dB range labels negative values with the minus sign U+2212', () => {
    const ticks = axisTicks(makeScale('linear', [-85, -15], [200, 0]), 'linear', 4);
    expect(ticks.map((t) => t.value)).toEqual([-80, -60, -40, -20]);
    expect(ticks[0].label).toBe(`${MINUS}80`);
  });

  test('tiny receptance magnitudes get an exponent format', () => {
    const ticks = axisTicks(makeScale('linear', [0, 4e-6], [200, 0]), 'linear', 4);
    expect(ticks.map((t) => t.value)).toEqual([0, 1e-6, 2e-6, 3e-6, 4e-6]);
    expect(ticks.map((t) => t.label)).toEqual(['0', '1e−6', '2e−6', '3e−6', '4e−6']);
  });

  test('fractional steps keep the digits the step needs', () => {
    const ticks = axisTicks(makeScale('linear', [0, 1], [200, 0]), 'linear', 5);
    expect(ticks.map((t) => t.label)).toEqual(['0', '0.2', '0.4', '0.6', '0.8', '1']);
  });
});

describe('log ticks', () => {
  test('10…1000 Hz: every integer multiple of a decade, the decades labelled', () => {
    const ticks = axisTicks(makeScale('log', [10, 1000], [0, 300]), 'log', 4);
    expect(ticks.map((t) => t.value)).toEqual([10, 20, 30, 40, 50, 60, 70, 80, 90, 100, 200, 300, 400, 500, 600, 700, 800, 900, 1000]);
    const labelled = ticks.filter((t) => t.label !== '').map((t) => t.label);
    expect(labelled).toEqual(expect.arrayContaining(['10', '100', '1000']));
    expect(labelled).not.toContain('30');
  });

  test('labels below 1 Hz and above 1e6 read plainly or with an exponent', () => {
    expect(formatPlain(0.5)).toBe('0.5');
    expect(formatPlain(1000)).toBe('1000');
    expect(formatPlain(2e6)).toBe('2e6');
    expect(formatPlain(1e-4)).toBe('1e−4');
  });
});

describe('read-out numbers', () => {
  test('four significant digits, minus sign, exponent for very small and large values', () => {
    expect(formatReadout(36.01943)).toBe('36.02');
    expect(formatReadout(-42.126)).toBe(`${MINUS}42.13`);
    expect(formatReadout(0.0123456)).toBe('0.01235');
    expect(formatReadout(1.23456e-7)).toBe('1.235e−7');
    expect(formatReadout(2.5e7)).toBe('2.500e7');
    expect(formatReadout(0)).toBe('0');
    expect(formatReadout(NaN)).toBe('—');
    expect(formatReadout(null)).toBe('—');
  });

  test('a value always carries its unit', () => {
    expect(formatWithUnit(36.01943, 'Hz')).toBe('36.02 Hz');
    expect(formatWithUnit(undefined, 'dB')).toBe('— dB');
    expect(formatWithUnit(0.5, '')).toBe('0.5000');
  });

  test('tick count follows the axis length, within 2…10', () => {
    expect(tickCountFor(30)).toBe(2);
    expect(tickCountFor(320)).toBe(5);
    expect(tickCountFor(5000)).toBe(10);
  });
});
