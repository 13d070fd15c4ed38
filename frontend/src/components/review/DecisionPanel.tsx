import { useState, type FormEvent } from 'react';
import { can } from '@shared/policy';
import type { SessionUser } from '../../api/auth';
import { planSheetUrl, useDecideRevision, useReleaseRevision, useRetryReleaseMail, type RevisionDetailDto } from '../../api/revisions';
import { formatDateTime } from '../../lib/format';
import { Button } from '../Button';
import { ErrorNotice } from '../Notice';

/** The decision (reviewer), release and mail state (planner), and who acknowledged receipt. */
export function DecisionPanel({ revision, user }: { revision: RevisionDetailDto; user: SessionUser }) {
  const decide = useDecideRevision(revision.id);
  const release = useReleaseRevision(revision.id);
  const retry = useRetryReleaseMail(revision.id);
  const [comment, setComment] = useState('');
  const [error, setError] = useState<string | null>(null);
  const mayDecide = can(user.role, 'revision.decide') && revision.state === 'submitted';
  const ownWork = revision.submittedBy?.id === user.id;
  const mayRelease = can(user.role, 'revision.release');
  const releaseMail = revision.mail?.filter((m) => m.kind === 'release').at(-1);

  async function onDecide(e: FormEvent, decision: 'sign_off' | 'return') {
    e.preventDefault();
    if (decision === 'return' && !comment.trim()) {
      setError('Say what needs to change before returning it.');
      return;
    }
    setError(null);
    await decide.mutateAsync({ decision, comment }).catch(() => {});
  }

  return (
    <section aria-labelledby="decision-heading" className="flex flex-col gap-3 rounded-control border border-rule bg-paper-raised p-3">
      <h2 id="decision-heading" className="text-sm font-bold">
        Sign-off
      </h2>
      {revision.decidedAt && (
        <p className="text-sm">
          {revision.state === 'returned' ? 'Returned for changes' : 'Signed off'} by <strong>{revision.decidedBy?.name}</strong> on {formatDateTime(revision.decidedAt)}
          {revision.decisionComment && <span className="mt-1 block whitespace-pre-wrap text-ink-muted">“{revision.decisionComment}”</span>}
        </p>
      )}
      {mayDecide && ownWork && <p className="text-sm text-ink-muted">You submitted this revision; another reviewer signs it off.</p>}
      {mayDecide && !ownWork && (
        <form className="flex flex-col gap-2" onSubmit={(e) => onDecide(e, 'sign_off')}>
          <label htmlFor="decision-comment" className="text-xs font-bold">
            Decision note (required to return it for changes)
          </label>
          <textarea id="decision-comment" rows={3} value={comment} onChange={(e) => setComment(e.target.value)} className="rounded-control border border-rule-strong bg-paper px-2 py-1 text-sm" />
          {error && <p role="alert" className="text-sm font-bold text-finding-critical">{error}</p>}
          {decide.isError && <ErrorNotice error={decide.error} />}
          <div className="flex gap-2">
            <Button type="submit" variant="primary" busy={decide.isPending}>
              Sign off revision {revision.letter}
            </Button>
            <Button onClick={(e) => onDecide(e, 'return')} busy={decide.isPending}>
              Return for changes
            </Button>
          </div>
        </form>
      )}
      {revision.state === 'submitted' && !can(user.role, 'revision.decide') && <p className="text-sm text-ink-muted">Waiting for a reviewer’s sign-off.</p>}
      {revision.state === 'signed_off' && mayRelease && (
        <div className="flex flex-col gap-2">
          <p className="text-sm">Releasing stores the plan sheet with this revision for good and e-mails it to the project’s clients.</p>
          {release.isError && <ErrorNotice error={release.error} />}
          <div>
            <Button variant="primary" busy={release.isPending} onClick={() => release.mutate()}>
              Release to the client
            </Button>
          </div>
        </div>
      )}
      {revision.state === 'released' && (
        <div className="flex flex-col gap-1 text-sm">
          <p>
            Released {revision.releasedAt ? formatDateTime(revision.releasedAt) : ''} by {revision.releasedBy?.name ?? '—'} · sheet sha256{' '}
            <code className="text-xs break-all">{revision.planSheetChecksum}</code>
          </p>
          {releaseMail && (
            <p data-mail-status={releaseMail.status}>
              Mail to {releaseMail.to.join(', ') || 'no client'}: <strong>{releaseMail.status}</strong>
              {releaseMail.status === 'failed' && ` (${releaseMail.error}; ${releaseMail.attempts} attempt${releaseMail.attempts === 1 ? '' : 's'})`}
            </p>
          )}
          {releaseMail?.status === 'failed' && mayRelease && (
            <div>
              <Button size="sm" busy={retry.isPending} onClick={() => retry.mutate()}>
                Send the mail again
              </Button>
            </div>
          )}
          <p>
            Received by:{' '}
            {revision.acknowledgements?.length ? revision.acknowledgements.map((a) => `${a.user.name} on ${formatDateTime(a.at)}`).join('; ') : <span className="text-ink-muted">no acknowledgement yet</span>}
          </p>
        </div>
      )}
      <a href={planSheetUrl(revision.id)} target="_blank" rel="noreferrer" className="text-sm font-bold text-accent underline underline-offset-4">
        {revision.state === 'released' ? 'Open the released plan sheet (PDF)' : 'Open a DRAFT plan sheet (PDF)'}
      </a>
    </section>
  );
}
