/**
 * Held-out losses for cross-validation, each the mean over the rows it is given. `eta` is the
 * linear predictor b0 + x'b; for binomial the class-1 probability is 1 / (1 + exp(-eta)).
 */

/** Mean squared error (gaussian). */
export function meanSquaredError(y: ArrayLike<number>, eta: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < y.length; i++) {
    const r = y[i] - eta[i];
    sum += r * r;
  }
  return sum / y.length;
}

/** Mean absolute error (gaussian). */
export function meanAbsoluteError(y: ArrayLike<number>, eta: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < y.length; i++) sum += Math.abs(y[i] - eta[i]);
  return sum / y.length;
}

/** log(1 + exp(t)) without overflow for large t or loss of precision for very negative t. */
export function log1pExp(t: number): number {
  return t > 0 ? t + Math.log1p(Math.exp(-t)) : Math.log1p(Math.exp(t));
}

/**
 * Mean binomial deviance per row, -2 [y eta - log(1 + exp(eta))] for y in {0, 1}: the -2
 * log-likelihood of a Bernoulli outcome with logit eta (common practice; equals the deviance
 * because a saturated 0/1 model has likelihood 1).
 */
export function meanBinomialDeviance(y: ArrayLike<number>, eta: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < y.length; i++) sum += -2 * (y[i] * eta[i] - log1pExp(eta[i]));
  return sum / y.length;
}

/**
 * Misclassification rate at probability 0.5, i.e. eta > 0 predicts class 1. A row with eta exactly 0
 * counts as half an error: the classifier has no preference there (our choice, documented).
 */
export function misclassificationRate(y: ArrayLike<number>, eta: ArrayLike<number>): number {
  let errors = 0;
  for (let i = 0; i < y.length; i++) {
    if (eta[i] === 0) errors += 0.5;
    else if ((eta[i] > 0 ? 1 : 0) !== y[i]) errors += 1;
  }
  return errors / y.length;
}

/**
 * Area under the ROC curve by the Mann-Whitney statistic: the fraction of (positive, negative) pairs
 * whose scores are ordered correctly, ties counted half (Hanley & McNeil 1982, Radiology 143:29-36).
 * Computed from mid-ranks in O(n log n): AUC = (R1 - n1(n1+1)/2) / (n1 n0), R1 = rank sum of the
 * positives. NaN when either class is absent (the AUC is undefined then).
 */
export function areaUnderRoc(y: ArrayLike<number>, score: ArrayLike<number>): number {
  const n = y.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => score[a] - score[b]);
  let positives = 0;
  let rankSumPositives = 0;
  let start = 0;
  while (start < n) {
    let end = start + 1;
    while (end < n && score[order[end]] === score[order[start]]) end++;
    // Rows start..end-1 are tied; each gets the mean of ranks start+1..end.
    const midRank = (start + 1 + end) / 2;
    for (let k = start; k < end; k++) {
      if (y[order[k]] === 1) {
        positives++;
        rankSumPositives += midRank;
      }
    }
    start = end;
  }
  const negatives = n - positives;
  if (positives === 0 || negatives === 0) return Number.NaN;
  return (rankSumPositives - (positives * (positives + 1)) / 2) / (positives * negatives);
}
