/**
 * Stored rows to JSON and back without losing anything the database keeps: typed arrays
 * go to binary chunks (referenced by number), and the values JSON cannot say (NaN,
 * ±Infinity, -0, undefined, Date) become small tagged objects. An object that happens to
 * carry the tag key itself is wrapped, so no row can be mistaken for a tag.
 *
 *   const chunks: Uint8Array[] = [];
 *   const json = encodeValue({ x: new Float32Array([1, 2]), se: NaN }, chunks);
 *   // json = { x: { $wm: 'array', type: 'Float32Array', chunk: 0 }, se: { $wm: 'num', v: 'NaN' } }
 *   decodeValue(json, (n) => chunks[n]) // deep-equal to the input
 */

const TAG = '$wm';

const ARRAY_TYPES = {
  Int8Array,
  Uint8Array,
  Uint8ClampedArray,
  Int16Array,
  Uint16Array,
  Int32Array,
  Uint32Array,
  Float32Array,
  Float64Array,
  BigInt64Array,
  BigUint64Array,
} as const;
type ArrayTypeName = keyof typeof ARRAY_TYPES;

// Chunks hold each array's bytes as the machine lays them out; every machine this runs on
// (x86-64, arm64) is little-endian, and the format says so.
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

function assertLittleEndian() {
  if (!LITTLE_ENDIAN) throw new Error('This machine is big-endian; match project files are little-endian and cannot be read or written here.');
}

export function encodeValue(v: unknown, chunks: Uint8Array[]): unknown {
  if (typeof v === 'number') {
    if (Number.isNaN(v)) return { [TAG]: 'num', v: 'NaN' };
    if (v === Infinity) return { [TAG]: 'num', v: 'Infinity' };
    if (v === -Infinity) return { [TAG]: 'num', v: '-Infinity' };
    if (Object.is(v, -0)) return { [TAG]: 'num', v: '-0' };
    return v;
  }
  if (v === undefined) return { [TAG]: 'undef' };
  if (v === null || typeof v !== 'object') {
    if (typeof v === 'bigint' || typeof v === 'function' || typeof v === 'symbol') throw new Error(`cannot store a ${typeof v} in a match project file`);
    return v;
  }
  if (ArrayBuffer.isView(v)) {
    assertLittleEndian();
    const type = v.constructor.name as ArrayTypeName;
    if (!(type in ARRAY_TYPES)) throw new Error(`cannot store a ${type} in a match project file`);
    chunks.push(new Uint8Array(v.buffer, v.byteOffset, v.byteLength).slice());
    return { [TAG]: 'array', type, chunk: chunks.length - 1 };
  }
  if (v instanceof ArrayBuffer) {
    chunks.push(new Uint8Array(v).slice());
    return { [TAG]: 'buffer', chunk: chunks.length - 1 };
  }
  if (v instanceof Date) return { [TAG]: 'date', v: v.getTime() };
  if (Array.isArray(v)) {
    const out = new Array(v.length);
    for (let i = 0; i < v.length; i++) out[i] = encodeValue(v[i], chunks);
    return out;
  }
  const out: Record<string, unknown> = {};
  for (const k of Object.keys(v)) out[k] = encodeValue((v as Record<string, unknown>)[k], chunks);
  return TAG in out ? { [TAG]: 'obj', v: out } : out;
}

/** `chunk(n)` gives the bytes of chunk n or throws a ProjectFileError naming it. */
export function decodeValue(v: unknown, chunk: (n: number) => Uint8Array): unknown {
  if (v === null || typeof v !== 'object') return v;
  if (Array.isArray(v)) return v.map((x) => decodeValue(x, chunk));
  const o = v as Record<string, unknown>;
  if (TAG in o) {
    switch (o[TAG]) {
      case 'num':
        return o.v === 'NaN' ? NaN : o.v === 'Infinity' ? Infinity : o.v === '-Infinity' ? -Infinity : -0;
      case 'undef':
        return undefined;
      case 'date':
        return new Date(o.v as number);
      case 'buffer':
        return chunk(o.chunk as number).slice().buffer;
      case 'array': {
        assertLittleEndian();
        const Ctor = ARRAY_TYPES[o.type as ArrayTypeName];
        if (!Ctor) throw new Error(`unknown array type "${String(o.type)}"`);
        const bytes = chunk(o.chunk as number);
        if (bytes.byteLength % Ctor.BYTES_PER_ELEMENT) throw new Error(`chunk ${String(o.chunk)} is ${bytes.byteLength} bytes, not a whole number of ${o.type} elements`);
        const copy = bytes.slice();
        return new Ctor(copy.buffer, 0, copy.byteLength / Ctor.BYTES_PER_ELEMENT);
      }
      case 'obj':
        return decodePlain(o.v as Record<string, unknown>, chunk);
      default:
        throw new Error(`unknown tag "${String(o[TAG])}"`);
    }
  }
  return decodePlain(o, chunk);
}

function decodePlain(o: Record<string, unknown>, chunk: (n: number) => Uint8Array): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of Object.keys(o)) out[k] = decodeValue(o[k], chunk);
  return out;
}
