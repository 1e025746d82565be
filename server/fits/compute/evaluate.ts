/**
 * What depends on the chosen lambda and needs the data (runs on an engine thread): the unpenalized
 * refit on the kept terms with its standard errors, the diagnostics (on the holdout rows when a
 * holdout was set aside, else on the rows fitted), and the holdout metrics.
 */
import {
  CALIBRATION_BINS,
  DIAGNOSTIC_SAMPLE,
  ROC_POINTS,
  type BinomialDiagnosticsDto,
  type FitSpec,
  type GaussianDiagnosticsDto,
  type HoldoutMetricsDto,
  type RefitDto,
} from '../../../shared/fits';
import {
  areaUnderRoc,
  encodeForFit,
  EngineInputError,
  meanAbsoluteError,
  meanBinomialDeviance,
  meanSquaredError,
  misclassificationRate,
  refitSelected,
  type DesignEncoding,
  type EngineTable,
} from '../../engine/index';
import type { StoredEvaluation } from '../stored-types';
import { engineSpec } from '../engine-spec';
import { predictRowsWithErrors } from './predict-rows';

export interface EvaluateInput {
  train: EngineTable;
  holdout: EngineTable | null;
  spec: FitSpec;
  terms: string[];
  encoding: DesignEncoding;
  intercept: number;
  coefficients: Float64Array;
}

export function evaluateAt(input: EvaluateInput): StoredEvaluation {
  const { spec } = input;
  const prepared = encodeForFit(input.train, engineSpec(spec));
  const { design, y } = prepared.built;
  const refit = refitOn(design, y, spec, input);
  let rows: 'fitted' | 'holdout' = 'fitted';
  let yEval: Float64Array;
  let eta: Float64Array;
  let holdout: HoldoutMetricsDto | null = null;
  if (input.holdout) {
    rows = 'holdout';
    ({ y: yEval, eta } = holdoutRows(input.holdout, input));
    holdout = holdoutMetrics(spec.family, yEval, eta);
  } else {
    yEval = y;
    eta = new Float64Array(design.n).fill(input.intercept);
    const b = input.coefficients;
    for (let j = 0; j < design.p; j++) {
      if (b[j] === 0) continue;
      const col = design.x.subarray(j * design.n, (j + 1) * design.n);
      for (let i = 0; i < design.n; i++) eta[i] += b[j] * col[i];
    }
  }
  const diagnostics =
    spec.family === 'gaussian'
      ? gaussianDiagnostics(yEval, eta, rows)
      : binomialDiagnostics(yEval, eta, rows, input.encoding.responseLevels ?? null);
  return { refit, diagnostics, holdout };
}

function refitOn(design: Parameters<typeof refitSelected>[0], y: Float64Array, spec: FitSpec, input: EvaluateInput): RefitDto | null {
  const selected = input.terms.filter((_, j) => input.coefficients[j] !== 0);
  if (selected.length === 0) return null;
  try {
    const r = refitSelected(design, y, spec.family, selected);
    return {
      status: r.status,
      message: r.message,
      intercept: r.intercept,
      coefficients: r.coefficients,
      aliased: r.aliased,
      statisticKind: r.statisticKind,
      residualDf: r.residualDf,
      caution: r.caution ?? '',
    };
  } catch (error) {
    if (error instanceof EngineInputError) {
      return {
        status: 'numerical-failure',
        message: error.message,
        intercept: { term: '(intercept)', estimate: Number.NaN, standardError: null, statistic: null, pValue: null },
        coefficients: [],
        aliased: [],
        statisticKind: spec.family === 'gaussian' ? 't' : 'z',
        residualDf: 0,
        caution: '',
      };
    }
    throw error;
  }
}

/** The holdout's outcome (0/1 for binomial, by the fit's response levels) and linear predictor, rows without errors. */
function holdoutRows(table: EngineTable, input: EvaluateInput): { y: Float64Array; eta: Float64Array } {
  const predicted = predictRowsWithErrors(table, { family: input.spec.family, encoding: input.encoding, intercept: input.intercept, coefficients: input.coefficients });
  const outcome = table.columns.find((c) => c.name === input.spec.outcome);
  if (!outcome) throw new EngineInputError(`the holdout has no outcome column "${input.spec.outcome}"`, 'outcome');
  const levels = input.encoding.responseLevels;
  const ys: number[] = [];
  const etas: number[] = [];
  for (let i = 0; i < table.nRows; i++) {
    if (predicted.errors[i] !== null) continue;
    let v: number;
    if (outcome.kind === 'numeric') v = outcome.values[i];
    else {
      const code = outcome.codes[i];
      if (code < 0 || !levels) continue;
      const level = outcome.levels[code];
      v = level === levels[1] ? 1 : level === levels[0] ? 0 : Number.NaN;
    }
    if (Number.isNaN(v)) continue;
    ys.push(v);
    etas.push(predicted.linearPredictor[i]);
  }
  return { y: Float64Array.from(ys), eta: Float64Array.from(etas) };
}

