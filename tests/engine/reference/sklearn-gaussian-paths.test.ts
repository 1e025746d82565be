/**
 * Lasso and elastic-net paths (gaussian) against scikit-learn's ElasticNet, coordinate descent run to
 * a KKT residual near 1e-12. Source: datasets/reference/sklearn/gaussian-paths.json, written by
 * generate.py beside it (scikit-learn and numpy versions and each exact call are in the fixture).
 * Data: the diabetes data of Efron, Hastie, Johnstone & Tibshirani (2004) from datasets/open, and a
 * seeded generated set (n = 200, p = 30, correlated columns on mixed scales) stored in the fixture.
 * Standardized cases: scikit-learn saw X centred and divided by its population sd, so its
 * coefficients are Lariat's standardized-scale ones; the original-scale values were back-transformed
 * in the generator. Raw cases: Lariat standardize = false against scikit-learn on raw X.
 * Coefficients (both scales) and intercepts must agree within 1e-6 * max(1, |b|) for lasso and
 * elastic net; elastic-net ones also within the radius a duality gap of 1e-10 guarantees
 * (path-checks.ts), and for both the objective at Lariat's solution may exceed scikit-learn's by at
 * most the gap.
 */
import { describe, expect, it } from 'vitest';
import { computeLambdaMax, fitPathOnDesign } from '../../../server/engine';
import type { DesignMatrix, PathOptions, PathResult } from '../../../server/engine/types';
import { designFrom, designFromRows, readJson, readNumericCsv } from './helpers';
import { expectClose } from '../../support/numbers';
import { compareObjective, comparePath, elasticNetAllowance, strictAllowance, summary, type PathCase } from './path-checks';

interface GaussianCase extends PathCase {
  dataset: 'diabetes' | 'generated';
  columnMean?: number[];
  columnSd?: number[];
}

interface GaussianFixture {
  source: string;
  versions: { sklearn: string; numpy: string };
  datasets: {
    diabetes: { file: string; sha256: string; response: string; terms: string[] };
    generated: { terms: string[]; x: number[][]; y: number[] };
  };
  cases: GaussianCase[];
}

const TOLERANCE = 1e-10;
const fixture = readJson<GaussianFixture>('datasets/reference/sklearn/gaussian-paths.json');
const diabetesCsv = readNumericCsv(fixture.datasets.diabetes.file);
const data: Record<GaussianCase['dataset'], { design: DesignMatrix; y: Float64Array }> = {
  diabetes: {
    design: designFrom(diabetesCsv.columns, fixture.datasets.diabetes.terms),
    y: Float64Array.from(diabetesCsv.columns[fixture.datasets.diabetes.response]),
  },
  generated: {
    design: designFromRows(fixture.datasets.generated.x, fixture.datasets.generated.terms),
    y: Float64Array.from(fixture.datasets.generated.y),
  },
};

/** Lariat's gaussian objective on the scale scikit-learn saw (standardized X when standardized). */
function objective(design: DesignMatrix, y: Float64Array, c: GaussianCase, b0: number, b: Float64Array, k: number): number {
  const { n, p, x } = design;
  let rss = 0;
  for (let i = 0; i < n; i++) {
    let eta = b0;
    for (let j = 0; j < p; j++) {
      const v = c.standardize ? (x[j * n + i] - c.columnMean![j]) / c.columnSd![j] : x[j * n + i];
      eta += v * b[j];
    }
    rss += (y[i] - eta) ** 2;
  }
  let l1 = 0;
  let l2 = 0;
  for (let j = 0; j < p; j++) {
    l1 += Math.abs(b[j]);
    l2 += b[j] * b[j];
  }
  return rss / (2 * n) + c.lambda[k] * (c.alpha * l1 + ((1 - c.alpha) / 2) * l2);
}

/** max_i ||x_i|| on the scale scikit-learn saw (for the elastic-net intercept allowance). */
function maxRowNorm(design: DesignMatrix, c: GaussianCase): number {
  const { n, p, x } = design;
  let max = 0;
  for (let i = 0; i < n; i++) {
    let ss = 0;
    for (let j = 0; j < p; j++) ss += (c.standardize ? (x[j * n + i] - c.columnMean![j]) / c.columnSd![j] : x[j * n + i]) ** 2;
    max = Math.max(max, Math.sqrt(ss));
  }
  return max;
}

function nullObjective(y: Float64Array): number {
  const mean = y.reduce((s, v) => s + v, 0) / y.length;
  return y.reduce((s, v) => s + (v - mean) ** 2, 0) / (2 * y.length);
}

describe(`gaussian paths match ${fixture.source}`, () => {
  it('reads the diabetes data the fixture was made from', () => {
    expect(diabetesCsv.sha256).toBe(fixture.datasets.diabetes.sha256);
  });

  for (const c of fixture.cases) {
    const { design, y } = data[c.dataset];
    const options: PathOptions = {
      family: 'gaussian',
      penalty: c.penalty,
      ...(c.penalty === 'elastic-net' ? { l1Share: c.alpha } : {}),
      standardize: c.standardize,
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
      const result: PathResult = fitPathOnDesign(design, y, options);
      const scale = c.standardize ? { mean: c.columnMean!, sd: c.columnSd! } : null;
      const problems = comparePath(result, c, scale, TOLERANCE, strictAllowance());
      if (c.penalty === 'elastic-net') {
        problems.push(...comparePath(result, c, scale, TOLERANCE, elasticNetAllowance(c, TOLERANCE, nullObjective(y), maxRowNorm(design, c))));
      }
      problems.push(
        ...compareObjective(
          (k) => objective(design, y, c, result.standardizedIntercept[k], result.standardizedCoefficients[k], k),
          c,
          nullObjective(y),
          TOLERANCE,
        ),
      );
      expect(problems, summary(c.id, call, problems)).toEqual([]);
    });
  }
});
