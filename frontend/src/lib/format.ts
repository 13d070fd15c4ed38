const DATE_TIME = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
const DATE = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

/** An ISO timestamp as a local date and time ("12 Mar 2026, 14:05"); the input itself when unreadable. */
export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : DATE_TIME.format(d);
}

/** An ISO timestamp as a local date. */
export function formatDate(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : DATE.format(d);
}
