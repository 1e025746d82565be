import { useContext, type ReactNode } from 'react';
import { DataContext } from '@visx/xychart';

type Scale = (v: number) => number | undefined;

/** A vertical line across the plot at data x, with a small label at the top (e.g. the chosen lambda). */
export function VerticalMark({ x, color, label, dashed = false }: { x: number; color: string; label?: string; dashed?: boolean }) {
  const { xScale, margin, innerHeight } = useContext(DataContext);
  if (!xScale || !margin || innerHeight === undefined) return null;
  const px = (xScale as unknown as Scale)(x);
  if (px === undefined || !Number.isFinite(px)) return null;
  return (
    <g pointerEvents="none">
      <line x1={px} x2={px} y1={margin.top} y2={margin.top + innerHeight} stroke={color} strokeWidth={2} strokeDasharray={dashed ? '5 4' : undefined} />
      {label && (
        <text x={px + 4} y={margin.top + 10} fill={color} fontSize={11} fontWeight={700} fontFamily="Lato, system-ui, sans-serif">
          {label}
        </text>
      )}
    </g>
  );
}

/** A straight reference line between two data points (y = x on a Q-Q plot, chance on a ROC curve). */
export function ReferenceLine({ from, to, color = '#94a3b8' }: { from: [number, number]; to: [number, number]; color?: string }) {
  const { xScale, yScale } = useContext(DataContext);
  if (!xScale || !yScale) return null;
  const sx = xScale as unknown as Scale;
  const sy = yScale as unknown as Scale;
  const [x1, y1, x2, y2] = [sx(from[0]), sy(from[1]), sx(to[0]), sy(to[1])];
  if ([x1, y1, x2, y2].some((v) => v === undefined || !Number.isFinite(v))) return null;
  return <line x1={x1} y1={y1} x2={x2} y2={y2} stroke={color} strokeWidth={1.5} strokeDasharray="4 4" pointerEvents="none" />;
}

/** Vertical bars from low to high at each x (the plus/minus one standard error of a CV curve). */
export function ErrorBars({ points, color }: { points: { x: number; low: number; high: number }[]; color: string }) {
  const { xScale, yScale } = useContext(DataContext);
  if (!xScale || !yScale) return null;
  const sx = xScale as unknown as Scale;
  const sy = yScale as unknown as Scale;
  return (
    <g pointerEvents="none" stroke={color} strokeWidth={1}>
      {points.map((p, i) => {
        const x = sx(p.x);
        const y1 = sy(p.low);
        const y2 = sy(p.high);
        if (x === undefined || y1 === undefined || y2 === undefined) return null;
        return (
          <g key={i}>
            <line x1={x} x2={x} y1={y1} y2={y2} />
            <line x1={x - 2} x2={x + 2} y1={y1} y2={y1} />
            <line x1={x - 2} x2={x + 2} y1={y2} y2={y2} />
          </g>
        );
      })}
    </g>
  );
}

/** A legend entry for a mark: a short coloured line, then the text in the page's own colour. */
export function MarkKey({ color, dashed = false, children }: { color: string; dashed?: boolean; children: ReactNode }) {
  return (
    <li className="flex items-center gap-1.5">
      <svg width={18} height={8} aria-hidden="true">
        <line x1={0} x2={18} y1={4} y2={4} stroke={color} strokeWidth={2} strokeDasharray={dashed ? '5 3' : undefined} />
      </svg>
      <span>{children}</span>
    </li>
  );
}
