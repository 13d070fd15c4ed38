import type { ReactNode } from 'react';

/** The title row of a page: heading, a line saying what the page is for, and its main actions. */
export function PageHeader({ title, lead, actions, eyebrow }: { title: string; lead?: ReactNode; actions?: ReactNode; eyebrow?: ReactNode }) {
  return (
    <div className="mb-6 flex items-end justify-between gap-6 border-b border-rule pb-4">
      <div className="min-w-0">
        {eyebrow && <div className="mb-1 text-xs font-bold tracking-wider text-ink-muted uppercase">{eyebrow}</div>}
        <h1 className="truncate text-2xl font-bold tracking-tight">{title}</h1>
        {lead && <p className="mt-1 text-sm text-ink-muted">{lead}</p>}
      </div>
      {actions && <div className="flex shrink-0 items-center gap-2">{actions}</div>}
    </div>
  );
}
