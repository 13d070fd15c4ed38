import { useState } from 'react';
import { Button } from '../Button';
import { Dialog, DialogActions } from '../Dialog';
import { ErrorNotice } from '../Notice';

export interface ConflictDialogProps {
  open: boolean;
  onReloadTheirs(): Promise<void>;
  onKeepMineAsCopy(): Promise<void>;
  /** Closing without choosing leaves the editor read-only until a choice is made. */
  onClose(): void;
}

/** Someone saved this layout after it was opened here: take theirs, or keep these edits as a new layout. */
export function ConflictDialog({ open, onReloadTheirs, onKeepMineAsCopy, onClose }: ConflictDialogProps) {
  const [busy, setBusy] = useState<'theirs' | 'copy' | null>(null);
  const [error, setError] = useState<unknown>(null);
  async function run(which: 'theirs' | 'copy') {
    setBusy(which);
    setError(null);
    try {
      await (which === 'theirs' ? onReloadTheirs() : onKeepMineAsCopy());
    } catch (err) {
      setError(err);
    } finally {
      setBusy(null);
    }
  }
  return (
    <Dialog open={open} title="This cell layout was changed elsewhere" onClose={onClose} description="Someone saved a newer version while you were editing, so your latest edits were not saved over it.">
      <p className="text-sm">
        <strong>Reload theirs</strong> shows the saved version and drops your unsaved edits. <strong>Keep mine as a copy</strong> saves your version as a new cell layout of this project and opens it.
      </p>
      {error ? <ErrorNotice error={error} className="mt-4" /> : null}
      <DialogActions>
        <Button onClick={() => void run('copy')} busy={busy === 'copy'} disabled={busy !== null}>
          Keep mine as a copy
        </Button>
        <Button variant="primary" onClick={() => void run('theirs')} busy={busy === 'theirs'} disabled={busy !== null}>
          Reload theirs
        </Button>
      </DialogActions>
    </Dialog>
  );
}
