import { cn } from '../../lib/cn';

/** Marks a model that ships with Ringfence (read-only; duplicate it to edit). */
export function BuiltInBadge({ className }: { className?: string }) {
  return (
    <span
      title="Ships with Ringfence; read-only — duplicate it to edit a copy"
      className={cn(
        'inline-flex h-5 items-center rounded-control border border-accent/50 bg-accent-wash px-1.5 text-[0.6875rem] font-bold tracking-wider text-accent-strong uppercase',
        className,
      )}
    >
      Built-in
    </span>
  );
}
