import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { isApiError } from '../api/client';
import { useAcceptInvitation, useInvitationToken } from '../api/invitations';
import { Button } from '../components/Button';
import { TextField } from '../components/Field';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { RingfenceMark } from '../components/RingfenceMark';
import { ROLE_LABEL } from '../components/RoleBadge';
import { usePageTitle } from '../lib/usePageTitle';

const MIN_PASSWORD = 10;

/** `/invite/:token` — the one-time invitation link: set name and password, then signed in. Used or expired links say so. */
export default function InvitePage() {
  usePageTitle('Invitation');
  const { token = '' } = useParams();
  const inv = useInvitationToken(token);
  const accept = useAcceptInvitation(token);
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (!name.trim()) return setProblem('Enter your name.');
    if (password.length < MIN_PASSWORD) return setProblem(`Use at least ${MIN_PASSWORD} characters for the password.`);
    setProblem(null);
    try {
      await accept.mutateAsync({ name: name.trim(), password });
      await navigate('/projects', { replace: true });
    } catch {
      /* shown below */
    }
  }

  let body;
  if (inv.isPending) body = <LoadingNotice label="Checking the invitation…" />;
  else if (inv.isError)
    body = (
      <div className="flex flex-col gap-3" data-invitation-refused>
        <h1 className="text-lg font-bold">This invitation cannot be used</h1>
        <ErrorNotice error={inv.error} message={isApiError(inv.error) ? undefined : 'The invitation could not be checked. Try again later.'} />
        <Link to="/sign-in" className="text-sm font-bold text-accent underline underline-offset-4">Go to sign-in</Link>
      </div>
    );
  else
    body = (
      <form onSubmit={onSubmit} className="flex flex-col gap-4" aria-labelledby="invite-title">
        <h1 id="invite-title" className="text-lg font-bold">Welcome to Ringfence</h1>
        <p className="text-sm text-ink-muted">
          You are invited as <strong>{ROLE_LABEL[inv.data.role]}</strong> with the e-mail <strong>{inv.data.email}</strong>. Choose your name and a password.
        </p>
        <TextField label="Your name" value={name} onChange={(e) => setName(e.target.value)} autoComplete="name" />
        <TextField label="Password" type="password" value={password} onChange={(e) => setPassword(e.target.value)} autoComplete="new-password" hint={`At least ${MIN_PASSWORD} characters.`} />
        {problem && <p role="alert" className="text-sm font-bold text-finding-critical">{problem}</p>}
        {accept.isError && <ErrorNotice error={accept.error} />}
        <Button type="submit" variant="primary" busy={accept.isPending}>Create my account</Button>
      </form>
    );

  return (
    <main className="flex min-h-screen items-center justify-center bg-paper px-6">
      <div className="w-full max-w-md">
        <div className="mb-8 flex items-center gap-3">
          <RingfenceMark className="size-9 text-accent" />
          <p className="text-2xl font-bold tracking-tight">Ringfence</p>
        </div>
        <section className="rounded-control border border-rule-strong bg-paper-raised p-6">{body}</section>
      </div>
    </main>
  );
}
