/**
 * One cell of a quote-free CSV line, read from its bytes without making a string. A cell that is a
 * plain decimal (the DECIMAL_TRIMMED grammar of server/datasets/parse/missing.ts, spaces around it) with at most 15
 * significant digits and a power of ten up to 22 is converted by Clinger's exact fast path
 * (W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990: a mantissa below
 * 2^53 times or divided by an exactly representable power of ten is correctly rounded in one
 * operation), so the value equals Number(text). Anything else is left to the caller (value NaN).
 */
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);
const NEWLINE = 10;
const CR = 13;
const SPACE = 32;

/** The last scanned cell; reused so the hot loop allocates nothing. */
export const scanned = {
  /** Index of the delimiter or newline that ends the cell (or the end of the bytes). */
  end: 0,
  /** The number, or NaN when the cell is not a simple decimal. */
  value: 0,
  /** Length of the number's text without the blanks around it. */
  length: 0,
};

/** Moves to the end of a cell that is not a number. */
function skipCell(bytes: Uint8Array, i: number, delimiter: number): void {
  const n = bytes.length;
  while (i < n && bytes[i] !== delimiter && bytes[i] !== NEWLINE) i++;
  scanned.end = i;
  scanned.value = Number.NaN;
}

/** Scans the cell starting at `start`; see `scanned` for the results. A CR before the newline counts as a blank. */
export function scanCell(bytes: Uint8Array, start: number, delimiter: number): void {
  const n = bytes.length;
  let i = start;
  let c = i < n ? bytes[i] : NEWLINE;
  while (c === SPACE) c = ++i < n ? bytes[i] : NEWLINE;
  const first = i;
  let sign = 1;
  if (c === 43 || c === 45) {
    if (c === 45) sign = -1;
    c = ++i < n ? bytes[i] : NEWLINE;
  }
  let mantissa = 0;
  let digits = 0;
  let exponent = 0;
  let sawDigit = false;
  let exact = true;
  for (; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE) {
    sawDigit = true;
    if (mantissa === 0 && c === 48) continue; // leading zeros
    if (digits === 15) exact = false;
    else {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
    }
  }
  if (c === 46) {
    for (c = ++i < n ? bytes[i] : NEWLINE; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE) {
      sawDigit = true;
      if (mantissa === 0 && c === 48) exponent--;
      else if (digits === 15) exact = false;
      else {
        mantissa = mantissa * 10 + (c - 48);
        digits++;
        exponent--;
      }
    }
  }
  if (!sawDigit) return skipCell(bytes, i, delimiter);
  if (c === 101 || c === 69) {
    c = ++i < n ? bytes[i] : NEWLINE;
    let expSign = 1;
    if (c === 43 || c === 45) {
      if (c === 45) expSign = -1;
      c = ++i < n ? bytes[i] : NEWLINE;
    }
    let e = 0;
    let expDigits = 0;
    for (; c >= 48 && c <= 57; c = ++i < n ? bytes[i] : NEWLINE, expDigits++) e = e * 10 + (c - 48);
    if (expDigits === 0) return skipCell(bytes, i, delimiter);
    if (expDigits > 4) exact = false;
    exponent += expSign * e;
  }
  const last = i;
  while (c === SPACE || c === CR) c = ++i < n ? bytes[i] : NEWLINE;
  if (c !== delimiter && c !== NEWLINE) return skipCell(bytes, i, delimiter);
  scanned.end = i;
  scanned.length = last - first;
  if (!exact) scanned.value = Number.NaN;
  else if (mantissa === 0) scanned.value = sign * 0;
  else if (exponent >= 0 && exponent <= 22) scanned.value = sign * mantissa * POW10[exponent];
  else if (exponent < 0 && exponent >= -22) scanned.value = (sign * mantissa) / POW10[-exponent];
  else scanned.value = Number.NaN;
}
