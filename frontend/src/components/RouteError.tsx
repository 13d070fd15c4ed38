import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { errorMessage } from '../api/client';

/** What a page shows when it failed to load or threw while rendering — never a blank page. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : errorMessage(error);
  return (
    <section role="alert" aria-labelledby="route-error-title" className="mx-auto max-w-xl px-6 py-12">
      <h1 id="route-error-title" className="text-2xl font-bold">
        This page could not be shown
      </h1>
      <p className="mt-3 rounded-control border-l-4 border-finding-critical bg-finding-critical-wash px-4 py-3 text-sm">{message}</p>
      <p className="mt-4 text-sm text-ink-muted">
        Reload the page to try again. If a new version of Ringfence was just installed, reloading fetches it.
      </p>
      <div className="mt-6 flex gap-4 text-sm font-bold">
        <button type="button" onClick={() => window.location.reload()} className="text-accent underline underline-offset-4">
          Reload
        </button>
        <Link to="/projects" className="text-accent underline underline-offset-4">
          Back to projects
        </Link>
      </div>
    </section>
  );
}
