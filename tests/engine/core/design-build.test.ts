/**
 * buildDesign writes each column straight into the design and reads unfiltered columns directly;
 * it must give exactly what the plain column-by-column build gives (design-reference.ts): the same
 * bits in the design and the response, the same rows, terms, groups, notes, encoding and errors.
 * Random tables cover missing cells under both policies, constant and nearly constant columns, 0 and
 * -0, categoricals with levels absent from the rows used, row subsets and both families.
 */
import { describe, expect, it } from 'vitest';
import { buildDesign } from '../../../server/engine/design/build';
import { createRng, type Rng } from '../../../server/engine/random';
import type { EngineColumn, EngineTable } from '../../../server/engine/types';
import { referenceBuildDesign } from './design-reference';

function randomNumeric(rng: Rng, name: string, n: number): EngineColumn {
  const kind = rng.int(5);
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (kind === 0) values[i] = 3; // constant
    else if (kind === 1) values[i] = [0, -0][rng.int(2)]; // constant up to the sign of zero
    else if (kind === 2) values[i] = rng.int(3) - 1; // few distinct values
    else values[i] = rng.normal() * 10 ** (rng.int(7) - 3);
    if (rng.int(8) === 0) values[i] = Number.NaN;
  }
  return { name, kind: 'numeric', values };
}

function randomCategorical(rng: Rng, name: string, n: number): EngineColumn {
  const levels = ['a', 'b', 'c', 'd'].slice(0, 1 + rng.int(4));
  const codes = new Int32Array(n);
  // Some levels only on a few rows, so a row subset may miss them (a constant indicator).
  for (let i = 0; i < n; i++) codes[i] = rng.int(10) === 0 ? -1 : rng.int(3) === 0 ? rng.int(levels.length) : 0;
  return { name, kind: 'categorical', codes, levels };
}

/** Bits, not values: 0 and -0 differ, NaN equals NaN. */
const bits = (a: Float64Array) => Array.from(new Uint32Array(a.buffer, a.byteOffset, a.length * 2));

function outcome(build: () => unknown) {
  try {
    return build();
  } catch (error) {
    return { error: (error as Error).message };
  }
}

describe('buildDesign matches the plain column-by-column build to the bit', () => {
  it('on random tables, both missing policies, both families, with and without row subsets', () => {
    const rng = createRng(9);
    let compared = 0;
    let built = 0;
    for (let t = 0; t < 400; t++) {
      const n = 2 + rng.int(40);
      const columns: EngineColumn[] = [];
      const y = randomNumeric(rng, 'y', n);
      if (y.kind === 'numeric' && rng.int(2) === 0) for (let i = 0; i < n; i++) if (!Number.isNaN(y.values[i])) y.values[i] = rng.int(2);
      columns.push(y);
      const p = 1 + rng.int(6);
      for (let j = 0; j < p; j++) columns.push(rng.int(3) === 0 ? randomCategorical(rng, `c${j}`, n) : randomNumeric(rng, `x${j}`, n));
      const table: EngineTable = { nRows: n, columns };
      const spec = {
        family: rng.int(3) === 0 ? ('binomial' as const) : ('gaussian' as const),
        response: 'y',
        predictors: columns.slice(1).map((c) => c.name),
        missing: rng.int(2) === 0 ? ('drop' as const) : ('impute' as const),
      };
      const subsets: (Int32Array | undefined)[] = [undefined, Int32Array.from({ length: n }, (_, i) => i)];
      subsets.push(Int32Array.from({ length: n }, (_, i) => i).filter(() => rng.int(3) > 0));
      subsets.push(Int32Array.from({ length: n }, (_, i) => n - 1 - i));
      for (const rows of subsets) {
        // Every other table in shared memory (for worker threads): the same numbers.
        const shared = t % 2 === 1;
        const fast = outcome(() => buildDesign(table, spec, rows, shared)) as ReturnType<typeof buildDesign> | { error: string };
        const reference = outcome(() => referenceBuildDesign(table, spec, rows)) as ReturnType<typeof referenceBuildDesign> | { error: string };
        compared++;
        if ('error' in reference || 'error' in fast) {
          expect(fast, `table ${t}`).toEqual(reference);
          continue;
        }
        built++;
        const where = `table ${t}, ${spec.missing}, rows ${rows ? Array.from(rows).join(' ') : 'all'}`;
        // A design cut to fewer columns (constant ones left out) is a plain copy; otherwise the memory asked for.
        if (fast.design.x.length === fast.design.n * (table.columns.length - 1) && !table.columns.some((c) => c.kind === 'categorical')) {
          expect(fast.design.x.buffer instanceof SharedArrayBuffer, `${where}: shared memory`).toBe(shared);
        }
        expect(bits(fast.design.x), where).toEqual(bits(reference.design.x));
        expect(bits(fast.y), where).toEqual(bits(reference.y));
        expect({ ...fast, design: { ...fast.design, x: null }, y: null }, where).toEqual({ ...reference, design: { ...reference.design, x: null }, y: null });
      }
    }
    // Most tables build (the comparison is not only of error messages).
    expect(built).toBeGreaterThan(compared / 2);
  });
});
