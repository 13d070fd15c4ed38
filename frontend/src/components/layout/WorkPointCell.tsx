import { useEffect, useRef, useState } from 'react';
import { cn } from '../../lib/cn';
import type { EditableField } from './workPointRows';

export interface WorkPointCellProps {
  pointId: string;
  field: EditableField;
  /** The value as shown and as the edit box starts. */
  text: string;
  readOnly: boolean;
  /** For approach and assigned arm: the allowed values, shown as a select (`''` = none). */
  options?: ReadonlyArray<{ value: string; label: string }>;
  align?: 'left' | 'right';
  /** Tries the edit; returns an error message for the cell, or null when it was taken. */
  onCommit(raw: string): string | null;
}

/**
 * One editable table cell: shows its value as a button; clicking it (or Enter on it) opens an
 * input or select; Enter or leaving the box commits, Escape cancels. A rejected value keeps the
 * box open with the message beside it.
 */
export function WorkPointCell({ pointId, field, text, readOnly, options, align = 'left', onCommit }: WorkPointCellProps) {
  const [editing, setEditing] = useState(false);
  // What the box holds while editing; it starts from `text` each time the box opens.
  const [draft, setDraft] = useState(text);
  const [error, setError] = useState<string | null>(null);
  const inputRef = useRef<HTMLInputElement & HTMLSelectElement>(null);

  useEffect(() => {
    if (editing) inputRef.current?.focus();
  }, [editing]);

  const label = `${field === 'assignedArm' ? 'assigned arm' : field} of ${pointId}`;
  if (readOnly || !editing) {
    const shown = options?.find((o) => o.value === text)?.label ?? text;
    return (
      <button
        type="button"
        disabled={readOnly}
        aria-label={readOnly ? undefined : `Edit ${label}: ${shown || 'empty'}`}
        onClick={(event) => {
          event.stopPropagation();
          setDraft(text);
          setError(null);
          setEditing(true);
        }}
        className={cn(
          'block w-full truncate rounded-control px-1 py-0.5 text-left disabled:cursor-default',
          align === 'right' && 'text-right tabular-nums',
          !readOnly && 'hover:bg-accent-wash',
          text === '' && 'text-ink-faint',
        )}
      >
        {shown === '' ? '—' : shown}
      </button>
    );
  }

  const finish = (raw: string) => {
    if (raw === text) {
      setEditing(false);
      setError(null);
      return;
    }
    const message = onCommit(raw);
    if (message) setError(message);
    else {
      setEditing(false);
      setError(null);
    }
  };
  const keys = (event: React.KeyboardEvent) => {
    event.stopPropagation();
    if (event.key === 'Escape') {
      setEditing(false);
      setError(null);
    } else if (event.key === 'Enter') {
      event.preventDefault();
      finish(draft);
    }
  };
  const control = cn(
    'h-7 w-full rounded-control border bg-paper-raised px-1 text-sm',
    align === 'right' && 'text-right tabular-nums',
    error ? 'border-finding-critical' : 'border-accent',
  );
  return (
    <div className="relative" onClick={(event) => event.stopPropagation()}>
      {options ? (
        <select
          ref={inputRef}
          aria-label={label}
          aria-invalid={error ? true : undefined}
          value={draft}
          onChange={(event) => {
            setDraft(event.target.value);
            finish(event.target.value);
          }}
          onBlur={() => {
            setEditing(false);
            setError(null);
          }}
          onKeyDown={keys}
          className={control}
        >
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      ) : (
        <input
          ref={inputRef}
          aria-label={label}
          aria-invalid={error ? true : undefined}
          inputMode={field === 'x' || field === 'y' || field === 'z' ? 'decimal' : undefined}
          value={draft}
          onChange={(event) => {
            setDraft(event.target.value);
            setError(null);
          }}
          onBlur={() => finish(draft)}
          onKeyDown={keys}
          className={control}
        />
      )}
      {error && (
        <p role="alert" className="absolute top-full left-0 z-10 mt-0.5 rounded-control bg-finding-critical px-1.5 py-0.5 text-xs whitespace-nowrap text-on-accent">
          {error}
        </p>
      )}
    </div>
  );
}
