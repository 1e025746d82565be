/**
 * The gaussian polish's support system keeps its Cholesky factor along a path: columns join by
 * extension and leave by a rank-one update. Whatever the history, a solve must equal a fresh
 * factorization's (checked against a system that never saw the earlier supports).
 */
import { describe, it } from 'vitest';
import { SupportSystem } from '../../../server/engine/core/supportSystem';
import { createRng } from '../../../server/engine/random';
import { expectClose } from '../../support/numbers';

const n = 60;
const p = 12;
const rng = createRng(7);
// Correlated columns on very different scales (the Jacobi scaling must cope).
const x = Array.from({ length: p }, (_, j) => {
  const base = Array.from({ length: n }, () => rng.normal());
  return base.map((v, i) => 10 ** ((j % 4) - 1) * (v + 0.6 * (j > 0 ? Math.sin(i + j) : 0)));
});
const entry = (f: number, g: number): number => x[f].reduce((s, v, i) => s + v * x[g][i], 0) / n;

function solve(system: SupportSystem, features: number[], rhs: number[]): Float64Array {
  const out = new Float64Array(features.length);
  if (!system.solve(features, features.map(() => 0), Float64Array.from(rhs), out)) throw new Error('solve failed');
  return out;
}

describe('SupportSystem', () => {
  it('after columns leave (first, middle, last) and join, solves as a fresh factorization does', () => {
    const kept = new SupportSystem(entry);
    const supports = [
      [0, 1, 2, 3, 4, 5, 6, 7],
      [1, 2, 3, 4, 5, 6, 7], // the first column leaves
      [1, 2, 4, 5, 6, 7, 9], // a middle one leaves, another joins
      [1, 2, 4, 5, 6], // the last two leave
      [2, 4, 6, 8, 10, 11, 1],
    ];
    for (const support of supports) {
      const rhs = support.map((f) => Math.cos(f));
      const got = solve(kept, support, rhs);
      const fresh = solve(new SupportSystem(entry), support, rhs);
      support.forEach((f, q) => expectClose(`support [${support}] coefficient of column ${f}`, got[q], fresh[q], 1e-10));
    }
  });
});
