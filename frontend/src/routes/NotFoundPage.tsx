import { Link, useLocation } from 'react-router-dom';
import { usePageTitle } from '../lib/usePageTitle';

/** The page for an address that matches no route. */
export default function NotFoundPage() {
  usePageTitle('Page not found');
  const { pathname } = useLocation();
  return (
    <section aria-labelledby="not-found-title" className="max-w-xl py-10">
      <p className="font-mono text-xs tracking-widest text-ink-faint uppercase">404</p>
      <h1 id="not-found-title" className="mt-1 text-2xl font-bold">
        Page not found
      </h1>
      <p className="mt-3 text-sm text-ink-muted">
        There is no page at <code className="font-mono text-ink">{pathname}</code>. The link may be old, or the page was moved.
      </p>
      <Link to="/projects" className="mt-6 inline-block text-sm font-bold text-accent underline underline-offset-4">
        Go to projects
      </Link>
    </section>
  );
}
