/**
 * Exact storage of numbers in SQLite blobs. A Float64Array is stored as its raw IEEE-754 bytes,
 * little-endian, so a value read back is the same double bit for bit (NaN, ±Infinity and −0
 * included), which JSON cannot promise.
 *
 * `packValue` stores a whole structured value (plain objects, arrays, strings, booleans, null,
 * numbers, Float64Array, Uint8Array) losslessly: a 4-byte little-endian length, a JSON skeleton in
 * which each typed array is `{"$a": i}` (i into the array list; one array reached twice is stored
 * once) and each non-finite number or −0 is `{"$n": "NaN" | "Infinity" | "-Infinity" | "-0"}`,
 * zero padding to a multiple of 8, then the arrays' bytes in order, each padded to 8 bytes.
 * The skeleton also lists each array's type and length.
 */

/** The bytes of a Float64Array, little-endian. */
export function float64ToBlob(values: Float64Array): Buffer {
  if (LITTLE_ENDIAN) return Buffer.from(values.buffer.slice(values.byteOffset, values.byteOffset + values.byteLength));
  const out = Buffer.alloc(values.length * 8);
  for (let i = 0; i < values.length; i++) out.writeDoubleLE(values[i], i * 8);
  return out;
}

/** A Float64Array from float64ToBlob's bytes. */
export function blobToFloat64(blob: Buffer | Uint8Array): Float64Array {
  const buf = Buffer.isBuffer(blob) ? blob : Buffer.from(blob.buffer, blob.byteOffset, blob.byteLength);
  if (buf.length % 8 !== 0) throw new Error(`Float64 blob of ${buf.length} bytes is not a multiple of 8`);
  return readDoubles(buf, 0, buf.length / 8);
}

const pad8 = (n: number) => (n + 7) & ~7;

const LITTLE_ENDIAN = new Uint8Array(Float64Array.of(1).buffer)[7] === 0x3f;

/** `length` doubles at byte `at` of buf (copied, so the result is aligned and owns its memory). */
function readDoubles(buf: Buffer, at: number, length: number): Float64Array {
  if (LITTLE_ENDIAN) return new Float64Array(buf.buffer.slice(buf.byteOffset + at, buf.byteOffset + at + length * 8));
  const out = new Float64Array(length);
  for (let i = 0; i < length; i++) out[i] = buf.readDoubleLE(at + i * 8);
  return out;
}

type Packed = Float64Array | Uint8Array;

function specialNumber(v: number): string | null {
  if (Number.isNaN(v)) return 'NaN';
  if (v === Infinity) return 'Infinity';
  if (v === -Infinity) return '-Infinity';
  if (v === 0 && 1 / v < 0) return '-0';
  return null;
}

const SPECIAL: Record<string, number> = { NaN: NaN, Infinity: Infinity, '-Infinity': -Infinity, '-0': -0 };

/** One blob holding `value` exactly (see the module doc for the layout). */
export function packValue(value: unknown): Buffer {
  const arrays: Packed[] = [];
  const seen = new Map<Packed, number>();
  const skeleton = (v: unknown): unknown => {
    if (typeof v === 'number') {
      const special = specialNumber(v);
      return special ? { $n: special } : v;
    }
    if (v instanceof Float64Array || v instanceof Uint8Array) {
      let i = seen.get(v);
      if (i === undefined) {
        i = arrays.push(v) - 1;
        seen.set(v, i);
      }
      return { $a: i };
    }
    if (Array.isArray(v)) return v.map(skeleton);
    if (v && typeof v === 'object') {
      if (ArrayBuffer.isView(v)) throw new Error(`packValue: ${v.constructor.name} is not supported`);
      const out: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(v)) if (x !== undefined) out[k] = skeleton(x);
      return out;
    }
    if (typeof v === 'function' || typeof v === 'symbol' || typeof v === 'bigint') throw new Error(`packValue: ${typeof v} is not supported`);
    return v;
  };
  const body = skeleton(value);
  const header = Buffer.from(
    JSON.stringify({ body, arrays: arrays.map((a) => ({ type: a instanceof Float64Array ? 'f64' : 'u8', length: a.length })) }),
    'utf8',
  );
  const start = pad8(4 + header.length);
  const size = arrays.reduce((n, a) => n + pad8(a.byteLength), start);
  const out = Buffer.alloc(size);
  out.writeUInt32LE(header.length, 0);
  header.copy(out, 4);
  let at = start;
  for (const a of arrays) {
    if (a instanceof Float64Array && !LITTLE_ENDIAN) for (let i = 0; i < a.length; i++) out.writeDoubleLE(a[i], at + i * 8);
    else Buffer.from(a.buffer, a.byteOffset, a.byteLength).copy(out, at);
    at += pad8(a.byteLength);
  }
  return out;
}

/** The value packed by packValue, with its typed arrays and special numbers restored. */
export function unpackValue<T = unknown>(blob: Buffer | Uint8Array): T {
  const buf = Buffer.isBuffer(blob) ? blob : Buffer.from(blob.buffer, blob.byteOffset, blob.byteLength);
  const headerLength = buf.readUInt32LE(0);
  const header = JSON.parse(buf.subarray(4, 4 + headerLength).toString('utf8')) as {
    body: unknown;
    arrays: { type: 'f64' | 'u8'; length: number }[];
  };
  const arrays: Packed[] = [];
  let at = pad8(4 + headerLength);
  for (const h of header.arrays) {
    if (h.type === 'f64') {
      arrays.push(readDoubles(buf, at, h.length));
      at += pad8(h.length * 8);
    } else {
      arrays.push(Uint8Array.from(buf.subarray(at, at + h.length)));
      at += pad8(h.length);
    }
  }
  const restore = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(restore);
    if (v && typeof v === 'object') {
      const o = v as Record<string, unknown>;
      if (typeof o.$a === 'number' && Object.keys(o).length === 1) return arrays[o.$a];
      if (typeof o.$n === 'string' && Object.keys(o).length === 1) return SPECIAL[o.$n];
      const out: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(o)) out[k] = restore(x);
      return out;
    }
    return v;
  };
  return restore(header.body) as T;
}
