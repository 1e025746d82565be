/**
 * Per-column summaries for the version page, computed with simple-statistics: counts, mean, sample
 * standard deviation, quartiles (simple-statistics' quantileSorted), and a histogram with Sturges'
 * number of bins (Sturges 1926, "The choice of a class interval", JASA 21: k = ceil(log2 n) + 1).
 */
import { mean, quantileSorted, sampleStandardDeviation } from 'simple-statistics';
import type { ColumnSummary, HistogramBin, LevelCount } from '../../shared/datasets';
import type { LoadedColumn } from './storage/convert';

const LEVELS_SHOWN = 50;

function histogram(sorted: Float64Array): HistogramBin[] {
  const n = sorted.length;
  const lo = sorted[0];
  const hi = sorted[n - 1];
  if (lo === hi) return [{ from: lo, to: hi, count: n }];
  const k = Math.min(30, Math.ceil(Math.log2(n)) + 1);
  const width = (hi - lo) / k;
  const bins = Array.from({ length: k }, (_, b) => ({ from: lo + b * width, to: b === k - 1 ? hi : lo + (b + 1) * width, count: 0 }));
  for (let i = 0; i < n; i++) bins[Math.min(k - 1, Math.floor((sorted[i] - lo) / width))].count++;
  return bins;
}

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
    const buffer = new Float64Array(all.length);
    for (let i = 0; i < all.length; i++) if (!Number.isNaN(all[i])) buffer[n++] = all[i];
    const present = buffer.subarray(0, n).sort();
    let distinct = n > 0 ? 1 : 0;
    for (let i = 1; i < n; i++) if (present[i] !== present[i - 1]) distinct++;
    const base = { count: col.values.length, missing: col.values.length - n, distinct };
    if (n === 0) return base;
    const xs = present as unknown as number[]; // simple-statistics only indexes and reads length
    return {
      ...base,
      mean: mean(xs),
      sd: n > 1 ? sampleStandardDeviation(xs) : undefined,
      min: present[0],
      q1: quantileSorted(xs, 0.25),
      median: quantileSorted(xs, 0.5),
      q3: quantileSorted(xs, 0.75),
      max: present[n - 1],
      histogram: histogram(present),
      levels: base.distinct <= 10 ? levelCounts(countMap(Array.from(present, String))) : undefined,
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

function countMap(values: string[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const v of values) m.set(v, (m.get(v) ?? 0) + 1);
  return m;
}
