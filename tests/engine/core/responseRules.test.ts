/**
 * The response rules registry (core/loss/responses.ts): each family's allowed values, centring and
 * "nothing to fit" checks live there, so the path's set-up and the solver have no family branches
 * (docs/decisions/0013-loss-role.md: a new family is one loss file and registrations).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { RESPONSE_RULES } from '../../../server/engine/core/loss';
import { fitPathOnDesign } from '../../../server/engine';
import type { DesignMatrix } from '../../../server/engine/types';

const design: DesignMatrix = { n: 4, p: 1, x: Float64Array.from([1, 2, 3, 5]), terms: ['a'] };

describe('response rules', () => {
  it('gaussian takes any finite value, centres, and refuses a constant response', () => {
    expect(RESPONSE_RULES.gaussian.invalid(-3.5, 1)).toBeNull();
    expect(RESPONSE_RULES.gaussian.centred).toBe(true);
    expect(RESPONSE_RULES.gaussian.categorical).toBe(false);
    expect(() => RESPONSE_RULES.gaussian.checkSpread(2, 0)).toThrow(/constant/);
    expect(() => RESPONSE_RULES.gaussian.checkSpread(2, 1e-30)).not.toThrow();
  });

  it('binomial takes 0 and 1 only, keeps y, and needs both classes', () => {
    expect(RESPONSE_RULES.binomial.invalid(1, 3)).toBeNull();
    expect(RESPONSE_RULES.binomial.invalid(0, 3)).toBeNull();
    expect(RESPONSE_RULES.binomial.invalid(2, 3, 'won')).toBe('binomial response "won" must be 0 or 1; row 3 has 2');
    expect(RESPONSE_RULES.binomial.centred).toBe(false);
    expect(() => RESPONSE_RULES.binomial.checkSpread(1, 0)).toThrow(/only 1s/);
    expect(() => RESPONSE_RULES.binomial.checkSpread(0.5, 1)).not.toThrow();
  });

  it('the path set-up applies them: the message names the row', () => {
    const opts = { family: 'binomial', penalty: 'lasso', standardize: true } as const;
    expect(() => fitPathOnDesign(design, Float64Array.from([0, 1, 2, 1]), opts)).toThrow('binomial response must be 0 or 1; row 3 has 2');
    expect(() => fitPathOnDesign(design, Float64Array.from([1, 1, 1, 1]), opts)).toThrow(/both classes/);
    expect(() => fitPathOnDesign(design, Float64Array.from([4, 4, 4, 4]), { ...opts, family: 'gaussian' })).toThrow(/constant/);
  });

  it('no family branches in the path set-up, the solver core or the design encoding', () => {
    const root = join(__dirname, '../../../server/engine');
    const files = ['path', 'core', 'design'].flatMap((dir) =>
      readdirSync(join(root, dir), { recursive: true, encoding: 'utf8' })
        .filter((f) => f.endsWith('.ts'))
        .map((f) => join(dir, f)),
    );
    expect(files.length).toBeGreaterThan(20);
    // The lambda = 0 note names the method used (QR or Newton/IRLS): a message, not a branch of the solve.
    const allowed = new Set(['path/atZero.ts']);
    const branching = files.filter((f) => !allowed.has(f) && /family\s*[!=]==/.test(readFileSync(join(root, f), 'utf8')));
    expect(branching).toEqual([]);
  });
});
