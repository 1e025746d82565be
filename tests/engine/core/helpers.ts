import { expect } from 'vitest';

/** Relative comparison tol * max(1, |a|, |b|) with a message naming input, expected, got, tolerance. */
export function expectClose(got: number, expected: number, tol: number, what: string): void {
  const bound = tol * Math.max(1, Math.abs(got), Math.abs(expected));
  const ok = Math.abs(got - expected) <= bound;
  expect(ok, `${what}: expected ${expected}, got ${got}, tolerance ${tol} (relative)`).toBe(true);
}
