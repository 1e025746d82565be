/**
 * Lariat's mark: a rope that drops, turns along the ground into an L, and ends in a loop.
 * Drawn by hand for Lariat; the same drawing is public/lariat-mark.svg (the favicon).
 */
export function LogoMark({ className = 'h-8 w-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect width="32" height="32" rx="7" className="fill-lariat-700" />
      <path
        d="M10.5 5.5v14.5a6 6 0 0 0 6 6h2.2"
        fill="none"
        className="stroke-saffron-400"
        strokeWidth="3"
        strokeLinecap="round"
      />
      <ellipse cx="22.6" cy="22.4" rx="4.4" ry="4" fill="none" className="stroke-saffron-400" strokeWidth="2.6" />
      <circle cx="10.5" cy="5.5" r="1.9" className="fill-saffron-300" />
    </svg>
  );
}

export function Wordmark({ className = '' }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <LogoMark />
      <span className="text-xl font-bold tracking-tight text-lariat-800 dark:text-lariat-100">Lariat</span>
    </span>
  );
}
