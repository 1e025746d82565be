/** A labelled progress bar (native <progress>, so assistive technology reads the value). */
export function ProgressBar({ label, value, detail }: { label: string; value: number; detail?: string }) {
  const percent = Math.round(Math.max(0, Math.min(1, value)) * 100);
  return (
    <div className="space-y-1">
      <div className="flex justify-between text-sm text-slate-700 dark:text-slate-300">
        <span>{label}</span>
        <span>
          {percent}%{detail ? ` · ${detail}` : ''}
        </span>
      </div>
      <progress aria-label={label} max={100} value={percent} className="h-2 w-full accent-lariat-700" />
    </div>
  );
}
