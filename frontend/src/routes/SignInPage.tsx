import { useForm } from 'react-hook-form';
import { Navigate, useLocation, useSearchParams, type Location } from 'react-router-dom';
import { LoginInput } from '@shared/schemas/user';
import { useLogin, useMe } from '../api/auth';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { RingfenceMark } from '../components/RingfenceMark';
import { labelledResolver } from '../lib/labelledResolver';
import { applyServerErrors } from '../lib/serverErrors';
import { usePageTitle } from '../lib/usePageTitle';

const DEFAULT_PAGE = '/projects';

/** Only a path inside this app is a place to return to (no `//host` or absolute URLs). */
function safeNext(value: string | null | undefined): string | null {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return null;
  if (value.startsWith('/sign-in')) return null;
  return value;
}

function returnPath(state: unknown, next: string | null): string {
  const from = (state as { from?: Partial<Location> } | null)?.from;
  const fromPath = from?.pathname ? `${from.pathname}${from.search ?? ''}` : null;
  return safeNext(fromPath) ?? safeNext(next) ?? DEFAULT_PAGE;
}

/** Sign-in with e-mail and password; afterwards back to where the person was sent from. */
export default function SignInPage() {
  usePageTitle('Sign in');
  const me = useMe();
  const login = useLogin();
  const location = useLocation();
  const [params] = useSearchParams();
  const target = returnPath(location.state, params.get('next'));

  const form = useForm<LoginInput>({
    resolver: labelledResolver(LoginInput),
    defaultValues: { email: '', password: '' },
  });
  const { register, handleSubmit, setError, formState } = form;

  // Signed in (already, or just now): go on to where the person was headed. Right after
  // signing out the old session is still cached for a moment; stay on the form then.
  const signedOut = (location.state as { signedOut?: boolean } | null)?.signedOut === true;
  if (me.data && (!signedOut || login.isSuccess)) return <Navigate to={target} replace />;
  if (me.isPending) return <LoadingNotice label="Checking your session…" className="px-8" />;

  const onSubmit = handleSubmit(async (values) => {
    try {
      await login.mutateAsync(values);
    } catch (error) {
      // 401 (bad credentials), 429 (rate limit) and 400 (fields) all carry the server's message.
      applyServerErrors(error, setError, ['email', 'password']);
    }
  });

  const serverError = formState.errors.root?.server?.message;

  return (
    <main className="flex min-h-screen items-center justify-center bg-paper px-6">
      <div className="w-full max-w-sm">
        <div className="mb-8 flex items-center gap-3">
          <RingfenceMark className="size-9 text-accent" />
          <div>
            <p className="text-2xl font-bold tracking-tight">Ringfence</p>
            <p className="text-sm text-ink-muted">Workcell layouts, reach and sign-off</p>
          </div>
        </div>
        <section aria-labelledby="sign-in-title" className="rounded-control border border-rule-strong bg-paper-raised p-6">
          <h1 id="sign-in-title" className="text-lg font-bold">
            Sign in
          </h1>
          {params.get('next') || (location.state as { from?: unknown } | null)?.from ? (
            <p className="mt-1 text-sm text-ink-muted">Sign in to continue where you were.</p>
          ) : null}
          <form onSubmit={(event) => void onSubmit(event)} noValidate className="mt-5 flex flex-col gap-4">
            {serverError && <ErrorNotice message={serverError} />}
            <TextField
              label="E-mail"
              type="email"
              autoComplete="username"
              autoFocus
              error={formState.errors.email?.message}
              {...register('email')}
            />
            <TextField
              label="Password"
              type="password"
              autoComplete="current-password"
              error={formState.errors.password?.message}
              {...register('password')}
            />
            <Button type="submit" variant="primary" busy={formState.isSubmitting} className="mt-2">
              Sign in
            </Button>
          </form>
        </section>
        <p className="mt-6 text-xs text-ink-faint">
          Accounts are set up by your team's administrator. Ask them if you cannot sign in.
        </p>
      </div>
    </main>
  );
}
