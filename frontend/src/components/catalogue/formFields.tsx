import { get, type FieldErrors, type FieldValues, type Path, type UseFormRegister } from 'react-hook-form';
import { useId, type ReactNode } from 'react';
import { cn } from '../../lib/cn';

/** '' → undefined (an optional field left empty), else a number (NaN for text, which the schema rejects). */
export const asNumber = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : typeof v === 'number' ? v : Number(v));

/** The message of the error at a dot path, if any. */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  const e = get(errors, path) as { message?: string } | undefined;
  return typeof e?.message === 'string' ? e.message : undefined;
}

const INPUT =
  'h-8 w-full rounded-control border bg-paper-raised px-2 text-right text-sm tabular-nums ' +
  'focus-visible:outline-2 focus-visible:outline-offset-0 focus-visible:outline-accent disabled:bg-paper-sunk disabled:text-ink-muted';

export interface NumberFieldProps<T extends FieldValues> {
  register: UseFormRegister<T>;
  errors: FieldErrors<T>;
  path: Path<T>;
  label: string;
  unit?: string;
  hint?: ReactNode;
  /** Hide the label visually (table cells); it stays the input's accessible name. */
  compact?: boolean;
  className?: string;
}

/** A labelled number input with its unit and inline error, registered at a dot path. */
export function NumberField<T extends FieldValues>({ register, errors, path, label, unit, hint, compact, className }: NumberFieldProps<T>) {
  const id = useId();
  const error = errorAt(errors, path);
  return (
    <div className={cn('flex min-w-0 flex-col gap-1', className)}>
      <label htmlFor={id} className={compact ? 'sr-only' : 'text-xs font-bold tracking-wide text-ink-muted uppercase'}>
        {label}
        {unit && !compact ? ` (${unit})` : ''}
      </label>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        className={cn(INPUT, error ? 'border-finding-critical' : 'border-rule-strong')}
        {...register(path, { setValueAs: asNumber })}
      />
      {hint && !error && !compact && (
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} role="alert" className="text-xs font-bold text-finding-critical">
          {error}
        </p>
      )}
    </div>
  );
}

/** A titled group of fields in the model editor. */
export function FieldGroup({ title, children, lead }: { title: string; lead?: ReactNode; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-3 border-t border-rule pt-4">
      <div>
        <h2 className="text-sm font-bold tracking-wide text-ink-muted uppercase">{title}</h2>
        {lead && <p className="mt-0.5 text-xs text-ink-muted">{lead}</p>}
      </div>
      {children}
    </section>
  );
}
