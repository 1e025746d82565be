/**
 * What each family asks of the response, kept beside the loss registry (index.ts) so the path's
 * set-up (path/setup.ts) has no family branches: which values are allowed, whether the loss works on
 * the centred response (and so has the closed-form intercept and c = X'yc/n), and when the response
 * leaves nothing to fit. A new family adds one entry here with its loss file
 * (docs/decisions/0013-loss-role.md).
 */
import { EngineInputError, type Family } from '../../types';

export interface ResponseRules {
  /**
   * The message for a numeric value the family cannot take (row is 1-based; the column's name when
   * the caller has it), or null when it is allowed.
   */
  invalid(value: number, row: number, name?: string): string | null;
  /** Whether a categorical response is taken (binomial: exactly two levels, mapped to 0/1). */
  categorical: boolean;
  /**
   * True when the loss works on y - mean(y) (gaussian: the intercept is mean(y) - centers'b in
   * closed form and c = X'yc/n is the gradient at zero); false when it keeps y and fits its own
   * intercept (binomial).
   */
  centred: boolean;
  /** Throws when the response leaves nothing to fit (mean and sum of squares about it given). */
  checkSpread(mean: number, squares: number): void;
}

const named = (family: string, name?: string) => `${family} response${name === undefined ? '' : ` "${name}"`}`;

const gaussian: ResponseRules = {
  invalid: () => null,
  categorical: false,
  centred: true,
  checkSpread(_mean, squares) {
    if (squares === 0) throw new EngineInputError('the response is constant: there is nothing to fit', 'response');
  },
};

const binomial: ResponseRules = {
  invalid: (value, row, name) => (value !== 0 && value !== 1 ? `${named('binomial', name)} must be 0 or 1; row ${row} has ${value}` : null),
  categorical: true,
  centred: false,
  checkSpread(mean) {
    if (mean === 0 || mean === 1) {
      throw new EngineInputError(`the binomial response has only ${mean === 0 ? 0 : 1}s: both classes are needed`, 'response');
    }
  },
};

export const RESPONSE_RULES: Record<Family, ResponseRules> = { gaussian, binomial };
