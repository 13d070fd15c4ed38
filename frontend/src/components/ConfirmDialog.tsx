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
  /** 'danger' (default) for steps that remove something; 'primary' for ones that can be undone. */
  confirmVariant?: 'danger' | 'primary';
}

/** Asks before a destructive step; the confirm button carries the step's own name. */
export function ConfirmDialog({ open, title, children, confirmLabel, onConfirm, onClose, busy, error, confirmVariant = 'danger' }: ConfirmDialogProps) {
  return (
    <Dialog open={open} title={title} onClose={onClose}>
      <div className="text-sm">{children}</div>
      {error ? <ErrorNotice error={error} className="mt-4" /> : null}
      <DialogActions>
        <Button onClick={onClose}>
          Cancel
        </Button>
        <Button variant={confirmVariant} onClick={onConfirm} busy={busy}>
          {confirmLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
