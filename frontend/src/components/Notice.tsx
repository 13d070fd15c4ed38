import type { ReactNode } from 'react';
import { errorMessage } from '../api/client';
import { cn } from '../lib/cn';

/** Shows an error's message (the API's own wording for an ApiError) as an alert. */
export function ErrorNotice({
  error,
  message,
  title,
  className,
  action,
}: {
  error?: unknown;
  /** Shown instead of the error's own message. */
  message?: string;
  title?: string;
  className?: string;
  action?: ReactNode;
}) {
  return (
    <div
      role="alert"
      className={cn(
        'rounded-control border border-finding-critical/40 border-l-4 border-l-finding-critical bg-finding-critical-wash px-4 py-3 text-sm',
        className,
      )}
    >
      {title && <p className="font-bold text-finding-critical">{title}</p>}
      <p className={cn(title ? 'mt-0.5' : 'font-bold text-finding-critical')}>{message ?? errorMessage(error)}</p>
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}

/** A quiet "loading" line that screen readers announce. */
export function LoadingNotice({ label = 'Loading…', className }: { label?: string; className?: string }) {
  return (
    <p role="status" aria-live="polite" className={cn('flex items-center gap-2 py-6 text-sm text-ink-muted', className)}>
      <span aria-hidden className="inline-block size-3 animate-spin rounded-full border-2 border-rule-strong border-t-accent" />
      {label}
    </p>
  );
}

/** What an empty list says: what is missing and what to do about it. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-start gap-2 rounded-control border border-dashed border-rule-strong bg-paper-raised px-6 py-8">
      <p className="font-bold">{title}</p>
      {children && <div className="text-sm text-ink-muted">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}

/** A short, self-clearing confirmation ("Saved") for screen readers and eyes. */
export function StatusNote({ children }: { children: ReactNode }) {
  return (
    <p role="status" className="text-sm text-accent">
      {children}
    </p>
  );
}
