import { useId, useMemo, useState, type FormEvent } from 'react';
import { ConcernLookup, noFindingsSentence, type CheckedFloor, type ConcernContent, type Finding } from '@shared/analysis';
import type { ReviewCommentDto } from '../../api/revisions';
import { formatDateTime } from '../../lib/format';
import { cn } from '../../lib/cn';
import { Button } from '../Button';
import { FindingText, PLANNING_CAUTION, SeverityIcon } from '../layout/FindingsPanel';

export interface FindingCommentsProps {
  findings: readonly Finding[];
  /** The revision's layout: names what each finding concerns. */
  content: ConcernContent;
  /** The frozen floor plan's layer roles as the check list reads them; null without a floor plan. */
  floor: CheckedFloor | null;
  comments: readonly ReviewCommentDto[];
  /** Comments of earlier revisions, matched to findings by their stable id. */
  history: readonly ReviewCommentDto[];
  selectedId: string | null;
  onSelect(f: Finding): void;
  /** Absent when comments are read-only (released, or the role may not comment). */
  onComment?: (findingId: string, body: string) => Promise<unknown>;
  onResolve?: (c: ReviewCommentDto) => void;
}

/** One comment line: author, time, body, resolve toggle. */
export function CommentItem({ c, onResolve, label }: { c: ReviewCommentDto; onResolve?: (c: ReviewCommentDto) => void; label?: string }) {
  return (
    <li className={cn('rounded-control border border-rule bg-paper px-2.5 py-1.5 text-sm', c.resolved && 'opacity-70')} data-comment={c.id}>
      <div className="flex items-baseline gap-2 text-xs text-ink-muted">
        {label && <span className="font-bold text-ink">{label}</span>}
        <span className="font-bold">{c.author?.name ?? 'Former user'}</span>
        <span>{formatDateTime(c.createdAt)}</span>
        {c.resolved && <span className="font-bold text-accent">resolved</span>}
        {onResolve && (
          <button type="button" className="ml-auto font-bold text-accent underline underline-offset-2" onClick={() => onResolve(c)}>
            {c.resolved ? 'Reopen' : 'Mark resolved'}
          </button>
        )}
      </div>
      <p className="mt-0.5 whitespace-pre-wrap">{c.body}</p>
    </li>
  );
}

function CommentBox({ findingId, about, onComment }: { findingId: string; about: string; onComment: (id: string, body: string) => Promise<unknown> }) {
  const [body, setBody] = useState('');
  const [busy, setBusy] = useState(false);
  const id = useId();
  async function submit(e: FormEvent) {
    e.preventDefault();
    if (!body.trim()) return;
    setBusy(true);
    try {
      await onComment(findingId, body.trim());
      setBody('');
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={submit} className="mt-1.5 flex items-start gap-2">
      <label className="sr-only" htmlFor={id}>
        Comment on: {about}
      </label>
      <textarea
        id={id}
        rows={2}
        value={body}
        onChange={(e) => setBody(e.target.value)}
        placeholder="Comment on this finding…"
        className="min-h-9 flex-1 rounded-control border border-rule-strong bg-paper-raised px-2 py-1 text-sm"
      />
      <Button type="submit" size="sm" busy={busy} disabled={!body.trim()}>
        Comment
      </Button>
    </form>
  );
}

/** The revision's findings, each with its comments, a comment box, and what was said about it in earlier revisions. */
export function FindingComments({ findings, content, floor, comments, history, selectedId, onSelect, onComment, onResolve }: FindingCommentsProps) {
  const lookup = useMemo(() => new ConcernLookup(content), [content]);
  return (
    <section aria-labelledby="review-findings" className="flex flex-col gap-2">
      <h2 id="review-findings" className="text-sm font-bold">
        Findings ({findings.length})
      </h2>
      <p className="text-xs text-ink-muted">{PLANNING_CAUTION}</p>
      {findings.length === 0 && (
        <p className="text-sm text-ink-muted" data-no-findings>
          {noFindingsSentence(content, floor)}
        </p>
      )}
      <ul className="flex flex-col gap-2">
        {findings.map((f) => {
          const mine = comments.filter((c) => c.findingId === f.id);
          const before = history.filter((c) => c.findingId === f.id);
          return (
            <li key={f.id} data-finding={f.id} className={cn('rounded-control border bg-paper-raised p-2.5', selectedId === f.id ? 'border-accent' : 'border-rule')}>
              <button type="button" onClick={() => onSelect(f)} className="flex w-full items-start gap-2 text-left text-sm">
                <SeverityIcon severity={f.severity} className="mt-0.5" />
                <FindingText finding={f} content={lookup} />
              </button>
              {before.length > 0 && (
                <details className="mt-1.5" open>
                  <summary className="cursor-pointer text-xs font-bold text-ink-muted">Said in earlier revisions ({before.length})</summary>
                  <ul className="mt-1 flex flex-col gap-1" aria-label="Earlier comments on this finding">
                    {before.map((c) => (
                      <CommentItem key={c.id} c={c} label={`Rev. ${c.revisionLetter ?? '?'}`} />
                    ))}
                  </ul>
                </details>
              )}
              {mine.length > 0 && (
                <ul className="mt-1.5 flex flex-col gap-1" aria-label="Comments on this finding">
                  {mine.map((c) => (
                    <CommentItem key={c.id} c={c} onResolve={onResolve} />
                  ))}
                </ul>
              )}
              {onComment && <CommentBox findingId={f.id} about={f.message} onComment={onComment} />}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
