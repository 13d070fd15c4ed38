import { useEffect, useId, useRef, type ReactNode } from 'react';
import { cn } from '../lib/cn';

export interface DialogProps {
  open: boolean;
  title: string;
  /** Called on Escape, on a click on the backdrop and by the dialog's own close controls. */
  onClose: () => void;
  children: ReactNode;
  description?: ReactNode;
  width?: 'md' | 'lg';
}

/**
 * A modal dialog on the native `<dialog>` element: focus stays inside, Escape closes, and focus
 * returns to the control that opened it. Children are mounted only while open, so forms start fresh.
 */
export function Dialog({ open, title, onClose, children, description, width = 'md' }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      dialog.showModal();
      return () => {
        if (dialog.open) dialog.close();
        opener?.focus();
      };
    }
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onCancel={(event) => {
        // Escape: let React state decide, so the dialog and `open` never disagree.
        event.preventDefault();
        onClose();
      }}
      onMouseDown={(event) => {
        if (event.target === ref.current) onClose();
      }}
      className={cn(
        'm-auto rounded-control border border-rule-strong bg-paper-raised p-0 text-ink shadow-[0_8px_28px_rgb(28_34_48/0.18)]',
        width === 'md' ? 'w-[min(32rem,calc(100vw-2rem))]' : 'w-[min(44rem,calc(100vw-2rem))]',
      )}
    >
      {open && (
        <div className="flex flex-col">
          <header className="border-b border-rule px-6 pt-5 pb-3">
            <h2 id={titleId} className="text-lg font-bold">
              {title}
            </h2>
            {description && (
              <div id={descriptionId} className="mt-1 text-sm text-ink-muted">
                {description}
              </div>
            )}
          </header>
          <div className="px-6 py-5">{children}</div>
        </div>
      )}
    </dialog>
  );
}

/** The row of buttons at the foot of a dialog form. */
export function DialogActions({ children }: { children: ReactNode }) {
  return <div className="mt-6 flex justify-end gap-2 border-t border-rule pt-4">{children}</div>;
}
