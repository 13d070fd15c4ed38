import { memo, useMemo, useState } from 'react';
import { ConcernLookup, concernsText, findingConcerns, noFindingsSentence, type CheckedFloor, type ConcernContent, type Finding, type Severity } from '@shared/analysis';
import { CAUTION_TEXT } from '@shared/safety';
import { cn } from '../../lib/cn';

const SEVERITY_TEXT: Record<Severity, string> = { critical: 'Critical', warning: 'Warning', info: 'Note' };
const SEVERITY_CLASS: Record<Severity, string> = {
  critical: 'text-finding-critical',
  warning: 'text-finding-warning',
  info: 'text-finding-info',
};
const SEVERITY_WASH: Record<Severity, string> = {
  critical: 'bg-finding-critical-wash',
  warning: 'bg-finding-warning-wash',
  info: 'bg-finding-info-wash',
};

/** The caution every findings list carries (one wording for every output: shared/safety/cautions.ts). */
export const PLANNING_CAUTION = CAUTION_TEXT;

/** The sentence of a finding and, under it, the elements it concerns by their names (never the finding's id). */
export function FindingText({ finding, content }: { finding: Finding; content: ConcernContent | ConcernLookup }) {
  const concerns = concernsText(findingConcerns(finding, content));
  return (
    <span className="min-w-0 flex-1">
      <span data-finding-message>{finding.message}</span>
      {concerns && (
        <span className="mt-0.5 block text-[0.6875rem] text-ink-muted" data-concerns>
          {concerns}
        </span>
      )}
    </span>
  );
}

/** Severity mark: octagon (critical), triangle (warning), circle (note); shape and colour both carry it. */
export function SeverityIcon({ severity, className }: { severity: Severity; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" width="16" height="16" aria-hidden className={cn('shrink-0', SEVERITY_CLASS[severity], className)} data-severity={severity}>
      {severity === 'critical' && <path d="M5 1h6l4 4v6l-4 4H5l-4-4V5z" fill="currentColor" />}
      {severity === 'warning' && <path d="M8 1.5 15 14.5H1z" fill="currentColor" />}
      {severity === 'info' && <circle cx="8" cy="8" r="6.5" fill="currentColor" />}
      <path d={severity === 'info' ? 'M8 7v4.5M8 4.6v.1' : 'M8 5v4.5M8 11.6v.1'} stroke="#fff" strokeWidth="1.8" strokeLinecap="round" />
    </svg>
  );
}

export interface FindingsPanelProps {
  findings: readonly Finding[] | null;
  /** The layout the findings are about: names the arms, boundaries and work points each concerns. */
  content: ConcernContent;
  /** The floor plan's layer roles as the check list reads them; null without a floor plan. */
  floor: CheckedFloor | null;
  selectedId: string | null;
  onPick(f: Finding): void;
  /** True while the shown findings belong to an older input than the one on screen. */
  busy: boolean;
  error: string | null;
  timingMs: number | null;
}

/** Findings shown at first, and added per "Show more". */
export const FINDINGS_PAGE = 200;

/** One finding of the list; unchanged findings keep their identity between results, so they are not drawn again. */
const FindingRow = memo(function FindingRow({ finding: f, lookup, selected, onPick }: { finding: Finding; lookup: ConcernLookup; selected: boolean; onPick(f: Finding): void }) {
  return (
    <li className="border-b border-rule last:border-b-0">
      <button
        type="button"
        onClick={() => onPick(f)}
        aria-pressed={selected}
        data-finding={f.id}
        data-kind={f.kind}
        className={cn('flex w-full items-start gap-2 px-3 py-2 text-left text-sm hover:bg-paper', selected && SEVERITY_WASH[f.severity])}
      >
        <SeverityIcon severity={f.severity} className="mt-0.5" />
        <span className="sr-only">{SEVERITY_TEXT[f.severity]}:</span>
        <FindingText finding={f} content={lookup} />
      </button>
    </li>
  );
});

/** The live findings: severity, message, what each concerns; a click selects the arms involved and shows the spot. */
export function FindingsPanel({ findings, content, floor, selectedId, onPick, busy, error, timingMs }: FindingsPanelProps) {
  const counts = { critical: 0, warning: 0, info: 0 } as Record<Severity, number>;
  for (const f of findings ?? []) counts[f.severity]++;
  const lookup = useMemo(() => new ConcernLookup(content), [content]);
  // Long lists (thousands of unreached points on a large layout) show a page at a time; the
  // selected finding is always among those shown.
  const [limit, setLimit] = useState(FINDINGS_PAGE);
  const selectedAt = selectedId && findings ? findings.findIndex((f) => f.id === selectedId) : -1;
  const upto = Math.max(limit, selectedAt + 1);
  return (
    <section aria-labelledby="findings-heading" className="flex min-h-0 flex-col rounded-control border border-rule bg-paper-raised">
      <header className="flex items-baseline gap-2 border-b border-rule px-3 py-2">
        <h2 id="findings-heading" className="text-sm font-bold">
          Findings
        </h2>
        {findings && (
          <span className="text-xs text-ink-muted tabular-nums" aria-live="polite">
            {counts.critical} critical · {counts.warning} warnings · {counts.info} notes
          </span>
        )}
        <span className={cn('ml-auto text-xs text-ink-faint tabular-nums', busy && 'text-ink-muted')} data-analysis-state={busy ? 'running' : 'idle'}>
          {busy ? 'updating…' : timingMs !== null ? `${timingMs.toFixed(0)} ms` : ''}
        </span>
      </header>
      {error && (
        <p role="alert" className="border-b border-rule bg-finding-critical-wash px-3 py-2 text-xs text-finding-critical">
          The analysis stopped: {error}
        </p>
      )}
      <ul aria-label="Findings" className="min-h-0 flex-1 overflow-y-auto">
        {findings === null && !error && <li className="px-3 py-3 text-sm text-ink-muted">Working out reach and findings…</li>}
        {findings?.length === 0 && (
          <li className="px-3 py-3 text-sm text-ink-muted" data-no-findings>
            {noFindingsSentence(content, floor)}
          </li>
        )}
        {findings?.slice(0, upto).map((f) => (
          <FindingRow key={f.id} finding={f} lookup={lookup} selected={f.id === selectedId} onPick={onPick} />
        ))}
        {findings && findings.length > upto && (
          <li className="px-3 py-2">
            <button type="button" className="text-xs font-bold text-accent underline-offset-2 hover:underline" onClick={() => setLimit(upto + FINDINGS_PAGE)} data-more-findings>
              Show {Math.min(FINDINGS_PAGE, findings.length - upto)} more ({findings.length - upto} not shown)
            </button>
          </li>
        )}
      </ul>
      <footer className="border-t border-rule bg-paper-sunk px-3 py-2 text-[11px] leading-snug text-ink-muted" data-caution>
        {PLANNING_CAUTION}
      </footer>
    </section>
  );
}
