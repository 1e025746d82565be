import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { DocumentTitle } from './DocumentTitle';
import { Wordmark } from './Logo';
import { ThemeToggle } from './ThemeToggle';

/** The frame of the signed-out pages: the mark, one card with the form, and a footer line. */
export function AuthCard({ title, intro, children, footer }: { title: string; intro?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col bg-gradient-to-b from-lariat-50 to-slate-50 dark:from-lariat-950 dark:to-slate-950">
      <DocumentTitle title={title} />
      <header className="flex items-center justify-between px-6 py-4">
        <Link to="/" className="rounded-md">
          <Wordmark />
        </Link>
        <ThemeToggle />
      </header>
      <main className="flex flex-1 items-start justify-center px-4 pt-8 pb-16">
        <div className="w-full max-w-md rounded-xl border border-slate-200 bg-white p-8 shadow-sm dark:border-slate-800 dark:bg-slate-900">
          <h1 className="text-2xl font-bold text-slate-900 dark:text-white">{title}</h1>
          {intro && <div className="mt-2 text-sm text-slate-700 dark:text-slate-300">{intro}</div>}
          <div className="mt-6">{children}</div>
          {footer && <div className="mt-6 border-t border-slate-200 pt-4 text-sm text-slate-700 dark:border-slate-800 dark:text-slate-300">{footer}</div>}
        </div>
      </main>
    </div>
  );
}

/** An in-text link with enough contrast on both themes. */
export function TextLink({ to, children }: { to: string; children: ReactNode }) {
  return (
    <Link to={to} className="font-bold text-lariat-700 underline underline-offset-2 hover:text-lariat-900 dark:text-lariat-300 dark:hover:text-lariat-100">
      {children}
    </Link>
  );
}
