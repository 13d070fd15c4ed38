import { concernsText, findingConcerns, type ConcernContent } from '@shared/analysis';
import type { RevisionDiffDto } from '../../api/revisions';

const mm = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });
const deg = new Intl.NumberFormat(undefined, { maximumFractionDigits: 1, signDisplay: 'exceptZero' });

/** What a diff finding concerns, by the names this revision's layout gives them (gone elements are left out). */
function Concerns({ id, content }: { id: string; content: ConcernContent }) {
  const text = concernsText(findingConcerns({ id }, content));
  return text ? <span className="block text-xs text-ink-muted">{text}</span> : null;
}

/** What changed since the previous revision: arms moved (plan distance, turn), added, removed; findings new and gone. */
export function RevisionDiffPanel({ diff, content }: { diff: RevisionDiffDto; content: ConcernContent }) {
  if (!diff.previous) return <p className="text-sm text-ink-muted">First revision of this layout: nothing to compare with.</p>;
  const { arms, findings } = diff;
  const none = !arms.added.length && !arms.removed.length && !arms.moved.length && !findings.added.length && !findings.removed.length;
  return (
    <div className="flex flex-col gap-2 text-sm" data-diff>
      <p className="text-ink-muted">Compared with revision {diff.previous.letter}.</p>
      {none && <p>No arm moved and the findings are the same.</p>}
      <ul className="flex flex-col gap-1">
        {arms.moved.map((a) => (
          <li key={`m${a.id}`}>
            <span className="font-bold">{a.id}</span> moved {mm.format(a.distance)} mm (from {mm.format(a.from[0])}, {mm.format(a.from[1])} to {mm.format(a.to[0])}, {mm.format(a.to[1])})
            {Math.abs(a.yawChange) > 0.01 && <>, turned {deg.format(a.yawChange)}°</>}
          </li>
        ))}
        {arms.added.map((a) => (
          <li key={`a${a.id}`}>
            <span className="font-bold">{a.id}</span> added at {mm.format(a.x)}, {mm.format(a.y)} mm
          </li>
        ))}
        {arms.removed.map((a) => (
          <li key={`r${a.id}`}>
            <span className="font-bold">{a.id}</span> removed (was at {mm.format(a.x)}, {mm.format(a.y)} mm)
          </li>
        ))}
        {findings.added.map((f) => (
          <li key={`fa${f.id}`} className="text-finding-critical">
            New finding: {f.message}
            <Concerns id={f.id} content={content} />
          </li>
        ))}
        {findings.removed.map((f) => (
          <li key={`fr${f.id}`} className="text-accent">
            Gone: {f.message}
            <Concerns id={f.id} content={content} />
          </li>
        ))}
      </ul>
    </div>
  );
}