function holdoutMetrics(family: FitSpec['family'], y: Float64Array, eta: Float64Array): HoldoutMetricsDto {
  if (family === 'gaussian') {
    const mse = meanSquaredError(y, eta);
    return {
      rowCount: y.length,
      metrics: [
        { name: 'mse', value: mse },
        { name: 'rmse', value: Math.sqrt(mse) },
        { name: 'mae', value: meanAbsoluteError(y, eta) },
        { name: 'rSquared', value: rSquared(y, eta) },
      ],
    };
  }
  return {
    rowCount: y.length,
    metrics: [
      { name: 'deviance', value: meanBinomialDeviance(y, eta) },
      { name: 'auc', value: areaUnderRoc(y, eta) },
      { name: 'misclassification', value: misclassificationRate(y, eta) },
    ],
  };
}

function rSquared(y: ArrayLike<number>, fitted: ArrayLike<number>): number {
  const n = y.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i];
  mean /= n;
  let rss = 0;
  let tss = 0;
  for (let i = 0; i < n; i++) {
    rss += (y[i] - fitted[i]) ** 2;
    tss += (y[i] - mean) ** 2;
  }
  return tss > 0 ? 1 - rss / tss : Number.NaN;
}

/** Evenly spaced row positions, at most `max`, in row order. */
function sampleIndices(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  return Array.from({ length: max }, (_, k) => Math.floor((k * n) / max));
}

function gaussianDiagnostics(y: Float64Array, eta: Float64Array, rows: 'fitted' | 'holdout'): GaussianDiagnosticsDto {
  const sample = sampleIndices(y.length, DIAGNOSTIC_SAMPLE);
  return {
    family: 'gaussian',
    rows,
    rowCount: y.length,
    rSquared: rSquared(y, eta),
    rmse: Math.sqrt(meanSquaredError(y, eta)),
    fitted: sample.map((i) => eta[i]),
    residual: sample.map((i) => y[i] - eta[i]),
  };
}

function binomialDiagnostics(y: Float64Array, eta: Float64Array, rows: 'fitted' | 'holdout', levels: [string, string] | null): BinomialDiagnosticsDto {
  const n = y.length;
  const prob = Float64Array.from(eta, (e) => 1 / (1 + Math.exp(-e)));
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => prob[b] - prob[a] || a - b);
  let positives = 0;
  for (let i = 0; i < n; i++) positives += y[i];
  const negatives = n - positives;
  // ROC: one point per distinct threshold, walking down from the highest probability.
  const points: BinomialDiagnosticsDto['roc'] = [{ falsePositiveRate: 0, truePositiveRate: 0, threshold: 1 }];
  let tp = 0;
  let fp = 0;
  for (let k = 0; k < n; k++) {
    const i = order[k];
    if (y[i] === 1) tp++;
    else fp++;
    if (k === n - 1 || prob[order[k + 1]] !== prob[i]) {
      points.push({ falsePositiveRate: negatives > 0 ? fp / negatives : 0, truePositiveRate: positives > 0 ? tp / positives : 0, threshold: prob[i] });
    }
  }
  const roc = points.length <= ROC_POINTS ? points : sampleIndices(points.length - 1, ROC_POINTS - 1).map((k) => points[k]).concat(points[points.length - 1]);
  const bins = Array.from({ length: CALIBRATION_BINS }, () => ({ sum: 0, ones: 0, count: 0 }));
  for (let i = 0; i < n; i++) {
    const b = Math.min(CALIBRATION_BINS - 1, Math.floor(prob[i] * CALIBRATION_BINS));
    bins[b].sum += prob[i];
    bins[b].ones += y[i];
    bins[b].count++;
  }
  const sample = sampleIndices(n, DIAGNOSTIC_SAMPLE);
  return {
    family: 'binomial',
    rows,
    rowCount: n,
    auc: areaUnderRoc(y, eta),
    roc,
    calibration: bins.filter((b) => b.count > 0).map((b) => ({ meanPredicted: b.sum / b.count, observedShare: b.ones / b.count, count: b.count })),
    probabilities: sample.map((i) => prob[i]),
    observed: sample.map((i) => (y[i] === 1 ? 1 : 0)),
    positiveClass: levels?.[1] ?? null,
    negativeClass: levels?.[0] ?? null,
  };
}
