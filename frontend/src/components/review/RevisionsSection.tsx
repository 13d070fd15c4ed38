import { Link } from 'react-router-dom';
import type { ProjectDetailDto } from '@shared/schemas/project';
import { can } from '@shared/policy';
import { useSessionUser } from '../../api/auth';
import { planSheetUrl, useProjectRevisions } from '../../api/revisions';
import { formatDateTime } from '../../lib/format';
import { EmptyState, ErrorNotice, LoadingNotice } from '../Notice';
import { RevisionStateBadge } from './RevisionStateBadge';

/** The project page's "Revisions" section: every revision for staff, released plan sheets for clients. */
export function RevisionsSection({ project }: { project: ProjectDetailDto }) {
  const user = useSessionUser();
  const staff = can(user.role, 'revision.readDrafts');
  const revisions = useProjectRevisions(project.id);
  if (revisions.isPending) return <LoadingNotice label="Loading revisions…" />;
  if (revisions.isError) return <ErrorNotice error={revisions.error} title="Revisions could not be loaded" />;
  if (!revisions.data.length)
    return (
      <EmptyState title={staff ? 'No revision yet.' : 'No plan sheet has been released to you yet.'}>
        {staff ? <p>A planner submits one from the cell layout editor (“Submit revision”); a reviewer then signs it off or returns it for changes.</p> : <p>You will receive an e-mail when one is released.</p>}
      </EmptyState>
    );
  return (
    <table aria-label="Revisions" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
      <thead>
        <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
          <th scope="col" className="px-3 py-2">Layout</th>
          <th scope="col" className="px-3 py-2">Revision</th>
          <th scope="col" className="px-3 py-2">State</th>
          {staff && <th scope="col" className="px-3 py-2">Submitted</th>}
          {staff && <th scope="col" className="px-3 py-2">Decided</th>}
          <th scope="col" className="px-3 py-2">Released</th>
          <th scope="col" className="px-3 py-2">{staff ? 'Received by client' : 'Your receipt'}</th>
          <th scope="col" className="px-3 py-2"><span className="sr-only">Plan sheet</span></th>
        </tr>
      </thead>
      <tbody>
        {revisions.data.map((r) => (
          <tr key={r.id} className="border-b border-rule last:border-b-0 hover:bg-paper" data-revision={r.letter}>
            <td className="px-3 py-2">{r.layoutName}</td>
            <td className="px-3 py-2 font-bold">
              <Link to={`/projects/${project.id}/revisions/${r.id}`} className="text-accent underline underline-offset-4">
                Revision {r.letter}
              </Link>
            </td>
            <td className="px-3 py-2"><RevisionStateBadge state={r.state} /></td>
            {staff && <td className="px-3 py-2 text-ink-muted">{r.submittedAt ? `${formatDateTime(r.submittedAt)} · ${r.submittedBy?.name ?? ''}` : '—'}</td>}
            {staff && <td className="px-3 py-2 text-ink-muted">{r.decidedAt ? `${formatDateTime(r.decidedAt)} · ${r.decidedBy?.name ?? ''}` : '—'}</td>}
            <td className="px-3 py-2 text-ink-muted">{r.releasedAt ? formatDateTime(r.releasedAt) : '—'}</td>
            <td className="px-3 py-2 text-ink-muted">
              {staff ? (r.acknowledgements?.length ? r.acknowledgements.map((a) => `${a.user.name} (${formatDateTime(a.at)})`).join(', ') : '—') : r.acknowledgedAt ? formatDateTime(r.acknowledgedAt) : 'Not yet'}
            </td>
            <td className="px-3 py-2 text-right">
              {r.state === 'released' && (
                <a href={planSheetUrl(r.id, true)} className="text-sm font-bold text-accent underline underline-offset-4">
                  Download PDF
                </a>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
