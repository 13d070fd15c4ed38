import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useSubmitRevision } from '../../api/revisions';
import { Button } from '../Button';
import { Dialog, DialogActions } from '../Dialog';
import { ErrorNotice } from '../Notice';

/** "Submit revision" for planners: freezes the saved layout as the next revision and opens its review page. */
export function SubmitRevisionButton({ projectId, layoutId }: { projectId: number; layoutId: number }) {
  const submit = useSubmitRevision(layoutId);
  const navigate = useNavigate();
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button variant="primary" onClick={() => { submit.reset(); setOpen(true); }}>
        Submit revision
      </Button>
      <Dialog open={open} title="Submit a revision for review?" onClose={() => setOpen(false)}>
        <p className="text-sm">
          The cell layout as last saved, its findings, the floor plan and the arm models are frozen into the next revision. Reviewers are told by
          e-mail. Later edits go into a new revision.
        </p>
        {submit.isError && <ErrorNotice error={submit.error} className="mt-4" />}
        <DialogActions>
          <Button onClick={() => setOpen(false)}>Cancel</Button>
          <Button
            variant="primary"
            busy={submit.isPending}
            onClick={async () => {
              const res = await submit.mutateAsync().catch(() => null);
              if (!res?.revision) return;
              setOpen(false);
              await navigate(`/projects/${projectId}/revisions/${res.revision.id}`);
            }}
          >
            Freeze and submit
          </Button>
        </DialogActions>
      </Dialog>
    </>
  );
}
