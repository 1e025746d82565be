/**
 * fista's SolverOptions.polishFirst (set for losses whose solves end at the polish, LossRole
 * polishFirst: binomial): the polish runs on the warm start before any gap; a polished point that
 * meets the tolerance ends the solve without the warm start's gap, and one that misses it is compared
 * with the warm start, the better of the two kept. A one-variable quadratic
 * f(w) = (w - 1)^2 / 2 (no penalty) whose "gap" is f(w) itself makes the order of the gap
 * evaluations visible.
 */
import { describe, expect, it } from 'vitest';
import { fista, type PolishOutcome, type SolverRoles } from '../../../server/engine/core/fista';
import type { BoundLoss } from '../../../server/engine/core/loss';

function roles(polishTo: number, seen: number[]): SolverRoles {
  const loss: BoundLoss = {
    imageSize: 1,
    image: (w, out) => {
      out[0] = w[0];
    },
    value: (img) => 0.5 * (img[0] - 1) ** 2,
    gradient: (img, _w, out) => {
      out[0] = img[0] - 1;
    },
    lipschitz: () => 1,
    residual: () => ({ ycTheta: 0, theta: null }),
  };
  return {
    size: 1,
    loss,
    prox: (z, out) => out.set(z),
    gap: (w) => {
      seen.push(w[0]);
      return 0.5 * (w[0] - 1) ** 2;
    },
    polish: (_w, out): PolishOutcome => {
      out[0] = polishTo;
      return { ok: true, steps: 1 };
    },
  };
}

const options = (polishFirst: boolean) => ({ tolerance: 1e-12, maxIterations: 100, checkEvery: 1, lipschitz: 1, polishFirst });

describe('fista with polishFirst', () => {
  it('ends at a polished point that meets the tolerance without computing the warm start\'s gap', () => {
    const seen: number[] = [];
    const w = Float64Array.of(0.5);
    const outcome = fista(roles(1, seen), w, options(true));
    expect(outcome.status).toBe('converged');
    expect(outcome.stoppedBy).toBe('polish');
    expect(w[0]).toBe(1);
    expect(seen, 'points whose gap was computed').toEqual([1]);
    // Without the option the warm start's gap comes first (the order the gaussian losses keep).
    const before: number[] = [];
    fista(roles(1, before), Float64Array.of(0.5), options(false));
    expect(before).toEqual([0.5, 1]);
  });

  it('keeps the warm start when the polished point is worse, and goes on from it', () => {
    const seen: number[] = [];
    const w = Float64Array.of(0.5);
    // The "polish" lands at 4 (gap 4.5), worse than the warm start 0.5 (gap 0.125). With the
    // Lipschitz estimate 2 (step 1/2) the first FISTA iterate from 0.5 is 0.75 (from 4 it would be 2.5).
    const outcome = fista(roles(4, seen), w, { ...options(true), lipschitz: 2 });
    expect(seen.slice(0, 3), 'the polished point, the warm start, then the first iterate from the warm start').toEqual([4, 0.5, 0.75]);
    expect(outcome.status).toBe('converged');
    expect(Math.abs(w[0] - 1)).toBeLessThan(1e-5);
  });
});
