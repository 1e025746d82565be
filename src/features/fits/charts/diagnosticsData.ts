import normal from '@stdlib/stats-base-dists-normal';

export interface XY {
  x: number;
  y: number;
}

/**
 * Normal Q-Q points: residuals standardized by their own sd and sorted, against the standard normal
 * quantiles at the plotting positions (i - 0.5) / n (common practice).
 */
export function qqPoints(residuals: number[]): XY[] {
  const n = residuals.length;
  if (n < 2) return [];
  const mean = residuals.reduce((s, r) => s + r, 0) / n;
  const sd = Math.sqrt(residuals.reduce((s, r) => s + (r - mean) ** 2, 0) / (n - 1)) || 1;
  const sorted = residuals.map((r) => (r - mean) / sd).sort((a, b) => a - b);
  return sorted.map((y, i) => ({ x: normal.quantile((i + 0.5) / n, 0, 1), y }));
}

export interface Confusion {
  truePositive: number;
  falsePositive: number;
  trueNegative: number;
  falseNegative: number;
}

/** Counts of a yes/no prediction "probability >= threshold" against what was observed. */
export function confusionAt(probabilities: number[], observed: (0 | 1)[], threshold: number): Confusion {
  const c = { truePositive: 0, falsePositive: 0, trueNegative: 0, falseNegative: 0 };
  for (let i = 0; i < probabilities.length; i++) {
    const yes = probabilities[i] >= threshold;
    if (yes && observed[i] === 1) c.truePositive++;
    else if (yes) c.falsePositive++;
    else if (observed[i] === 1) c.falseNegative++;
    else c.trueNegative++;
  }
  return c;
}
