/**
 * The gaussian polish's support system keeps its Cholesky factor along a path: columns join by
 * extension and leave by a rank-one update. Whatever the history, a solve must equal a fresh
 * factorization's (checked against a system that never saw the earlier supports).
 */
import { describe, expect, it } from 'vitest';
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

  it('asks for the G entries of a joining column in one batch against the whole support', () => {
    const calls: number[] = [];
    const system = new SupportSystem(entry, (f, others, count, out) => {
      calls.push(count);
      for (let t = 0; t < count; t++) out[t] = entry(f, others[t]);
    });
    solve(system, [0, 1, 2, 3, 4, 5, 6, 7], [1, 2, 3, 4, 5, 6, 7, 8]);
    calls.length = 0;
    // One column joins eight: its eight entries with them and its diagonal, in one call (a batch
    // per support column would be nine calls of one entry, each a separate pass in the design form).
    const got = solve(system, [0, 1, 2, 3, 4, 5, 6, 7, 9], [1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(calls).toEqual([9]);
    const fresh = solve(new SupportSystem(entry), [0, 1, 2, 3, 4, 5, 6, 7, 9], [1, 2, 3, 4, 5, 6, 7, 8, 9]);
    got.forEach((v, q) => expectClose(`coefficient ${q}`, v, fresh[q], 1e-10));
  });

  it('without refinement, solves the normal equations to 1e-9, a dependent column taking 0', () => {
    // Column 12 (appended) is column 1 + column 3: its pivot vanishes and its entry must be 0.
    const dependent = x[1].map((v, i) => v + x[3][i]);
    const columns = [...x, dependent];
    const g = (f: number, h: number): number => columns[f].reduce((s, v, i) => s + v * columns[h][i], 0) / n;
    const support = [0, 1, 2, 3, 12, 5, 6, 7, 8, 9, 10];
    const rhs = support.map((f) => Math.sin(f + 1));
    const out = new Float64Array(support.length);
    expect(new SupportSystem(g).solve(support, support.map(() => 0), Float64Array.from(rhs), out, false)).toBe(true);
    expect(out[4]).toBe(0);
    // The other columns solve their own system: G_AA b = rhs (Gaussian elimination with partial pivoting).
    const rest = support.filter((f) => f !== 12);
    const m = rest.length;
    const a = rest.map((f) => [...rest.map((h) => g(f, h)), rhs[support.indexOf(f)]]);
    for (let c = 0; c < m; c++) {
      let best = c;
      for (let r = c + 1; r < m; r++) if (Math.abs(a[r][c]) > Math.abs(a[best][c])) best = r;
      [a[c], a[best]] = [a[best], a[c]];
      for (let r = c + 1; r < m; r++) {
        const f = a[r][c] / a[c][c];
        for (let k = c; k <= m; k++) a[r][k] -= f * a[c][k];
      }
    }
    const b = new Array<number>(m).fill(0);
    for (let r = m - 1; r >= 0; r--) {
      let s = a[r][m];
      for (let k = r + 1; k < m; k++) s -= a[r][k] * b[k];
      b[r] = s / a[r][r];
    }
    rest.forEach((f, q) => expectClose(`column ${f}`, out[support.indexOf(f)], b[q], 1e-9));
  });
});
