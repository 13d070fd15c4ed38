import { planSheetUrl, useAcknowledgeRevision, type RevisionDetailDto } from '../../api/revisions';
import { formatDateTime } from '../../lib/format';
import { Button } from '../Button';
import { ErrorNotice } from '../Notice';
import { PLANNING_CAUTION } from '../layout/FindingsPanel';
import { SheetViewer } from '../planSheet/SheetViewer';

/** The client's view of a released revision: the plan sheet in the page, download, release date, acknowledge receipt. */
export function ClientRevisionView({ revision }: { revision: RevisionDetailDto }) {
  const ack = useAcknowledgeRevision(revision.id);
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-4 rounded-control border border-rule bg-paper-raised p-3 text-sm">
        <p>
          Released <strong>{revision.releasedAt ? formatDateTime(revision.releasedAt) : '—'}</strong>
        </p>
        <a href={planSheetUrl(revision.id, true)} className="font-bold text-accent underline underline-offset-4" download>
          Download the plan sheet (PDF)
        </a>
        <div className="ml-auto flex items-center gap-3">
          {revision.acknowledgedAt ? (
            <p role="status" className="font-bold text-accent" data-acknowledged>
              You acknowledged receipt on {formatDateTime(revision.acknowledgedAt)}.
            </p>
          ) : (
            <Button variant="primary" busy={ack.isPending} onClick={() => ack.mutate()}>
              Acknowledge receipt
            </Button>
          )}
        </div>
      </div>
      {ack.isError && <ErrorNotice error={ack.error} />}
      <SheetViewer url={planSheetUrl(revision.id)} label={`Plan sheet, revision ${revision.letter}`} />
      <p className="text-xs text-ink-muted">{PLANNING_CAUTION}</p>
    </div>
  );
}
