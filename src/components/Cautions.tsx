import { CAUTIONS } from '@shared/cautions';

export { CAUTIONS };

export function Cautions({ className = '' }: { className?: string }) {
  return (
    <aside
      aria-labelledby="cautions-heading"
      className={`rounded-lg border-l-4 border-saffron-500 bg-saffron-300/15 px-5 py-4 dark:bg-saffron-500/10 ${className}`}
    >
      <h2 id="cautions-heading" className="text-base font-bold text-slate-900 dark:text-white">
        Read results with care
      </h2>
      <ul className="mt-2 space-y-2 text-sm text-slate-800 dark:text-slate-200">
        {CAUTIONS.map((c) => (
          <li key={c.id}>
            <strong className="font-bold">{c.title}.</strong> {c.text}
          </li>
        ))}
      </ul>
    </aside>
  );
}
