/**
 * Typed arrays ↔ the little-endian bytes stored in series_levels.data. On a little-endian host
 * (every platform Node runs on in practice) encoding is a view, not a copy.
 */

export type Stored = Float64Array | Float32Array | Uint32Array | Uint8Array;
export type StoredType = "f64" | "f32" | "u32" | "u8";

const LITTLE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

const BYTES: Record<StoredType, number> = { f64: 8, f32: 4, u32: 4, u8: 1 };

/** Bytes of `a`, little-endian; shares memory with `a` on little-endian hosts. */
export function toBytes(a: Stored): Buffer {
  if (LITTLE || a instanceof Uint8Array) return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
  const out = Buffer.alloc(a.byteLength);
  const dv = new DataView(out.buffer, out.byteOffset, out.byteLength);
  for (let i = 0; i < a.length; i++) {
    if (a instanceof Float64Array) dv.setFloat64(i * 8, a[i], true);
    else if (a instanceof Float32Array) dv.setFloat32(i * 4, a[i], true);
    else dv.setUint32(i * 4, a[i], true);
  }
  return out;
}

function make(type: StoredType, len: number): Stored {
  return type === "f64" ? new Float64Array(len) : type === "f32" ? new Float32Array(len) : type === "u32" ? new Uint32Array(len) : new Uint8Array(len);
}

/**
 * One typed array from the concatenated chunks (in order). Copies: a driver's Buffer may sit at
 * any offset of a shared slab, which a typed-array view cannot start at.
 */
export function fromBytes(type: "f64", chunks: readonly Uint8Array[]): Float64Array;
export function fromBytes(type: "f32", chunks: readonly Uint8Array[]): Float32Array;
export function fromBytes(type: "u32", chunks: readonly Uint8Array[]): Uint32Array;
export function fromBytes(type: "u8", chunks: readonly Uint8Array[]): Uint8Array;
export function fromBytes(type: StoredType, chunks: readonly Uint8Array[]): Stored;
export function fromBytes(type: StoredType, chunks: readonly Uint8Array[]): Stored {
  const size = BYTES[type];
  let total = 0;
  for (const c of chunks) total += c.byteLength;
  if (total % size) throw new Error(`stored ${type} data of ${total} bytes is not a whole number of values`);
  const out = make(type, total / size);
  const bytes = new Uint8Array(out.buffer);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  if (!LITTLE && size > 1) {
    const dv = new DataView(out.buffer);
    for (let i = 0; i < out.length; i++) {
      out[i] = type === "f64" ? dv.getFloat64(i * 8, true) : type === "f32" ? dv.getFloat32(i * 4, true) : dv.getUint32(i * 4, true);
    }
  }
  return out;
}
