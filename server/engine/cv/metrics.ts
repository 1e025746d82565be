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
  // The scores of each class sorted apart (a typed array's numeric sort, no comparator calls), then
  // walked together: a tie group spans both lists. The rank sum is a sum of half-integers far below
  // 2^53, so it is exact in any order of summation.
  let positives = 0;
  for (let i = 0; i < n; i++) if (y[i] === 1) positives++;
  const negatives = n - positives;
  if (positives === 0 || negatives === 0) return Number.NaN;
  const pos = new Float64Array(positives);
  const neg = new Float64Array(negatives);
  for (let i = 0, a = 0, b = 0; i < n; i++) {
    const s = score[i];
    if (Number.isNaN(s)) return Number.NaN;
    if (y[i] === 1) pos[a++] = s;
    else neg[b++] = s;
  }
  pos.sort();
  neg.sort();
  let rankSumPositives = 0;
  let i = 0;
  let j = 0;
  while (i < positives || j < negatives) {
    const v = j >= negatives || (i < positives && pos[i] < neg[j]) ? pos[i] : neg[j];
    const start = i + j;
    const fromPos = i;
    while (i < positives && pos[i] === v) i++;
    while (j < negatives && neg[j] === v) j++;
    // Rows start..end-1 of the merged order are tied; each gets the mean of ranks start+1..end.
    const midRank = (start + 1 + i + j) / 2;
    rankSumPositives += (i - fromPos) * midRank;
  }
  return (rankSumPositives - (positives * (positives + 1)) / 2) / (positives * negatives);
}
