import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { paths } from '../../lib/paths';

/** Last line of defence: a page that failed to load (a lost network, a new deployment) or crashed. */
export function RouteError() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';
  return (
    <main id="main" className="mx-auto max-w-xl space-y-3 p-10">
      <h1 className="text-2xl font-semibold text-ink-900">This page could not be shown</h1>
      <p className="text-ink-700">{detail}</p>
      <p className="text-sm text-ink-500">Reloading usually helps after an update of Headroom.</p>
      <div className="flex gap-3">
        <button
          type="button"
          className="rounded-md bg-ink-800 px-3 py-2 text-sm text-white"
          onClick={() => window.location.reload()}
        >
          Reload
        </button>
        <Link className="rounded-md px-3 py-2 text-sm text-ink-800 underline" to={paths.home.href()}>
          Back to the start
        </Link>
      </div>
    </main>
  );
}
