/** Sample rate from a time column: 1 / spacing, which must be uniform to 1e-6 of a sample. */
import { CliInputError } from '../args';

export function sampleRateFromTime(time: Float64Array, where: string): number {
  const n = time.length;
  if (n < 2) throw new CliInputError(`${where}: time_s needs at least two samples to give a sample rate`);
  const spacing = (time[n - 1]! - time[0]!) / (n - 1);
  if (!(spacing > 0)) throw new CliInputError(`${where}: time_s must increase`);
  for (let i = 1; i < n; i++) {
    const step = time[i]! - time[i - 1]!;
    if (Math.abs(step - spacing) > 1e-6 * spacing + 1e-12 * Math.abs(time[i]!)) {
      throw new CliInputError(
        `${where}: time_s is not uniformly spaced at row ${i + 2} (step ${step} s against ${spacing} s); give --fs`,
      );
    }
  }
  const rate = 1 / spacing;
  // Time stamps written as decimals carry rounding: snap a rate within 1e-9 of a whole number.
  const whole = Math.round(rate);
  return Math.abs(rate - whole) <= 1e-9 * rate ? whole : rate;
}
