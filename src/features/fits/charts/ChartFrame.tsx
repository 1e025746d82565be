import type { ReactNode } from 'react';

/** A chart with its title, a one-sentence reading guide, and optional controls, as a <figure>. */
export function ChartFrame({ title, description, controls, children, id }: { title: string; description: ReactNode; controls?: ReactNode; children: ReactNode; id?: string }) {
  return (
    <figure className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900" aria-labelledby={id ? `${id}-title` : undefined} data-chart={id}>
      <div className="mb-2 flex flex-wrap items-start justify-between gap-3">
        <figcaption>
          <h3 id={id ? `${id}-title` : undefined} className="text-base font-bold text-slate-900 dark:text-white">
            {title}
          </h3>
          <p className="max-w-2xl text-xs text-slate-600 dark:text-slate-400">{description}</p>
        </figcaption>
        {controls && <div className="flex flex-wrap items-end gap-3 text-sm">{controls}</div>}
      </div>
      {children}
    </figure>
  );
}
