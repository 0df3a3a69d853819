/** Transient windows and the level trigger: hand-sized cases with known answers. */
import { addedDampingRatio, exponentialWindow, forceWindow, triggeredBlockStarts } from '@/shared/engine/transient';
import { EngineInputError } from '@/shared/engine/errors';

describe('forceWindow', () => {
  it('unity on round(fraction·N) samples, a falling half-cosine taper of M/8 samples, zeros after', () => {
    const w = forceWindow(256, 0.25); // M = 64, taper 8
    expect(w.slice(0, 64).every((v) => v === 1)).toBe(true);
    const taper = Array.from(w.slice(64, 72));
    expect(taper.every((v, i) => v < 1 && v > 0 && (i === 0 || v < taper[i - 1]))).toBe(true);
    expect(taper[0] + taper[7]).toBeCloseTo(1, 14); // half-cosine: symmetric about ½
    expect(w.slice(72).every((v) => v === 0)).toBe(true);
  });
  it('fraction 1 is all ones', () => {
    expect(forceWindow(64, 1).every((v) => v === 1)).toBe(true);
  });
  it.each([0, 1.5, NaN])('rejects forceWindowFraction=%d', (f) => {
    expect(() => forceWindow(64, f)).toThrow(EngineInputError);
    expect(() => forceWindow(64, f)).toThrow(/^transient.forceWindowFraction=/);
  });
});

describe('exponentialWindow and the damping it adds', () => {
  it('1 up to the trigger sample, then exp(−t/τ): e^{−1} one τ after the trigger', () => {
    const w = exponentialWindow(2048, 1000, 0.25, 10);
    expect(w.slice(0, 11).every((v) => v === 1)).toBe(true);
    expect(w[260]).toBeCloseTo(Math.exp(-1), 14);
  });
  it('ζ_add = 1/(ω·τ) (common practice, quoted from memory)', () => {
    expect(addedDampingRatio(50, 0.4)).toBeCloseTo(1 / (2 * Math.PI * 50 * 0.4), 15);
  });
  it('rejects a decay time that is not positive', () => {
    expect(() => exponentialWindow(64, 100, 0, 0)).toThrow(/^transient.exponentialDecayFraction=0 /);
  });
});

describe('triggeredBlockStarts', () => {
  const record = new Float64Array(1000);
  record[120] = 1; // a hit
  record[125] = -0.3; // its ringing, below a 0.5 level
  record[600] = -0.8; // a second hit (|x| counts)
  it('opens a block pretrigger samples before each hit, resuming after the block', () => {
    expect(triggeredBlockStarts(record, 256, 0.5, 20)).toEqual({ starts: [100, 580], warnings: [] });
  });
  it('a hit inside the previous block does not open a block', () => {
    const r = record.slice();
    r[300] = 0.9;
    expect(triggeredBlockStarts(r, 256, 0.5, 20).starts).toEqual([100, 580]);
  });
  it('stops at maxBlocks; says so when fewer blocks fit than asked', () => {
    expect(triggeredBlockStarts(record, 256, 0.5, 20, 1).starts).toEqual([100]);
    const few = triggeredBlockStarts(record, 256, 0.5, 20, 5);
    expect(few.starts).toEqual([100, 580]);
    expect(few.warnings.join()).toMatch(/averages=5 .* only 2 triggered blocks/);
  });
  it('a block that would run past the record end is not used', () => {
    expect(triggeredBlockStarts(record, 512, 0.5, 20).starts).toEqual([100]);
  });
  it('a hit too close to the record start gives a block at 0, with a warning', () => {
    const t = triggeredBlockStarts(record, 256, 0.5, 200);
    expect(t.starts[0]).toBe(0);
    expect(t.warnings.join()).toMatch(/trigger at sample 120 leaves only 120 of 200 pretrigger samples/);
  });
  it('throws when nothing triggers a full block, or the input is all zeros', () => {
    expect(() => triggeredBlockStarts(record, 2048, 0.5, 0)).toThrow(/^transient.triggerLevelFraction=0.5 /);
    expect(() => triggeredBlockStarts(new Float64Array(10), 4, 0.5, 0)).toThrow(/^record.input="all zeros" /);
  });
});
