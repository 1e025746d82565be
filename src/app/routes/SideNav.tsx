import { NavLink } from 'react-router';
import { useOutbox } from '@/features/dev/api/outbox';
import { useMe } from '@/lib/session';
import { paths } from '../paths';

const AREAS = [
  { label: 'Datasets', href: paths.workspace.datasets.getHref },
  { label: 'Models', href: paths.workspace.models.getHref },
  { label: 'Reviews', href: paths.workspace.reviews.getHref },
  { label: 'Releases', href: paths.workspace.releases.getHref },
  { label: 'Members', href: paths.workspace.members.getHref },
  { label: 'API keys', href: paths.workspace.consumers.getHref },
] as const;

const LINK =
  'block rounded-md px-3 py-2 text-sm font-bold text-lariat-50 hover:bg-lariat-800 aria-[current=page]:bg-lariat-50 aria-[current=page]:text-lariat-900';

export function SideNav({ workspaceId }: { workspaceId: string }) {
  // The outbox exists only when the server is asked to show captured e-mail (LARIAT_DEV_OUTBOX=1,
  // never in production); /auth/me says whether it does, so it is not requested (a 404) otherwise.
  // Each person sees their own mail there.
  const outbox = useOutbox(useMe().data?.devOutbox === true);
  return (
    <nav aria-label="Workspace">
      <ul className="space-y-1">
        {AREAS.map((area) => (
          <li key={area.label}>
            <NavLink to={area.href(workspaceId)} className={LINK}>
              {area.label}
            </NavLink>
          </li>
        ))}
        {outbox.isSuccess && (
          <li className="border-t border-lariat-700 pt-2">
            <NavLink to={paths.workspace.outbox.getHref(workspaceId)} className={LINK}>
              Outbox <span className="font-normal">(development)</span>
            </NavLink>
          </li>
        )}
      </ul>
    </nav>
  );
}
