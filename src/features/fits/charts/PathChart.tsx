/**
 * Coefficient paths: each term's coefficient along the lambda path, against log10(lambda) or against
 * the L1 norm of the coefficients. Only the k largest paths are drawn (a fit may have thousands of
 * terms); a search adds any other term. Hover names the nearest path; click a lambda to choose it.
 */
import { useMemo, useRef, useState } from 'react';
import { Axis, Grid, LineSeries, Tooltip, XYChart } from '@visx/xychart';
import type { SparseTerms } from '@shared/fits';
import { formatStat } from '@/lib/numbers';
import { ChartFrame } from './ChartFrame';
import { VerticalMark } from './marks';
import { l1Norms, peakSizes, termPath, topTerms, type PathPoint } from './pathData';
import { chartTheme, MARGIN, MARK_COLORS, SERIES_COLORS } from './theme';

interface Props {
  lambda: number[];
  coefficients: SparseTerms[];
  terms: string[];
  chosenIndex: number;
  onChoose?: (index: number) => void;
  /** What the coefficients are measured in, for the axis label. */
  scaleLabel: string;
}

const X_KINDS = { 'log-lambda': 'log10(lambda)', l1: 'L1 norm of the coefficients' } as const;
type XKind = keyof typeof X_KINDS;
const accessors = { xAccessor: (d: PathPoint) => d.x, yAccessor: (d: PathPoint) => d.y };

export function PathChart({ lambda, coefficients, terms, chosenIndex, onChoose, scaleLabel }: Props) {
  const [xKind, setXKind] = useState<XKind>('log-lambda');
  const [k, setK] = useState(10);
  const [search, setSearch] = useState('');
  const peak = useMemo(() => peakSizes(coefficients, terms.length), [coefficients, terms.length]);
  const xs = useMemo(() => (xKind === 'log-lambda' ? lambda.map((l) => Math.log10(l)) : l1Norms(coefficients)), [xKind, lambda, coefficients]);
  const shown = useMemo(() => {
    const top = topTerms(peak, k);
    const q = search.trim().toLowerCase();
    if (q) {
      const extra = terms.map((t, j) => j).filter((j) => terms[j].toLowerCase().includes(q) && !top.includes(j)).slice(0, 20);
      return [...extra, ...top];
    }
    return top;
  }, [peak, k, search, terms]);
  const series = useMemo(() => shown.map((j) => ({ j, data: termPath(coefficients, j, xs) })), [shown, coefficients, xs]);
  const everNonzero = peak.reduce((n, v) => n + (v > 0 ? 1 : 0), 0);
  const lastUp = useRef<unknown>(null);

  return (
    <ChartFrame
      footer={
        <ul className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-xs" aria-label="Terms drawn">
          {series.map((s, n) => (
            <li key={s.j} className="flex items-center gap-1">
              <span aria-hidden="true" className="inline-block h-2 w-3 rounded-sm" style={{ background: SERIES_COLORS[n % SERIES_COLORS.length] }} />
              {terms[s.j]}
            </li>
          ))}
        </ul>
      }
      id="paths"
      title="Coefficient paths"
      description={`Each line is one term's coefficient (${scaleLabel}) as the penalty weakens. ${shown.length} of ${everNonzero} terms that ever enter are drawn, the largest first. Hover a line to name it; click to choose that lambda.`}
      controls={
        <>
          <label className="flex flex-col gap-0.5">
            <span className="text-xs font-bold">Across</span>
            <select value={xKind} onChange={(e) => setXKind(e.target.value as XKind)} className="rounded border border-slate-300 px-1 py-0.5 dark:border-slate-700 dark:bg-slate-950">
              <option value="log-lambda">log10(lambda)</option>
              <option value="l1">L1 norm</option>
            </select>
          </label>
          <label className="flex flex-col gap-0.5">
            <span className="text-xs font-bold">Largest paths</span>
            <select value={k} onChange={(e) => setK(Number(e.target.value))} className="rounded border border-slate-300 px-1 py-0.5 dark:border-slate-700 dark:bg-slate-950">
              {[5, 10, 20, 50].map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-0.5">
            <span className="text-xs font-bold">Show terms named</span>
            <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} className="w-36 rounded border border-slate-300 px-1 py-0.5 dark:border-slate-700 dark:bg-slate-950" />
          </label>
        </>
      }
    >
      {(width) => (
      <XYChart
        width={width}
        height={340}
        margin={MARGIN}
        theme={chartTheme}
        xScale={{ type: 'linear', zero: false, nice: false }}
        yScale={{ type: 'linear', nice: true }}
        onPointerUp={({ datum, event }) => {
          // Every series reports the same click; act once per pointer event.
          if (!onChoose || lastUp.current === event) return;
          lastUp.current = event;
          onChoose((datum as PathPoint).i);
        }}
      >
        <Grid columns={false} numTicks={5} />
        <Axis orientation="bottom" label={X_KINDS[xKind]} numTicks={6} />
        <Axis orientation="left" label={`Coefficient (${scaleLabel})`} numTicks={5} tickFormat={(v) => formatStat(Number(v), 3)} />
        {series.map((s, n) => (
          <LineSeries key={s.j} dataKey={terms[s.j]} data={s.data} {...accessors} stroke={SERIES_COLORS[n % SERIES_COLORS.length]} strokeWidth={1.5} />
        ))}
        <VerticalMark x={xs[chosenIndex]} color={MARK_COLORS.chosen} label="chosen" />
        <Tooltip<PathPoint>
          snapTooltipToDatumX
          showVerticalCrosshair
          renderTooltip={({ tooltipData }) => {
            const near = tooltipData?.nearestDatum;
            if (!near) return null;
            return (
              <div className="text-xs">
                <strong>{near.key}</strong>: {formatStat(near.datum.y)}
                <br />
                lambda {formatStat(lambda[near.datum.i])} (position {near.datum.i + 1})
              </div>
            );
          }}
        />
      </XYChart>
      )}
    </ChartFrame>
  );
}
