/**
 * UTF-8 checks. Malformed sequences are the classes of Markus Kuhn's "UTF-8 decoder capability and
 * stress test" (overlong forms, surrogates, code points above U+10FFFF, lone continuation bytes,
 * truncated sequences) and the well-formed table 3-7 of The Unicode Standard; random inputs are
 * compared with Node's WHATWG TextDecoder in fatal mode, an independent implementation.
 */
import { describe, expect, it } from 'vitest';
import { completePrefixLength, firstInvalidUtf8 } from '../../../server/datasets/parse/utf8';

const bytes = (...b: number[]) => Uint8Array.from(b);

describe('firstInvalidUtf8', () => {
  const malformed: [string, Uint8Array, number][] = [
    ['overlong "/" (C0 AF)', bytes(0x41, 0xc0, 0xaf), 1],
    ['overlong NUL (E0 80 80)', bytes(0xe0, 0x80, 0x80), 0],
    ['UTF-16 surrogate U+D800 (ED A0 80)', bytes(0x61, 0x62, 0xed, 0xa0, 0x80), 2],
    ['above U+10FFFF (F4 90 80 80)', bytes(0xf4, 0x90, 0x80, 0x80), 0],
    ['lone continuation byte (80)', bytes(0x61, 0x80), 1],
    ['truncated 3-byte sequence (E2 82)', bytes(0xe2, 0x82), 0],
    ['Latin-1 "é" (E9) before ASCII', bytes(0x4a, 0x6f, 0x73, 0xe9, 0x2c), 3],
    ['FE and FF never appear', bytes(0xfe), 0],
  ];
  for (const [what, input, at] of malformed) {
    it(`finds ${what} at byte ${at}`, () => {
      expect(firstInvalidUtf8(input)).toBe(at);
    });
  }

  it('accepts well-formed text of every length class', () => {
    expect(firstInvalidUtf8(Buffer.from('a é € 𝄞 \u{10FFFF}', 'utf8'))).toBe(-1);
  });

  it('agrees with the WHATWG decoder on 2000 random byte strings', () => {
    let seed = 12345;
    const next = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31; // ANSI C LCG
    const fatal = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });
    for (let k = 0; k < 2000; k++) {
      const input = Uint8Array.from({ length: 1 + Math.floor(next() * 8) }, () => (next() < 0.5 ? 0x41 : Math.floor(next() * 256)));
      let valid = true;
      try {
        fatal.decode(input);
      } catch {
        valid = false;
      }
      expect(firstInvalidUtf8(input) === -1, `input ${Buffer.from(input).toString('hex')}`).toBe(valid);
    }
  });
});

describe('completePrefixLength', () => {
  it('holds back a character split across chunks', () => {
    const euro = Buffer.from('ab€', 'utf8'); // € is E2 82 AC
    expect(completePrefixLength(euro.subarray(0, 3))).toBe(2);
    expect(completePrefixLength(euro.subarray(0, 4))).toBe(2);
    expect(completePrefixLength(euro)).toBe(5);
    expect(completePrefixLength(Buffer.from('abc'))).toBe(3);
  });
});
