import { Link } from 'react-router';
import { paths } from '../../lib/paths';

export function NotFoundPage() {
  return (
    <div className="space-y-2">
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <Link className="text-ink-700 underline" to={paths.home.href()}>
        Back to the start
      </Link>
    </div>
  );
}
