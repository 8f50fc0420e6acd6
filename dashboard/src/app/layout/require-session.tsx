import { Navigate, Outlet, useLocation } from 'react-router';
import { paths } from '../../lib/paths';
import { abilitiesOf, useSessionState } from '../../lib/session';
import { useCurrentIdentity } from '../../features/auth/api/me';

/**
 * Pages behind sign-in. Without a session (never signed in, signed out, or the server answered 401),
 * go to sign-in, carrying the current address so sign-in can bring the user back to it.
 */
export function RequireSession() {
  const { session, reason } = useSessionState();
  const location = useLocation();
  useCurrentIdentity(Boolean(session));
  if (!session) {
    const here = `${location.pathname}${location.search}${location.hash}`;
    return <Navigate to={paths.signIn.href(here)} replace state={{ reason }} />;
  }
  return <Outlet />;
}

/** Pages for some roles only (upload for engineers and admins, admin for admins). */
export function RequireRole({ ability }: { ability: 'canEdit' | 'canAdminister' }) {
  const { session } = useSessionState();
  if (!abilitiesOf(session?.user.role)[ability]) {
    return (
      <div role="alert" className="rounded-lg border border-ink-300 bg-white p-6">
        <h1 className="text-xl font-semibold text-ink-900">Not available for your role</h1>
        <p className="mt-1 text-sm text-ink-700">Ask an administrator of your organisation if you need this.</p>
      </div>
    );
  }
  return <Outlet />;
}
