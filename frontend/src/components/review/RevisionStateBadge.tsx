import type { RevisionState } from '../../api/revisions';
import { cn } from '../../lib/cn';
import { REVISION_STATE_LABEL } from '@shared/words';

export const STATE_LABEL: Record<RevisionState, string> = REVISION_STATE_LABEL;

const STATE_CLASS: Record<RevisionState, string> = {
  submitted: 'text-finding-info border-finding-info/50 bg-finding-info-wash',
  returned: 'text-finding-warning border-finding-warning/60 bg-finding-warning-wash',
  signed_off: 'text-accent border-accent/50 bg-accent-wash',
  released: 'text-on-accent border-accent bg-accent',
};

/** The state of a revision as a small tag (text carries it; colour repeats it). */
export function RevisionStateBadge({ state, className }: { state: RevisionState; className?: string }) {
  return (
    <span data-revision-state={state} className={cn('inline-flex h-5 items-center rounded-control border px-1.5 text-[0.6875rem] font-bold tracking-wider uppercase', STATE_CLASS[state], className)}>
      {STATE_LABEL[state]}
    </span>
  );
}
