import { useLayoutEffect, useRef, useState, type ReactNode } from 'react';

/** The width of an element, kept up to date with a ResizeObserver (charts draw at their box's width). */
function useWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(0);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    setWidth(el.clientWidth);
    const observer = new ResizeObserver((entries) => setWidth(Math.floor(entries[0].contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return { ref, width };
}

interface Props {
  title: string;
  description: ReactNode;
  controls?: ReactNode;
  /** Draws the chart at the given width (pixels). */
  children: (width: number) => ReactNode;
  /** After the chart: legends, notes. */
  footer?: ReactNode;
  id: string;
}

/** A chart with its title, a one-sentence reading guide, and optional controls, as a <figure>. */
export function ChartFrame({ title, description, controls, children, footer, id }: Props) {
  const { ref, width } = useWidth();
  return (
    <figure className="min-w-0 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900" aria-labelledby={`${id}-title`} data-chart={id}>
      <div className="mb-2 space-y-2">
        <figcaption>
          <h3 id={`${id}-title`} className="text-base font-bold text-slate-900 dark:text-white">
            {title}
          </h3>
          <p className="max-w-2xl text-xs text-slate-600 dark:text-slate-400">{description}</p>
        </figcaption>
        {controls && <div className="flex flex-wrap items-end gap-3 text-sm">{controls}</div>}
      </div>
      <div ref={ref} className="w-full">
        {width > 0 && children(width)}
      </div>
      {footer}
    </figure>
  );
}
