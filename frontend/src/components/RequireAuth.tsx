import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { can, type Action } from '@shared/policy';
import { SessionUserContext, useMe, useSessionUser } from '../api/auth';
import { Button } from './Button';
import { ErrorNotice, LoadingNotice } from './Notice';
import { NotAllowed } from './NotAllowed';

/** The path to come back to after signing in (`?next=`), from a location inside the app. */
export function signInPath(pathname: string, search = ''): string {
  const next = `${pathname}${search}`;
  return next === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(next)}`;
}

/**
 * Renders its children only for a signed-in person; anyone else goes to sign-in and comes back
 * here afterwards (`?next=` and router state both carry the way back).
 */
export function RequireAuth({ children }: { children: ReactNode }) {
  const me = useMe();
  const location = useLocation();

  if (me.isPending) return <LoadingNotice label="Checking your session…" className="px-8" />;
  if (me.isError) {
    return (
      <main className="mx-auto max-w-xl px-8 py-16">
        <ErrorNotice
          title="Ringfence could not check your session"
          error={me.error}
          action={
            <Button size="sm" onClick={() => void me.refetch()}>
              Try again
            </Button>
          }
        />
      </main>
    );
  }
  if (!me.data) {
    return <Navigate to={signInPath(location.pathname, location.search)} state={{ from: location }} replace />;
  }
  return <SessionUserContext.Provider value={me.data}>{children}</SessionUserContext.Provider>;
}

/** Renders its children only when the signed-in role may perform `action`; otherwise a "not allowed" page. */
export function RequirePermission({ action, children }: { action: Action; children: ReactNode }) {
  const user = useSessionUser();
  if (!can(user.role, action)) return <NotAllowed />;
  return <>{children}</>;
}
