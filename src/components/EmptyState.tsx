import type { ReactNode } from 'react';

/** What a page shows when there is nothing in it yet: what will appear here, and why it is empty. */
export function EmptyState({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section
      aria-label={title}
      className="rounded-lg border border-dashed border-lariat-300 bg-white px-6 py-8 dark:border-lariat-800 dark:bg-slate-900"
    >
      <h2 className="text-lg font-bold text-lariat-800 dark:text-lariat-200">{title}</h2>
      <div className="mt-2 space-y-2 text-sm text-slate-700 dark:text-slate-300">{children}</div>
    </section>
  );
}
