/** A small scatter plot with an optional reference line (residuals, Q-Q, calibration share it). */
import type { ReactNode } from 'react';
import { Axis, GlyphSeries, Grid, LineSeries, XYChart } from '@visx/xychart';
import { formatStat } from '@/lib/numbers';
import { ChartFrame } from './ChartFrame';
import type { XY } from './diagnosticsData';
import { ReferenceLine } from './marks';
import { chartTheme, MARGIN, SERIES_COLORS } from './theme';

const accessors = { xAccessor: (d: XY) => d.x, yAccessor: (d: XY) => d.y };

interface Props {
  id: string;
  title: string;
  description: ReactNode;
  points: XY[];
  xLabel: string;
  yLabel: string;
  reference?: { from: [number, number]; to: [number, number] };
  /** Join the points with a line (ROC, calibration). */
  line?: boolean;
  domain?: { x?: [number, number]; y?: [number, number] };
}

export function ScatterChart({ id, title, description, points, xLabel, yLabel, reference, line = false, domain }: Props) {
  return (
    <ChartFrame id={id} title={title} description={description}>
      {(width) => (
      <XYChart
        width={width}
        height={280}
        margin={MARGIN}
        theme={chartTheme}
        xScale={{ type: 'linear', zero: false, nice: true, ...(domain?.x ? { domain: domain.x } : {}) }}
        yScale={{ type: 'linear', zero: false, nice: true, ...(domain?.y ? { domain: domain.y } : {}) }}
      >
        <Grid numTicks={5} />
        <Axis orientation="bottom" label={xLabel} numTicks={5} tickFormat={(v) => formatStat(Number(v), 3)} />
        <Axis orientation="left" label={yLabel} numTicks={5} tickFormat={(v) => formatStat(Number(v), 3)} />
        {reference && <ReferenceLine from={reference.from} to={reference.to} />}
        {line && <LineSeries dataKey={`${id}-line`} data={points} {...accessors} stroke={SERIES_COLORS[0]} strokeWidth={2} />}
        <GlyphSeries dataKey={`${id}-points`} data={points} {...accessors} colorAccessor={() => SERIES_COLORS[0]} size={line ? 5 : 3} />
      </XYChart>
      )}
    </ChartFrame>
  );
}
