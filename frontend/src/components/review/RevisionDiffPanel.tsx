import { useId, useMemo, useState } from 'react';
import type { DiffElement, RevisionChangeGroup } from '@shared/schemas/revision';
import { ConcernLookup, concernsText, findingConcerns, type ConcernContent } from '@shared/analysis';
import type { RevisionDiffDto } from '../../api/revisions';
import { Button } from '../Button';
import { SEVERITY_LABEL } from '@shared/words';

/** The sections of the diff, in the order the server groups them; one-of-a-kind parts list their changes directly. */
const SECTIONS: ReadonlyArray<{ element: DiffElement; heading: string; single?: boolean }> = [
  { element: 'project', heading: 'Project', single: true },
  { element: 'layout', heading: 'Cell layout', single: true },
  { element: 'floorPlan', heading: 'Floor plan', single: true },
  { element: 'workHeights', heading: 'Work heights', single: true },
  { element: 'arm', heading: 'Arms' },
  { element: 'armModel', heading: 'Arm models' },
  { element: 'boundary', heading: 'Boundaries' },
  { element: 'workPoint', heading: 'Work points' },
  { element: 'other', heading: 'Other', single: true },
];

/** Elements listed before "Show all" (a re-imported list of work points can change thousands). */
const FIRST = 30;

function ChangeList({ group }: { group: RevisionChangeGroup }) {
  return (
    <ul className="ml-4 list-disc">
      {group.changes.map((c, i) => (
        <li key={`${c.field}:${i}`} data-change-field={c.field}>
          {c.text}
        </li>
      ))}
    </ul>
  );
}

function Section({ heading, groups, single }: { heading: string; groups: RevisionChangeGroup[]; single?: boolean }) {
  const id = useId();
  const [all, setAll] = useState(false);
  const shown = all ? groups : groups.slice(0, FIRST);
  return (
    <section aria-labelledby={id} data-diff-section={groups[0].element}>
      <h3 id={id} className="text-xs font-bold tracking-wide text-ink-muted uppercase">
        {heading}
        {!single && ` (${groups.length})`}
        {single && groups[0].status !== 'changed' && ` — ${groups[0].status}`}
      </h3>
      {single ? (
        <ChangeList group={groups[0]} />
      ) : (
        <ul className="flex flex-col gap-1">
          {shown.map((g) => (
            <li key={g.id ?? g.title} data-diff-group={`${g.element}:${g.id ?? ''}`}>
              <span className="font-bold">{g.title}</span>
              {g.status !== 'changed' && <span className={g.status === 'added' ? 'text-accent' : 'text-finding-critical'}> — {g.status}</span>}
              <ChangeList group={g} />
            </li>
          ))}
        </ul>
      )}
      {!single && groups.length > FIRST && (
        <Button size="sm" variant="quiet" onClick={() => setAll((v) => !v)} aria-expanded={all}>
          {all ? `Show the first ${FIRST}` : `Show all ${groups.length} ${heading.toLowerCase()}`}
        </Button>
      )}
    </section>
  );
}

/** What a diff finding concerns, by the names this revision's layout gives them (gone elements are left out). */
function Concerns({ id, content }: { id: string; content: ConcernLookup }) {
  const text = concernsText(findingConcerns({ id }, content));
  return text ? <span className="block text-xs text-ink-muted">{text}</span> : null;
}

/**
 * What changed since the previous revision, grouped by element: project and cell layout, floor plan,
 * work heights, arms, arm models, boundaries (fences, access openings, keep-outs, operator areas),
 * work points; then findings new, gone and changed.
 */
export function RevisionDiffPanel({ diff, content }: { diff: RevisionDiffDto; content: ConcernContent }) {
  const lookup = useMemo(() => new ConcernLookup(content), [content]);
  if (!diff.previous) return <p className="text-sm text-ink-muted">First revision of this layout: nothing to compare with.</p>;
  const { groups, findings } = diff;
  const noFindings = !findings.added.length && !findings.removed.length && !findings.changed.length;
  return (
    <div className="flex flex-col gap-3 text-sm" data-diff>
      <p className="text-ink-muted">Compared with revision {diff.previous.letter}.</p>
      {!groups.length && noFindings && (
        <p data-diff-empty>
          No changes: the cell layout, its arm models, boundaries, work points and floor plan are as in revision {diff.previous.letter}, and so are the findings.
        </p>
      )}
      {SECTIONS.map((s) => {
        const mine = groups.filter((g) => g.element === s.element);
        return mine.length ? <Section key={s.element} heading={s.heading} groups={mine} single={s.single} /> : null;
      })}
      {!noFindings && (
        <section aria-labelledby="diff-findings" data-diff-section="findings">
          <h3 id="diff-findings" className="text-xs font-bold tracking-wide text-ink-muted uppercase">
            Findings
          </h3>
          <ul className="flex flex-col gap-1">
            {findings.added.map((f) => (
              <li key={`fa${f.id}`} className="text-finding-critical">
                New finding: {f.message}
                <Concerns id={f.id} content={lookup} />
              </li>
            ))}
            {findings.removed.map((f) => (
              <li key={`fr${f.id}`} className="text-accent">
                Gone: {f.message}
                <Concerns id={f.id} content={lookup} />
              </li>
            ))}
            {findings.changed.map((f) => (
              <li key={`fc${f.id}`}>
                Changed: {f.message}
                <Concerns id={f.id} content={lookup} />
                <span className="block text-ink-muted">
                  Was{f.before.severity !== f.severity ? ` ${SEVERITY_LABEL[f.before.severity].toLowerCase()}` : ''}: {f.before.message}
                </span>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
