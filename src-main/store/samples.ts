// Sample blobs: a Float64Array stored as its IEEE 754 binary64 values in little-endian byte
// order (SQLite file format docs leave blob contents to the application; the byte order is
// ours and fixed), with a SHA-256 checksum (FIPS 180-4, via node:crypto) as lower-case hex.
// Bytes are copied, never converted through numbers, so NaN payloads, -0 and subnormals
// survive a round trip bit for bit.
import { createHash } from 'node:crypto';

const hostIsLittleEndian = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** Reverses the byte order of each 8-byte word in place. */
function swap64(bytes: Uint8Array): void {
  for (let i = 0; i < bytes.length; i += 8) {
    for (let a = i, b = i + 7; a < b; a++, b--) {
      const x = bytes[a];
      bytes[a] = bytes[b];
      bytes[b] = x;
    }
  }
}

/** The little-endian bytes of `values`: a view on little-endian hosts, a swapped copy otherwise. */
export function float64ToBlob(values: Float64Array): Buffer {
  const view = Buffer.from(values.buffer, values.byteOffset, values.byteLength);
  if (hostIsLittleEndian) return view;
  const copy = Buffer.from(view);
  swap64(copy);
  return copy;
}

/** A fresh Float64Array from little-endian bytes; the length must be a multiple of 8 (checked by callers). */
export function blobToFloat64(blob: Uint8Array): Float64Array {
  const out = new Float64Array(blob.length / 8);
  const bytes = new Uint8Array(out.buffer);
  bytes.set(blob);
  if (!hostIsLittleEndian) swap64(bytes);
  return out;
}

/** SHA-256 of the bytes, lower-case hex (64 characters). */
export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}
