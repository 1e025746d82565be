/** Relative comparison tol * max(1, |a|, |b|) (STYLE.md 12), with a message naming everything. */
import { expect } from 'vitest';

export function expectClose(got: number, expected: number, tol: number, what: string): void {
  const bound = tol * Math.max(1, Math.abs(got), Math.abs(expected));
  const ok = Math.abs(got - expected) <= bound;
  expect(ok, `${what}: expected ${expected}, got ${got}, tolerance ${bound}`).toBe(true);
}
