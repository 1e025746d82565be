/**
 * The cross-validation curve: mean held-out error per lambda with plus/minus one standard error,
 * the minimum and the one-standard-error choice marked, the chosen lambda, and the number of nonzero
 * terms along the top. Click a lambda to choose it.
 */
import { useMemo, useRef } from 'react';
import { Axis, GlyphSeries, Grid, LineSeries, Tooltip, XYChart } from '@visx/xychart';
import { CV_METRIC_LABELS, type CvResultDto } from '@shared/fits';
import { formatStat } from '@/lib/numbers';
import { ChartFrame } from './ChartFrame';
import { ErrorBars, MarkKey, VerticalMark } from './marks';
import { chartTheme, MARGIN, MARK_COLORS, SERIES_COLORS } from './theme';

interface Props {
  lambda: number[];
  cv: CvResultDto;
  chosenIndex: number;
  onChoose?: (index: number) => void;
}

interface CvPoint {
  i: number;
  x: number;
  y: number;
}
const accessors = { xAccessor: (d: CvPoint) => d.x, yAccessor: (d: CvPoint) => d.y };

/** About `count` evenly spaced path positions for the top axis. */
function spread(n: number, count: number): number[] {
  if (n <= count) return Array.from({ length: n }, (_, i) => i);
  return Array.from({ length: count }, (_, k) => Math.round((k * (n - 1)) / (count - 1)));
}

export function CvChart({ lambda, cv, chosenIndex, onChoose }: Props) {
  const xs = useMemo(() => lambda.map((l) => Math.log10(l)), [lambda]);
  // Increasing x: the chart finds the point nearest the pointer by bisection.
  const points = useMemo(() => cv.mean.map((m, i) => ({ i, x: xs[i], y: m })).sort((a, b) => a.x - b.x), [cv.mean, xs]);
  const bars = useMemo(() => cv.mean.map((m, i) => ({ x: xs[i], low: m - cv.standardError[i], high: m + cv.standardError[i] })), [cv, xs]);
  const topTicks = spread(xs.length, 8);
  const lastUp = useRef<unknown>(null);
  const label = CV_METRIC_LABELS[cv.metric];
  return (
    <ChartFrame
      footer={
        <ul className="mt-1 flex flex-wrap gap-4 text-xs" aria-label="Marked lambdas">
          <MarkKey color={MARK_COLORS.minimum} dashed>
            Minimum: lambda {formatStat(cv.minimum.lambda)}
          </MarkKey>
          <MarkKey color={MARK_COLORS.oneSe} dashed>
            One standard error: lambda {formatStat(cv.oneStandardError.lambda)}
          </MarkKey>
          <MarkKey color={MARK_COLORS.chosen}>Chosen: lambda {formatStat(lambda[chosenIndex])}</MarkKey>
          {cv.unconvergedFolds.length > 0 && <li className="font-bold text-red-700 dark:text-red-300">Folds {cv.unconvergedFolds.map((f) => f + 1).join(', ')} did not converge at some lambda.</li>}
        </ul>
      }
      id="cv"
      title="Cross-validation"
      description={`${label} on held-out rows, the mean over ${cv.folds} folds with plus/minus one standard error. Marked: the minimum, the one-standard-error choice (the largest lambda within one standard error of the minimum) and the chosen lambda. Click to choose.`}
    >
      {(width) => (
      <XYChart
        width={width}
        height={340}
        margin={{ ...MARGIN, top: 44 }}
        theme={chartTheme}
        xScale={{ type: 'linear', zero: false, nice: false }}
        yScale={{ type: 'linear', zero: false, nice: true }}
        onPointerUp={({ datum, event }) => {
          if (!onChoose || lastUp.current === event) return;
          lastUp.current = event;
          onChoose((datum as CvPoint).i);
        }}
      >
        <Grid columns={false} numTicks={5} />
        <Axis orientation="bottom" label="log10(lambda)" numTicks={6} />
        <Axis orientation="left" label={label} numTicks={5} tickFormat={(v) => formatStat(Number(v), 3)} />
        <Axis
          orientation="top"
          label="Nonzero terms"
          tickValues={topTicks.map((i) => xs[i])}
          tickFormat={(v) => {
            const i = topTicks.find((t) => xs[t] === v);
            return i === undefined ? '' : String(cv.nonzero[i]);
          }}
        />
        <ErrorBars points={bars} color="#94a3b8" />
        <LineSeries dataKey="mean" data={points} {...accessors} stroke={SERIES_COLORS[0]} strokeWidth={1.5} />
        <GlyphSeries dataKey="points" data={points} {...accessors} colorAccessor={() => SERIES_COLORS[0]} size={4} />
        <VerticalMark x={xs[cv.minimum.index]} color={MARK_COLORS.minimum} dashed />
        <VerticalMark x={xs[cv.oneStandardError.index]} color={MARK_COLORS.oneSe} dashed />
        <VerticalMark x={xs[chosenIndex]} color={MARK_COLORS.chosen} />
        <Tooltip<CvPoint>
          snapTooltipToDatumX
          showVerticalCrosshair
          renderTooltip={({ tooltipData }) => {
            const d = tooltipData?.nearestDatum?.datum;
            if (!d) return null;
            return (
              <div className="text-xs">
                lambda {formatStat(lambda[d.i])} (position {d.i + 1})
                <br />
                {label} {formatStat(d.y)} ± {formatStat(cv.standardError[d.i])}
                <br />
                {cv.nonzero[d.i]} nonzero terms
              </div>
            );
          }}
        />
      </XYChart>
      )}
    </ChartFrame>
  );
}
