import { useQueryClient } from '@tanstack/react-query';
import { NavLink, Outlet, useNavigate, useNavigation } from 'react-router-dom';
import { can } from '@shared/policy';
import { forgetSession, useLogout, useSessionUser } from '../api/auth';
import { cn } from '../lib/cn';
import { NAV } from '../routes/nav';
import { Button } from './Button';
import { RingfenceMark } from './RingfenceMark';
import { RoleBadge } from './RoleBadge';

/** The frame around every signed-in page: product name, main navigation, who is signed in, sign-out. */
export function AppFrame() {
  const user = useSessionUser();
  const navigation = useNavigation();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const logout = useLogout();

  async function signOut() {
    try {
      await logout.mutateAsync();
    } finally {
      // Leave the guarded pages first, then forget the person (even when the server could not be
      // reached), so the guard never sees the user vanish and adds a `?next=` back to this page.
      await navigate('/sign-in', { replace: true, state: { signedOut: true } });
      forgetSession(queryClient);
    }
  }

  const items = NAV.filter((item) => !item.requires || can(user.role, item.requires));

  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:bg-paper-raised focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="border-b border-ink/80 bg-paper-raised">
        <div className="mx-auto flex h-14 max-w-7xl items-center gap-8 px-6">
          <NavLink to="/projects" className="flex items-center gap-2 text-ink" aria-label="Ringfence — projects">
            <RingfenceMark className="size-6 text-accent" />
            <span className="text-lg font-bold tracking-tight">Ringfence</span>
          </NavLink>
          <nav aria-label="Main" className="flex h-full items-stretch gap-1">
            {items.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                className={({ isActive }) =>
                  cn(
                    'flex items-center border-b-2 px-3 text-sm font-bold',
                    isActive ? 'border-accent text-ink' : 'border-transparent text-ink-muted hover:text-ink',
                  )
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3" aria-label="Signed in as">
            <div className="flex flex-col items-end leading-tight">
              <span className="text-sm font-bold" data-testid="signed-in-name">
                {user.name}
              </span>
              <span className="text-xs text-ink-muted">{user.email}</span>
            </div>
            <RoleBadge role={user.role} />
            <Button size="sm" variant="quiet" onClick={() => void signOut()} busy={logout.isPending}>
              Sign out
            </Button>
          </div>
        </div>
        <div
          aria-hidden
          className={cn('h-0.5 bg-accent transition-opacity', navigation.state === 'idle' ? 'opacity-0' : 'animate-pulse opacity-100')}
        />
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-6 py-8">
        <Outlet />
      </main>
    </div>
  );
}
