import { NavLink, Outlet, useNavigate } from 'react-router';
import { Badge } from '../../components/ui/badge';
import { useSignOut } from '../../features/auth/api/sign-in';
import { paths } from '../../lib/paths';
import { abilitiesOf, useSession } from '../../lib/session';

interface NavItem {
  to: string;
  label: string;
  show: (a: ReturnType<typeof abilitiesOf>) => boolean;
}

const navItems: NavItem[] = [
  { to: paths.traces.href(), label: 'Traces', show: () => true },
  { to: paths.upload.href(), label: 'Upload', show: (a) => a.canEdit },
  { to: paths.sites.href(), label: 'Sites & circuits', show: () => true },
  { to: paths.adminKeys.href(), label: 'Admin', show: (a) => a.canAdminister },
];

const roleLabels = { admin: 'Admin', engineer: 'Engineer', viewer: 'Viewer' } as const;

/** The shell: the product name, the navigation the user's role allows, who is signed in, and the page. */
export function AppLayout() {
  const session = useSession();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const abilities = abilitiesOf(session?.user.role);
  return (
    <div className="flex min-h-full flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2"
      >
        Skip to content
      </a>
      <header className="bg-ink-900 text-ink-50 shadow">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-8 gap-y-2 px-4 py-2.5 md:px-6">
          <NavLink to={paths.home.href()} className="flex items-center gap-2 text-lg font-semibold tracking-wide">
            <img src="/favicon.svg" alt="" className="h-7 w-7" />
            Headroom
          </NavLink>
          <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
            {navItems
              .filter((item) => item.show(abilities))
              .map((item) => (
                <NavLink
                  key={item.to}
                  to={item.to}
                  className={({ isActive }) =>
                    `rounded-md px-3 py-1.5 text-sm font-medium ${isActive ? 'bg-ink-700 text-white' : 'text-ink-100 hover:bg-ink-800'}`
                  }
                >
                  {item.label}
                </NavLink>
              ))}
          </nav>
          {session ? (
            <div className="flex items-center gap-3 text-sm">
              <div className="text-right leading-tight">
                <p className="font-medium" data-testid="signed-in-user">
                  {session.user.name}
                </p>
                {session.organisation ? <p className="text-xs text-ink-300">{session.organisation.name}</p> : null}
              </div>
              <Badge tone="muted">{roleLabels[session.user.role]}</Badge>
              <button
                type="button"
                className="rounded-md border border-ink-700 px-3 py-1.5 text-sm text-ink-50 hover:bg-ink-800"
                onClick={() =>
                  signOut.mutate(undefined, { onSettled: () => void navigate(paths.signIn.href(), { replace: true }) })
                }
              >
                Sign out
              </button>
            </div>
          ) : null}
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto w-full max-w-7xl flex-1 px-4 py-6 md:px-6">
        <Outlet />
      </main>
      <footer className="border-t border-ink-100 px-6 py-3 text-center text-xs text-ink-500">
        Measurements on energised circuits are for qualified persons. Headroom gives engineering estimates; local codes
        and the authority having jurisdiction decide.
      </footer>
    </div>
  );
}
