import { Link } from 'react-router-dom';

/** The page a signed-in person sees when their role may not open what they asked for. */
export function NotAllowed() {
  return (
    <section aria-labelledby="not-allowed-title" className="max-w-xl py-10">
      <p className="font-mono text-xs tracking-widest text-ink-faint uppercase">403</p>
      <h1 id="not-allowed-title" className="mt-1 text-2xl font-bold">
        Not allowed
      </h1>
      <p className="mt-3 text-sm text-ink-muted">
        Your role does not give access to this page. If you need it, ask an administrator of your team to change your role.
      </p>
      <Link to="/projects" className="mt-6 inline-block text-sm font-bold text-accent underline underline-offset-4">
        Back to projects
      </Link>
    </section>
  );
}
