/**
 * Stored column formats (PostgreSQL bytea), chosen so fitting loads them without parsing:
 * - float64: the column's Float64Array bytes (little-endian, as on every platform Node runs on
 *   here), NaN for missing;
 * - codes: Int32Array bytes of dictionary codes into `levels`, -1 for missing;
 * - text: UTF-8 cells joined by NUL, each prefixed "v" (a value) or just "m" (missing).
 */
import { DECIMAL, type MissingTest } from '../parse/missing';

export function typedBytes(a: Float64Array | Int32Array): Buffer {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}

/** Copies: a Buffer from pg may sit at an offset that is not a multiple of 8. */
export function bytesToFloat64(buf: Buffer): Float64Array {
  const out = new Float64Array(buf.length / 8);
  new Uint8Array(out.buffer).set(buf);
  return out;
}

export function bytesToInt32(buf: Buffer): Int32Array {
  const out = new Int32Array(buf.length / 4);
  new Uint8Array(out.buffer).set(buf);
  return out;
}

/** Numbers first in numeric order, then other strings in code-point order (locale-independent). */
export function compareLevels(a: string, b: string): number {
  const na = DECIMAL.test(a);
  const nb = DECIMAL.test(b);
  if (na && nb) return Number(a) - Number(b);
  if (na !== nb) return na ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

export function encodeFloat64(cells: (string | null)[], missing: MissingTest): Float64Array {
  const out = new Float64Array(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const cell = cells[i];
    out[i] = cell === null || missing.isMissing(cell) ? Number.NaN : Number(cell); // Number() ignores surrounding blanks
  }
  return out;
}

export function encodeCodes(cells: (string | null)[], missing?: MissingTest): { codes: Int32Array; levels: string[] } {
  const index = new Map<string, number>();
  // Few distinct raw cells in a column of codes: each is trimmed and tested once, then looked up.
  const byRaw = new Map<string, number>();
  const raw = new Int32Array(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const cell = cells[i];
    if (cell === null) {
      raw[i] = -1;
      continue;
    }
    let code = byRaw.get(cell);
    if (code === undefined) {
      if (missing?.isMissing(cell)) code = -1;
      else {
        const value = missing ? cell.trim() : cell;
        code = index.get(value);
        if (code === undefined) index.set(value, (code = index.size));
      }
      byRaw.set(cell, code);
    }
    raw[i] = code;
  }
  const levels = [...index.keys()].sort(compareLevels);
  const remap = new Int32Array(levels.length);
  levels.forEach((level, k) => (remap[index.get(level)!] = k));
  for (let i = 0; i < raw.length; i++) if (raw[i] >= 0) raw[i] = remap[raw[i]];
  return { codes: raw, levels };
}

export function encodeText(cells: (string | null)[], missing?: MissingTest): Buffer {
  const parts = cells.map((c) => (c === null || missing?.isMissing(c) ? 'm' : `v${missing ? c.trim() : c}`));
  return Buffer.from(parts.join('\0'), 'utf8');
}

export function decodeText(buf: Buffer): (string | null)[] {
  if (buf.length === 0) return [];
  return buf
    .toString('utf8')
    .split('\0')
    .map((p) => (p === 'm' ? null : p.slice(1)));
}
