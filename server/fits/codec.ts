/**
 * Large numeric results as bytes (bytea): Float64Array and Uint8Array copied as they are in memory.
 * Stored little-endian; a big-endian host would read them wrongly, so it refuses to start.
 */
import { endianness } from 'node:os';

if (endianness() !== 'LE') throw new Error('Lariat stores fit results little-endian and needs a little-endian machine');

export function float64ToBytes(values: Float64Array): Buffer {
  return Buffer.from(values.buffer.slice(values.byteOffset, values.byteOffset + values.byteLength));
}

export function bytesToFloat64(bytes: Buffer): Float64Array {
  if (bytes.byteLength % 8 !== 0) throw new Error(`stored Float64Array has ${bytes.byteLength} bytes, not a multiple of 8`);
  const copy = new Uint8Array(bytes.byteLength);
  copy.set(bytes);
  return new Float64Array(copy.buffer);
}

export function uint8ToBytes(values: Uint8Array): Buffer {
  return Buffer.from(values.buffer.slice(values.byteOffset, values.byteOffset + values.byteLength));
}

export function bytesToUint8(bytes: Buffer): Uint8Array {
  return Uint8Array.from(bytes);
}

/** Row `index` of a row-major [rows][width] array. */
export function rowOf<T extends Float64Array | Uint8Array>(values: T, index: number, width: number): T {
  return values.subarray(index * width, (index + 1) * width) as T;
}
