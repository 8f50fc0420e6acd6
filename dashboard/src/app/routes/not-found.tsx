import { Link } from 'react-router';
import { paths } from '../../lib/paths';

export default function NotFoundPage() {
  return (
    <div className="space-y-2">
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <p className="text-ink-700">
        There is nothing at this address. It may have been deleted, or the link is incomplete.
      </p>
      <Link className="text-ink-700 underline" to={paths.home.href()}>
        Back to the start
      </Link>
    </div>
  );
}
