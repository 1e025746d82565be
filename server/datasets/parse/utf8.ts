/**
 * UTF-8 checks for streamed bytes. Buffer chunks can split a multi-byte character, so the caller
 * keeps the incomplete tail for the next chunk. The fast path is Node's native `isUtf8`; the slow
 * byte walk (RFC 3629 well-formedness, table 3-7 of the Unicode standard) runs only to locate an error.
 */

/** Index where an incomplete trailing multi-byte sequence starts, or buf.length if none. */
export function completePrefixLength(buf: Uint8Array): number {
  const end = buf.length;
  for (let i = end - 1; i >= Math.max(0, end - 3); i--) {
    const b = buf[i];
    if ((b & 0xc0) === 0x80) continue; // continuation byte: keep looking for the lead byte
    const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return end - i < need ? i : end;
  }
  return end;
}

/** Index of the first byte that is not well-formed UTF-8, or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  let i = 0;
  while (i < buf.length) {
    const b = buf[i];
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let lo = 0x80;
    let hi = 0xbf;
    if (b >= 0xc2 && b <= 0xdf) need = 1;
    else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      if (b === 0xe0) lo = 0xa0;
      if (b === 0xed) hi = 0x9f; // no UTF-16 surrogates
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      if (b === 0xf0) lo = 0x90;
      if (b === 0xf4) hi = 0x8f;
    } else return i;
    if (i + need >= buf.length) return i; // truncated sequence
    const second = buf[i + 1];
    if (second < lo || second > hi) return i;
    for (let k = 2; k <= need; k++) if ((buf[i + k] & 0xc0) !== 0x80) return i;
    i += need + 1;
  }
  return -1;
}
