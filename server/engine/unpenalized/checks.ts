import { EngineInputError, type DesignMatrix } from '../types';

/** Rejects inputs the factorization cannot use, naming the term and row at fault. */
export function checkInputs(design: DesignMatrix, y: Float64Array): void {
  const { n, p, x, terms } = design;
  if (y.length !== n) {
    throw new EngineInputError(`The response has ${y.length} values but the design has ${n} rows.`, 'response');
  }
  if (x.length !== n * p || terms.length !== p) {
    throw new EngineInputError(`The design matrix should hold ${n} x ${p} values and ${p} term names.`, 'design');
  }
  for (let j = 0; j < p; j++) {
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(x[j * n + i])) {
        throw new EngineInputError(`Term '${terms[j]}' has a missing or non-finite value in row ${i + 1}.`, terms[j]);
      }
    }
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(y[i])) throw new EngineInputError(`The response is missing or non-finite in row ${i + 1}.`, 'response');
  }
}

/** Inference needs at least one residual degree of freedom beyond the estimated coefficients. */
export function checkDegreesOfFreedom(n: number, estimated: number): void {
  if (n - estimated < 1) {
    throw new EngineInputError(
      `The unpenalized fit needs more rows (${n}) than coefficients including the intercept (${estimated}); ` +
        'choose fewer predictors or a penalized fit.',
      'predictors',
    );
  }
}

export function aliasedMessage(names: string[]): string {
  return (
    `Terms ${names.map((t) => `'${t}'`).join(', ')} are constant or exact linear combinations of earlier ` +
    'terms (aliased); they were left out and the rest were fitted.'
  );
}

/** Binomial responses are 0/1 with both classes present (else the intercept alone is infinite). */
export function checkBinaryResponse(y: Float64Array): void {
  let ones = 0;
  for (let i = 0; i < y.length; i++) {
    if (y[i] !== 0 && y[i] !== 1) {
      throw new EngineInputError(`A binomial response must be 0 or 1; row ${i + 1} has ${y[i]}.`, 'response');
    }
    ones += y[i];
  }
  if (ones === 0 || ones === y.length) {
    throw new EngineInputError(`The binomial response has only ${ones === 0 ? 0 : 1}s; both classes are needed.`, 'response');
  }
}
