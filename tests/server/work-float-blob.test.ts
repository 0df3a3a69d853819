/**
 * Exact storage of numbers in blobs (server/db/float-blob.ts): every IEEE-754 double comes back
 * with the same bits, NaN, ±Infinity and −0 included (IEEE 754-2019 binary64), structure and shared
 * arrays preserved.
 */
import { blobToFloat64, float64ToBlob, packValue, unpackValue } from '@/server/db/float-blob';

const bits = (a: Float64Array) => Array.from(new BigUint64Array(a.buffer.slice(a.byteOffset, a.byteOffset + a.byteLength)));
const specials = Float64Array.of(0, -0, NaN, Infinity, -Infinity, Number.MIN_VALUE, -Number.MAX_VALUE, 0.1 + 0.2, Math.PI);

it('stores a Float64Array as its little-endian bytes and reads the same bits back', () => {
  const blob = float64ToBlob(specials);
  expect(blob.length).toBe(8 * specials.length);
  expect(blob.readDoubleLE(8 * 8)).toBe(Math.PI);
  expect(bits(blobToFloat64(blob))).toEqual(bits(specials));
  // A blob that is a view into a larger, unaligned buffer (as a driver may hand it over).
  const padded = Buffer.concat([Buffer.from([1, 2, 3]), blob]).subarray(3);
  expect(bits(blobToFloat64(padded))).toEqual(bits(specials));
});

it('packs a structured value exactly: typed arrays, special numbers, shared arrays, nesting', () => {
  const shared = Float64Array.of(1.5, -2.25);
  const value = {
    name: 'run',
    seed: 1_000_003,
    worst: NaN,
    negativeZero: -0,
    nothing: null,
    skipped: undefined,
    lines: { magnitude: shared, again: shared, inside: Uint8Array.of(1, 0, 1) },
    modes: [{ status: 'resolved', error: -Infinity }, { status: 'outside-band', error: null }],
    curve: specials,
  };
  const back = unpackValue<typeof value>(packValue(value));
  expect(back.name).toBe('run');
  expect(back.seed).toBe(1_000_003);
  expect(back.worst).toBeNaN();
  expect(Object.is(back.negativeZero, -0)).toBe(true);
  expect(back.nothing).toBeNull();
  expect('skipped' in back).toBe(false);
  expect(back.lines.magnitude).toBeInstanceOf(Float64Array);
  expect(back.lines.again).toBe(back.lines.magnitude); // stored once, shared again
  expect(Array.from(back.lines.inside)).toEqual([1, 0, 1]);
  expect(back.lines.inside).toBeInstanceOf(Uint8Array);
  expect(back.modes[0].error).toBe(-Infinity);
  expect(bits(back.curve)).toEqual(bits(specials));
  expect(packValue(back).equals(packValue(value))).toBe(true);
});
