/**
 * L1 and elastic-net logistic paths against scikit-learn's LogisticRegression(solver='saga') on the
 * breast cancer data (Street, Wolberg & Mangasarian 1993) from datasets/open, all 30 columns.
 * scikit-learn saw X centred and divided by its population sd (saga converges slowly on raw
 * columns), C = 1/(lambda n), tol 1e-12, random_state 0; the fixture records each fit's iterations
 * and KKT residual (about 1e-12). Lariat fits the raw columns with standardize = true, so its
 * standardized-scale coefficients are compared with scikit-learn's and its original-scale ones with
 * the generator's back-transform. Source: datasets/reference/sklearn/logistic-paths.json (generate.py).
 * Coefficients (both scales) and intercepts must agree within 1e-6 * max(1, |b|) for lasso and
 * elastic net; elastic-net ones also within the radius a duality gap of 1e-10 guarantees
 * (path-checks.ts); the objective may exceed scikit-learn's by the gap.
 */
import { describe, expect, it } from 'vitest';
import { computeLambdaMax, fitPathOnDesign } from '../../../server/engine';
import type { DesignMatrix, PathOptions } from '../../../server/engine/types';
import { designFrom, readJson, readNumericCsv } from './helpers';
import { expectClose } from '../../support/numbers';
import { compareObjective, comparePath, elasticNetAllowance, strictAllowance, summary, type PathCase } from './path-checks';

interface LogisticFixture {
  source: string;
  versions: { sklearn: string; numpy: string };
  dataset: { file: string; sha256: string; response: string; terms: string[]; columnMean: number[]; columnSd: number[] };
  cases: PathCase[];
}

const TOLERANCE = 1e-10;
const fixture = readJson<LogisticFixture>('datasets/reference/sklearn/logistic-paths.json');
const csv = readNumericCsv(fixture.dataset.file);
const design = designFrom(csv.columns, fixture.dataset.terms);
const y = Float64Array.from(csv.columns[fixture.dataset.response]);
const scale = { mean: fixture.dataset.columnMean, sd: fixture.dataset.columnSd };

/** Lariat's binomial objective on standardized X: mean log-loss plus the penalty. */
function objective(x: DesignMatrix, c: PathCase, b0: number, b: Float64Array, k: number): number {
  const { n, p } = x;
  let loss = 0;
  for (let i = 0; i < n; i++) {
    let eta = b0;
    for (let j = 0; j < p; j++) eta += ((x.x[j * n + i] - scale.mean[j]) / scale.sd[j]) * b[j];
    loss += Math.max(eta, 0) + Math.log1p(Math.exp(-Math.abs(eta))) - y[i] * eta;
  }
  let l1 = 0;
  let l2 = 0;
  for (let j = 0; j < p; j++) {
    l1 += Math.abs(b[j]);
    l2 += b[j] * b[j];
  }
  return loss / n + c.lambda[k] * (c.alpha * l1 + ((1 - c.alpha) / 2) * l2);
}

/** max_i ||x_i|| on standardized X (for the elastic-net intercept allowance). */
function maxRowNorm(): number {
  const { n, p, x } = design;
  let max = 0;
  for (let i = 0; i < n; i++) {
    let ss = 0;
    for (let j = 0; j < p; j++) ss += ((x[j * n + i] - scale.mean[j]) / scale.sd[j]) ** 2;
    max = Math.max(max, Math.sqrt(ss));
  }
  return max;
}

/** Null model: intercept log(m / (1 - m)), m the share of 1s; objective the binary entropy. */
function nullObjective(): number {
  const m = y.reduce((s, v) => s + v, 0) / y.length;
  return -(m * Math.log(m) + (1 - m) * Math.log(1 - m));
}

describe(`logistic paths match ${fixture.source}`, () => {
  it('reads the breast cancer data the fixture was made from', () => {
    expect(csv.sha256).toBe(fixture.dataset.sha256);
  });

  for (const c of fixture.cases) {
    const options: PathOptions = {
      family: 'binomial',
      penalty: c.penalty,
      ...(c.penalty === 'elastic-net' ? { l1Share: c.alpha } : {}),
      standardize: true,
      lambda: c.lambda,
      tolerance: TOLERANCE,
      maxIterations: 200_000,
    };
    const call = `scikit-learn ${fixture.versions.sklearn} ${c.call} on ${c.sklearnInput}`;

    it(`${c.id}: lambda_max is the first lambda of the fixture (numpy max |X'(y - mean y)| / (n alpha))`, () => {
      expectClose(`${c.id} lambda_max`, computeLambdaMax(design, y, options), c.lambda[0], 1e-12);
    });

    const within = c.penalty === 'lasso' ? '1e-6' : '1e-6 and the strong-convexity radius of the gap';
    it(`${c.id}: coefficients within ${within} at every lambda, gap <= ${TOLERANCE}`, () => {
      const result = fitPathOnDesign(design, y, options);
      const problems = comparePath(result, c, scale, TOLERANCE, strictAllowance());
      if (c.penalty === 'elastic-net') {
        problems.push(...comparePath(result, c, scale, TOLERANCE, elasticNetAllowance(c, TOLERANCE, nullObjective(), maxRowNorm())));
      }
      problems.push(
        ...compareObjective(
          (k) => objective(design, c, result.standardizedIntercept[k], result.standardizedCoefficients[k], k),
          c,
          nullObjective(),
          TOLERANCE,
        ),
      );
      expect(problems, summary(c.id, call, problems)).toEqual([]);
    });
  }
});
