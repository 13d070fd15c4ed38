import { useCallback, useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { checkedFloorOf, type Finding } from '@shared/analysis';
import { can } from '@shared/policy';
import { useSessionUser } from '../api/auth';
import { isApiError } from '../api/client';
import { useProject } from '../api/projects';
import { useAddComment, useResolveComment, useRevision, type ReviewCommentDto } from '../api/revisions';
import { Button } from '../components/Button';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { ClientRevisionView } from '../components/review/ClientRevisionView';
import { DecisionPanel } from '../components/review/DecisionPanel';
import { CommentItem, FindingComments } from '../components/review/FindingComments';
import { ReviewPlan } from '../components/review/ReviewPlan';
import { RevisionDiffPanel } from '../components/review/RevisionDiffPanel';
import { RevisionStateBadge } from '../components/review/RevisionStateBadge';
import NotFoundPage from './NotFoundPage';
import { parseId } from '../lib/routeId';
import { usePageTitle } from '../lib/usePageTitle';

const mm = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });

/** `/projects/:id/revisions/:revisionId` — review of one revision (staff) or its released plan sheet (client). */
export default function ReviewPage() {
  const params = useParams();
  const projectId = parseId(params.id);
  const revisionId = parseId(params.revisionId);
  if (projectId === null || revisionId === null) return <NotFoundPage />;
  return <ReviewLoader key={revisionId} projectId={projectId} revisionId={revisionId} />;
}

function ReviewLoader({ projectId, revisionId }: { projectId: number; revisionId: number }) {
  const user = useSessionUser();
  const rev = useRevision(revisionId);
  const project = useProject(projectId);
  usePageTitle(rev.data ? `Revision ${rev.data.letter}` : 'Revision', rev.data?.layoutName, project.data?.name);
  const addComment = useAddComment(revisionId);
  const resolve = useResolveComment();
  const [selected, setSelected] = useState<Finding | null>(null);
  const [draftPin, setDraftPin] = useState<{ x: number; y: number } | null>(null);
  const [pinBody, setPinBody] = useState('');
  const onPick = useCallback((p: { x: number; y: number }) => setDraftPin(p), []);

  if (rev.isPending) return <LoadingNotice label="Loading the revision…" />;
  if (rev.isError || rev.data.projectId !== projectId) {
    return (
      <div className="flex max-w-xl flex-col gap-4 py-6">
        <h1 className="text-2xl font-bold">{rev.isError && !isApiError(rev.error, 404) ? 'The revision could not be loaded' : 'Revision not found'}</h1>
        {rev.isError && <ErrorNotice error={rev.error} />}
        <Link to={`/projects/${projectId}#revisions`} className="text-sm font-bold text-accent underline underline-offset-4">
          Back to the project
        </Link>
      </div>
    );
  }
  const r = rev.data;
  const header = (
    <PageHeader
      eyebrow={
        <span className="flex gap-1.5">
          <Link to="/projects" className="hover:text-ink">Projects</Link>
          <span aria-hidden>/</span>
          <Link to={`/projects/${projectId}#revisions`} className="hover:text-ink">{project.data?.name ?? r.snapshot?.project.name ?? 'Project'}</Link>
        </span>
      }
      title={`${r.layoutName} — revision ${r.letter}`}
      lead={
        <span className="flex items-center gap-2">
          <RevisionStateBadge state={r.state} />
          {r.submittedAt && <span>submitted by {r.submittedBy?.name ?? '—'}</span>}
          {r.checksum && <span className="font-mono text-xs" title="sha256 of the frozen snapshot">snapshot {r.checksum.slice(0, 12)}…</span>}
        </span>
      }
    />
  );
  if (!can(user.role, 'revision.readDrafts') || !r.snapshot) {
    return (
      <>
        {header}
        <ClientRevisionView revision={r} />
      </>
    );
  }

  const writable = can(user.role, 'comment.write') && r.state !== 'released';
  const spotComments = (r.comments ?? []).filter((c) => c.point);
  const onResolve = writable ? (c: ReviewCommentDto) => resolve.mutate({ id: c.id, resolved: !c.resolved }) : undefined;

  async function submitPin(e: FormEvent) {
    e.preventDefault();
    if (!draftPin || !pinBody.trim()) return;
    await addComment.mutateAsync({ body: pinBody.trim(), point: draftPin }).catch(() => {});
    setPinBody('');
    setDraftPin(null);
  }

  return (
    <>
      {header}
      <div className="grid grid-cols-[minmax(0,1fr)_26rem] gap-4">
        <div className="flex min-w-0 flex-col gap-3">
          <div className="flex h-[min(70vh,44rem)] flex-col">
            <ReviewPlan snapshot={r.snapshot} selectedFinding={selected} pins={spotComments} draftPin={draftPin} onPick={writable ? onPick : undefined} />
          </div>
          {writable && <p className="text-xs text-ink-muted">Click the plan to pin a comment to a spot.</p>}
          {draftPin && writable && (
            <form onSubmit={submitPin} className="flex items-start gap-2 rounded-control border border-accent bg-paper-raised p-2" aria-label="Comment on a spot">
              <label htmlFor="pin-body" className="shrink-0 pt-1 text-xs font-bold">
                At x {mm.format(draftPin.x)} mm, y {mm.format(draftPin.y)} mm
              </label>
              <textarea id="pin-body" rows={2} value={pinBody} onChange={(e) => setPinBody(e.target.value)} className="flex-1 rounded-control border border-rule-strong bg-paper px-2 py-1 text-sm" />
              <Button type="submit" size="sm" variant="primary" busy={addComment.isPending} disabled={!pinBody.trim()}>Pin comment</Button>
              <Button size="sm" variant="quiet" onClick={() => setDraftPin(null)}>Cancel</Button>
            </form>
          )}
          {addComment.isError && <ErrorNotice error={addComment.error} />}
          {spotComments.length > 0 && (
            <section aria-labelledby="spot-comments">
              <h2 id="spot-comments" className="mb-1 text-sm font-bold">Comments on the plan</h2>
              <ol className="flex flex-col gap-1">
                {spotComments.map((c, i) => (
                  <CommentItem key={c.id} c={c} onResolve={onResolve} label={`${i + 1} · x ${mm.format(c.point!.x)}, y ${mm.format(c.point!.y)}`} />
                ))}
              </ol>
            </section>
          )}
          <section aria-labelledby="diff-heading" className="rounded-control border border-rule bg-paper-raised p-3">
            <h2 id="diff-heading" className="mb-1 text-sm font-bold">Changes since the previous revision</h2>
            {r.diff && <RevisionDiffPanel diff={r.diff} content={r.snapshot.layout.content} />}
          </section>
        </div>
        <aside className="flex min-w-0 flex-col gap-4" aria-label="Sign-off and findings">
          <DecisionPanel revision={r} user={user} />
          <FindingComments
            findings={r.snapshot.analysis.findings}
            content={r.snapshot.layout.content}
            floor={checkedFloorOf(r.snapshot.floorPlan?.layers)}
            comments={r.comments ?? []}
            history={r.history ?? []}
            selectedId={selected?.id ?? null}
            onSelect={(f) => setSelected((s) => (s?.id === f.id ? null : f))}
            onComment={writable ? (findingId, body) => addComment.mutateAsync({ body, findingId }) : undefined}
            onResolve={onResolve}
          />
        </aside>
      </div>
    </>
  );
}
