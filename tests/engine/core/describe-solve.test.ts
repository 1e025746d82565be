/** The solver certificate's stopping sentence reads as plain English (one iteration, not "1 iterations"). */
import { describe, expect, it } from 'vitest';
import { describeSolve } from '../../../server/engine/path/solveAtLambda';

describe('stopping sentence', () => {
  it('counts iterations in the singular and the plural', () => {
    expect(describeSolve('converged', 1e-8, 1e-6, 1, 'gap')).toMatch(/ after 1 iteration$/);
    expect(describeSolve('converged', 1e-8, 1e-6, 12, 'gap')).toMatch(/ after 12 iterations$/);
    expect(describeSolve('numerical-failure', Number.NaN, 1e-6, 1, 'numerical-failure')).toMatch(/ after 1 iteration$/);
  });
});
