import type { ReactNode } from 'react';
import { Button } from './Button';
import { Dialog, DialogActions } from './Dialog';
import { ErrorNotice } from './Notice';

export interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  onConfirm: () => void;
  onClose: () => void;
  busy?: boolean;
  error?: unknown;
}

/** Asks before a destructive step; the confirm button carries the step's own name. */
export function ConfirmDialog({ open, title, children, confirmLabel, onConfirm, onClose, busy, error }: ConfirmDialogProps) {
  return (
    <Dialog open={open} title={title} onClose={onClose}>
      <div className="text-sm">{children}</div>
      {error ? <ErrorNotice error={error} className="mt-4" /> : null}
      <DialogActions>
        <Button onClick={onClose}>
          Cancel
        </Button>
        <Button variant="danger" onClick={onConfirm} busy={busy}>
          {confirmLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
