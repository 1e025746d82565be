/**
 * Per-column summaries for the version page, computed with simple-statistics: counts, mean, sample
 * standard deviation, quartiles (simple-statistics' quantile: Hyndman & Fan 1996, definition 7), and
 * a histogram with Sturges' number of bins (Sturges 1926, "The choice of a class interval", JASA 21:
 * k = ceil(log2 n) + 1).
 */
import { mean, quantile, sampleStandardDeviation } from 'simple-statistics';
import type { ColumnSummary, HistogramBin, LevelCount } from '../../shared/datasets';
import type { LoadedColumn } from './storage/convert';

const LEVELS_SHOWN = 50;

function histogram(values: Float64Array, lo: number, hi: number): HistogramBin[] {
  const n = values.length;
  if (lo === hi) return [{ from: lo, to: hi, count: n }];
  const k = Math.min(30, Math.ceil(Math.log2(n)) + 1);
  const width = (hi - lo) / k;
  const bins = Array.from({ length: k }, (_, b) => ({ from: lo + b * width, to: b === k - 1 ? hi : lo + (b + 1) * width, count: 0 }));
  for (let i = 0; i < n; i++) bins[Math.min(k - 1, Math.floor((values[i] - lo) / width))].count++;
  return bins;
}

/** Distinct values counted up to this many; beyond it the summary says "many" (null). */
const DISTINCT_COUNTED = 10_000;

function levelCounts(counts: Map<string, number>): LevelCount[] {
  return [...counts]
    .filter(([, count]) => count > 0)
    .map(([level, count]) => ({ level, count }))
    .sort((a, b) => b.count - a.count || (a.level < b.level ? -1 : 1))
    .slice(0, LEVELS_SHOWN);
}

export function summarize(col: LoadedColumn): ColumnSummary {
  if (col.kind === 'numeric') {
    const all = col.values;
    let n = 0;
    let lo = Number.POSITIVE_INFINITY;
    let hi = Number.NEGATIVE_INFINITY;
    const buffer = new Float64Array(all.length);
    const seen = new Map<number, number>();
    let many = false;
    for (let i = 0; i < all.length; i++) {
      const x = all[i];
      if (Number.isNaN(x)) continue;
      buffer[n++] = x;
      if (x < lo) lo = x;
      if (x > hi) hi = x;
      if (!many) {
        seen.set(x, (seen.get(x) ?? 0) + 1);
        if (seen.size > DISTINCT_COUNTED) many = true;
      }
    }
    const base = { count: all.length, missing: all.length - n, distinct: many ? null : seen.size };
    if (n === 0) return base;
    // simple-statistics reads only indices and length, so typed arrays serve as number[].
    const xs = buffer.subarray(0, n) as unknown as number[];
    // quantile() selects (quickselect) instead of sorting: linear time on a million rows.
    const [q1, median, q3] = quantile(xs, [0.25, 0.5, 0.75]);
    return {
      ...base,
      mean: mean(xs),
      sd: n > 1 ? sampleStandardDeviation(xs) : undefined,
      min: lo,
      q1,
      median,
      q3,
      max: hi,
      histogram: histogram(buffer.subarray(0, n), lo, hi),
      levels: !many && seen.size <= 10 ? levelCounts(new Map([...seen].map(([x, c]) => [String(x), c]))) : undefined,
    };
  }
  if (col.kind === 'categorical') {
    const counts = new Array<number>(col.levels.length).fill(0);
    let missing = 0;
    for (const k of col.codes) {
      if (k < 0) missing++;
      else counts[k]++;
    }
    const map = new Map(col.levels.map((level, k) => [level, counts[k]]));
    return { count: col.codes.length, missing, distinct: counts.filter((c) => c > 0).length, levels: levelCounts(map) };
  }
  const present = col.values.filter((v): v is string => v !== null);
  return { count: col.values.length, missing: col.values.length - present.length, distinct: new Set(present).size };
}

