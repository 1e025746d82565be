/** The fits' CV curves overlaid against log10(lambda), each with its chosen lambda marked. */
import { Axis, GlyphSeries, Grid, LineSeries, XYChart, buildChartTheme } from '@visx/xychart';
import { useLayoutEffect, useRef, useState } from 'react';
import type { FitDetailDto } from '@shared/fits';
import { formatStat } from '@/lib/numbers';

const COLORS = ['#1a6d67', '#e09b14', '#3b6fb6', '#c2416b', '#5b8c2a', '#8a55b5'];
const theme = buildChartTheme({ backgroundColor: 'transparent', colors: COLORS, tickLength: 4, gridColor: '#cbd5e1', gridColorDark: '#64748b' });
interface P {
  x: number;
  y: number;
}
const acc = { xAccessor: (d: P) => d.x, yAccessor: (d: P) => d.y };

export function CompareCvChart({ fits }: { fits: FitDetailDto[] }) {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    if (!ref.current) return;
    setWidth(ref.current.clientWidth);
    const o = new ResizeObserver((e) => setWidth(Math.floor(e[0].contentRect.width)));
    o.observe(ref.current);
    return () => o.disconnect();
  }, []);
  const withCv = fits.filter((f) => f.results?.cv);
  if (withCv.length === 0) return <p className="text-sm text-slate-600">None of these fits was cross-validated.</p>;
  const metric = withCv[0].results!.cv!.metric;
  return (
    <figure aria-labelledby="compare-cv-title" className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <figcaption id="compare-cv-title" className="text-base font-bold">
        Cross-validation curves ({metric})
      </figcaption>
      <p className="text-sm text-slate-600 dark:text-slate-300">Mean held-out error per lambda for each fit; the larger dot is the fit&apos;s chosen lambda. Curves of different measures are not comparable.</p>
      <div ref={ref}>
        {width > 0 && (
          <XYChart width={width} height={300} theme={theme} margin={{ top: 16, right: 16, bottom: 44, left: 60 }} xScale={{ type: 'linear', zero: false }} yScale={{ type: 'linear', zero: false, nice: true }}>
            <Grid columns={false} numTicks={5} />
            <Axis orientation="bottom" label="log10(lambda)" numTicks={6} />
            <Axis orientation="left" label={metric} numTicks={5} tickFormat={(v) => formatStat(Number(v), 3)} />
            {withCv.map((f, k) => {
              const r = f.results!;
              const pts = r.cv!.mean.map((m, i) => ({ x: Math.log10(r.lambda[i]), y: m })).sort((a, b) => a.x - b.x);
              const chosen = [{ x: Math.log10(r.chosen.lambda), y: r.cv!.mean[r.chosen.index] }];
              return [
                <LineSeries key={`l${f.id}`} dataKey={`v${f.version}-${f.id}`} data={pts} {...acc} stroke={COLORS[k % COLORS.length]} />,
                <GlyphSeries key={`g${f.id}`} dataKey={`c${f.id}`} data={chosen} {...acc} colorAccessor={() => COLORS[k % COLORS.length]} size={60} />,
              ];
            })}
          </XYChart>
        )}
      </div>
      <ul className="mt-1 flex flex-wrap gap-4 text-xs">
        {withCv.map((f, k) => (
          <li key={f.id} className="flex items-center gap-1">
            <span aria-hidden className="inline-block h-2 w-4" style={{ background: COLORS[k % COLORS.length] }} />
            {f.modelName} v{f.version}
          </li>
        ))}
      </ul>
    </figure>
  );
}
