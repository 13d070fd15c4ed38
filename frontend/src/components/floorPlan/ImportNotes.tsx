import type { ImportNotes as Notes } from '@shared/schemas/floorPlan';

function NoteList({ title, items, tone }: { title: string; items: readonly string[]; tone: 'check' | 'quiet' }) {
  if (items.length === 0) return null;
  return (
    <div>
      <p className={tone === 'check' ? 'font-bold text-finding-warning' : 'font-bold text-ink-muted'}>{title}</p>
      <ul className="mt-1 list-disc pl-5">
        {items.map((w, i) => (
          <li key={i}>{w}</li>
        ))}
      </ul>
    </div>
  );
}

/**
 * The import's notes in three groups: to check (warnings), left out on purpose, and could not be
 * read; nothing when there are none.
 */
export function ImportNotes({ warnings, notes }: { warnings: readonly string[]; notes?: Notes }) {
  const ignored = notes?.ignored ?? [];
  const unread = notes?.unread ?? [];
  if (warnings.length + ignored.length + unread.length === 0) return null;
  return (
    <section
      aria-label="Notes from reading the drawing"
      className="flex flex-col gap-2 rounded-control border border-finding-warning/40 border-l-4 border-l-finding-warning bg-finding-warning-wash px-4 py-3 text-sm"
    >
      <NoteList
        title={warnings.length === 1 ? 'One note to check' : `${warnings.length} notes to check`}
        items={warnings}
        tone="check"
      />
      <NoteList title="Could not be read" items={unread} tone="check" />
      <NoteList title="Left out on purpose" items={ignored} tone="quiet" />
    </section>
  );
}
