import type { ReactNode } from 'react';
import { Link } from 'react-router';
import type { MeDto, MembershipSummaryDto } from '@shared/auth';
import { ROLE_LABELS } from '@shared/members';
import { Wordmark } from '@/components/Logo';
import { ThemeToggle } from '@/components/ThemeToggle';
import { WorkspaceSwitcher } from '@/features/workspaces/components/WorkspaceSwitcher';
import { paths } from '../paths';
import { SideNav } from './SideNav';
import { SignOutButton } from './SignOutButton';

/** The signed-in frame: a teal side bar (mark, workspace, areas, account) and the page beside it. */
export function AppShell({ me, current, children }: { me: MeDto; current: MembershipSummaryDto; children: ReactNode }) {
  return (
    <div className="min-h-screen md:grid md:grid-cols-[16rem_1fr]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:rounded-md focus:bg-white focus:px-3 focus:py-2 focus:text-lariat-900">
        Skip to the page
      </a>
      <header className="flex flex-col gap-6 bg-lariat-900 px-4 py-5 text-lariat-50 md:min-h-screen dark:bg-lariat-950">
        <Link to={paths.home.getHref()} className="rounded-md">
          <Wordmark className="[&>span:last-child]:text-white" />
        </Link>
        <WorkspaceSwitcher current={current.workspaceId} entries={me.memberships} />
        <SideNav workspaceId={current.workspaceId} />
        <div className="mt-auto space-y-3 border-t border-lariat-700 pt-4 text-sm">
          <p>
            <span className="block font-bold text-white">{me.user.name}</span>
            <span className="block break-all text-lariat-100">{me.user.email}</span>
            <span className="mt-1 inline-block rounded bg-saffron-400 px-2 py-0.5 text-xs font-bold text-lariat-950">{ROLE_LABELS[current.role]}</span>
          </p>
          <Link to={paths.workspace.account.getHref(current.workspaceId)} className="block rounded-md font-bold text-lariat-50 underline hover:text-white">
            Your account
          </Link>
          <div className="flex items-center justify-between [&_button]:text-lariat-50 [&_button:hover]:bg-lariat-800">
            <SignOutButton />
            <ThemeToggle />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-5xl px-6 py-8">
        {children}
      </main>
    </div>
  );
}
