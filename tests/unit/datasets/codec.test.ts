/** Stored formats round-trip exactly, and conversions refuse values that do not fit the type. */
import { describe, expect, it } from 'vitest';
import { missingTest } from '../../../server/datasets/parse/missing';
import { bytesToFloat64, decodeText, encodeCodes, encodeFloat64, encodeText, typedBytes } from '../../../server/datasets/storage/codec';
import { loadAs } from '../../../server/datasets/storage/convert';
import { detectDelimiter, detectLineEndings } from '../../../server/datasets/parse/sniff';

const missing = missingTest(['', 'NA']);

describe('storage codec', () => {
  it('float64 bytes survive an unaligned Buffer (as pg may return)', () => {
    const bytes = typedBytes(encodeFloat64(['1.5', 'NA', '-2e-3'], missing));
    const unaligned = Buffer.concat([Buffer.from([7]), bytes]).subarray(1);
    expect(Array.from(bytesToFloat64(unaligned))).toEqual([1.5, Number.NaN, -0.002]);
  });
  it('codes sort numbers numerically, then text', () => {
    const { codes, levels } = encodeCodes(['10', 'b', '9', 'NA', 'a', '10'], missing);
    expect(levels).toEqual(['9', '10', 'a', 'b']);
    expect(Array.from(codes)).toEqual([1, 3, 0, -1, 2, 1]);
  });
  it('text keeps empty strings apart from missing when "" is not a marker', () => {
    const cells = decodeText(encodeText(['x', '', 'NA', 'a\nb'], missingTest(['NA'])));
    expect(cells).toEqual(['x', '', null, 'a\nb']);
  });
  it('binary 1/2 loads as two categories; 0/1 as numbers', () => {
    const twelve = loadAs({ name: 's', storage: 'float64', levels: null, data: typedBytes(Float64Array.from([1, 2, 2])) }, 'binary');
    expect(twelve).toMatchObject({ kind: 'categorical', levels: ['1', '2'] });
    const zeroOne = loadAs({ name: 'd', storage: 'float64', levels: null, data: typedBytes(Float64Array.from([0, 1, Number.NaN])) }, 'binary');
    expect(zeroOne.kind).toBe('numeric');
    expect(() => loadAs({ name: 't', storage: 'float64', levels: null, data: typedBytes(Float64Array.from([0, 1, 2])) }, 'binary')).toThrow(/has 3 distinct value\(s\)/);
  });
});

describe('sniffing', () => {
  it('picks the delimiter with consistent field counts', () => {
    expect(detectDelimiter('a;b;c\n1,5;2;3\n4;5,5;6\n', 'x.csv')).toBe(';');
    expect(detectDelimiter('a\tb\n1\t2\n', 'x.txt')).toBe('\t');
    expect(detectDelimiter('a|b|c\n1|2|3\n', 'x.csv')).toBe('|');
    expect(detectDelimiter('a,b\n"1,2",3\n', 'x.csv')).toBe(',');
  });
  it('line endings', () => {
    expect(detectLineEndings('a,b\r\n1,2\r\n')).toBe('CRLF');
    expect(detectLineEndings('a,b\n')).toBe('LF');
  });
});
