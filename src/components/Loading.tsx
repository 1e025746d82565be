/** A quiet "working" indicator; the text is what screen readers hear. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-3 py-8 text-sm text-slate-700 dark:text-slate-300">
      <span
        aria-hidden="true"
        className="h-4 w-4 animate-spin rounded-full border-2 border-lariat-200 border-t-lariat-700 dark:border-slate-700 dark:border-t-saffron-400"
      />
      {label}
    </div>
  );
}

export function FullPageLoading() {
  return (
    <div className="flex min-h-screen items-center justify-center">
      <Loading label="Opening Lariat…" />
    </div>
  );
}
