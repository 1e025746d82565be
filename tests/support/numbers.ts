/**
 * Number comparisons for every test (STYLE.md 12): one place, one argument order
 * (label, got, expected, tolerance).
 */
import { expect } from 'vitest';

/** |got - expected| <= tol * max(1, |got|, |expected|), with a message that shows all. */
export function expectClose(label: string, got: number, expected: number, tol: number): void {
  const bound = tol * Math.max(1, Math.abs(got), Math.abs(expected));
  const ok = Number.isFinite(got) && Math.abs(got - expected) <= bound;
  expect(ok, `${label}: expected ${expected}, got ${got}, |diff| ${Math.abs(got - expected)} > tolerance ${bound}`).toBe(true);
}

/**
 * NIST's log relative error: at least `digits` correct significant digits means
 * |got - certified| <= 10^-digits |certified|; a certified 0 asks |got| <= 10^-digits (absolute).
 */
export function expectDigits(label: string, got: number | null, certified: number, digits: number): void {
  const bound = certified === 0 ? 10 ** -digits : 10 ** -digits * Math.abs(certified);
  const ok = got !== null && Number.isFinite(got) && Math.abs(got - certified) <= bound;
  expect(ok, `${label}: certified ${certified}, got ${got}, needs ${digits} digits (|diff| <= ${bound})`).toBe(true);
}
