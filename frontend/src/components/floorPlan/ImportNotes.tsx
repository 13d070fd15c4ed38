/** The import's warnings, listed plainly in one notice block; nothing when there are none. */
export function ImportNotes({ warnings }: { warnings: readonly string[] }) {
  if (warnings.length === 0) return null;
  return (
    <section
      aria-label="Notes from reading the drawing"
      className="rounded-control border border-finding-warning/40 border-l-4 border-l-finding-warning bg-finding-warning-wash px-4 py-3 text-sm"
    >
      <p className="font-bold text-finding-warning">
        {warnings.length === 1 ? 'One note from reading the drawing' : `${warnings.length} notes from reading the drawing`}
      </p>
      <ul className="mt-1 list-disc pl-5">
        {warnings.map((w, i) => (
          <li key={i}>{w}</li>
        ))}
      </ul>
    </section>
  );
}
