/**
 * The engine's numbers are pinned bit for bit: one small study of a built-in scenario (the fan
 * frame with output noise, the lab's Hann survey recipe, three seeds) is run through runStudy and
 * every number it produces is hashed (SHA-256 over the exact IEEE-754 binary64 bytes, little
 * endian, with keys in sorted order). The digest is recorded per ENGINE_VERSION in the table
 * below. The reference is the engine's own earlier output, recorded when the version was
 * verified; it guards reproducibility (brief: "stored in SQLite with everything needed to
 * reproduce them bit for bit"), not correctness, which the other engine tests check against
 * outside sources.
 *
 * When it fails: something moved a number (engine code, fft.js, seedrandom, the built-in files).
 * If that was meant, bump ENGINE_VERSION (shared/engine/version.ts), re-verify the lab's approved
 * standards on the new engine, and add the new version's digest to the table.
 */
import { createHash, type Hash } from 'node:crypto';
import { runStudy } from '@/shared/engine/study';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { loadRecipe, loadScenario } from './built-in-helpers';

/** SHA-256 of the golden study, per engine version. */
const GOLDEN_DIGESTS: Record<string, string> = {
  '1.0.0': '47ca515dc4c2986b4eb9cba6270c1b198ded1e1f6e63dbee56c9b325b56a4923',
  // 1.1.0 adds figures to every study (Monte Carlo standard errors, the exact H1 region's coverage,
  // decision-rule outcomes, pre-flight warnings); the figures 1.0.0 had are unchanged.
  '1.1.0': 'ea74b6d52eba9d6d5b954cf11a9341bb2cbcb58a6e3baa409742173498001f98',
};

/** Feeds a value into the hash: tags and lengths keep different shapes from colliding. */
function feed(h: Hash, v: unknown): void {
  const f64 = new DataView(new ArrayBuffer(8));
  const num = (x: number) => {
    f64.setFloat64(0, x, true);
    h.update(new Uint8Array(f64.buffer.slice(0)));
  };
  if (v === null || v === undefined) {
    h.update(v === null ? 'N' : 'U');
  } else if (typeof v === 'number') {
    h.update('n');
    num(v);
  } else if (typeof v === 'string') {
    h.update(`s${Buffer.byteLength(v)}:`);
    h.update(v);
  } else if (typeof v === 'boolean') {
    h.update(v ? 'T' : 'F');
  } else if (v instanceof Float64Array) {
    h.update(`f${v.length}:`);
    for (const x of v) num(x);
  } else if (ArrayBuffer.isView(v)) {
    const bytes = new Uint8Array(v.buffer, v.byteOffset, v.byteLength);
    h.update(`b${v.constructor.name}${bytes.length}:`);
    h.update(bytes);
  } else if (Array.isArray(v)) {
    h.update(`a${v.length}:`);
    for (const x of v) feed(h, x);
  } else if (typeof v === 'object') {
    const keys = Object.keys(v).sort();
    h.update(`o${keys.length}:`);
    for (const k of keys) {
      feed(h, k);
      feed(h, (v as Record<string, unknown>)[k]);
    }
  } else {
    throw new Error(`golden digest: cannot hash a ${typeof v}`);
  }
}

function digestOf(value: unknown): string {
  const h = createHash('sha256');
  feed(h, value);
  return h.digest('hex');
}

describe('golden digest of a small study', () => {
  it('the hash sees a change in the last bit of one number', () => {
    const a = new Float64Array([1, 2, 3]);
    const b = Float64Array.from(a);
    b[1] = 2 + 2 ** -51; // the next binary64 value above 2
    expect(digestOf({ x: a })).not.toBe(digestOf({ x: b }));
    expect(digestOf({ x: a })).toBe(digestOf({ x: Float64Array.from(a) }));
  });

  it(`matches the digest recorded for ENGINE_VERSION ${ENGINE_VERSION}`, () => {
    const study = runStudy({ recipe: loadRecipe('frame-survey-hann-50'), scenarios: [loadScenario('frame-output-noise')], seeds: 3, baseSeed: 1 });
    const digest = digestOf(study);
    const recorded = GOLDEN_DIGESTS[ENGINE_VERSION];
    if (recorded === undefined) {
      throw new Error(`No golden digest is recorded for ENGINE_VERSION ${ENGINE_VERSION}: after re-verifying the approved standards on this engine, record '${digest}' in GOLDEN_DIGESTS.`);
    }
    if (digest !== recorded) {
      throw new Error(
        `The engine's numbers moved (digest ${digest}, recorded ${recorded} for ${ENGINE_VERSION}). ` +
          'If the change is meant: bump ENGINE_VERSION in shared/engine/version.ts, re-verify approved standards, and record the new digest under the new version.',
      );
    }
    expect(digest).toBe(recorded);
  });
});
