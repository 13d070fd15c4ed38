import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { cn } from '../lib/cn';

const CONTROL =
  'w-full rounded-control border bg-paper-raised px-3 text-sm text-ink placeholder:text-ink-faint ' +
  'focus-visible:outline-2 focus-visible:outline-offset-0 focus-visible:outline-accent';

function controlClass(invalid: boolean, extra?: string) {
  return cn(CONTROL, invalid ? 'border-finding-critical' : 'border-rule-strong', extra);
}

interface FieldFrameProps {
  id: string;
  label: string;
  error?: string;
  hint?: ReactNode;
  children: ReactNode;
  className?: string;
}

function FieldFrame({ id, label, error, hint, children, className }: FieldFrameProps) {
  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="text-xs font-bold tracking-wide text-ink-muted uppercase">
        {label}
      </label>
      {children}
      {hint && !error && (
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

function describedBy(id: string, error?: string, hint?: ReactNode) {
  if (error) return `${id}-error`;
  if (hint) return `${id}-hint`;
  return undefined;
}

export interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLInputElement>;
  frameClassName?: string;
}

/** A labelled text input with its error message wired to `aria-describedby`. */
export function TextField({ label, error, hint, id, className, frameClassName, ref, ...rest }: TextFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} error={error} hint={hint} className={frameClassName}>
      <input
        id={fieldId}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, error, hint)}
        className={controlClass(Boolean(error), cn('h-9', className))}
        {...rest}
      />
    </FieldFrame>
  );
}

export interface TextAreaFieldProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLTextAreaElement>;
  frameClassName?: string;
}

/** A labelled multi-line input. */
export function TextAreaField({ label, error, hint, id, className, frameClassName, ref, ...rest }: TextAreaFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} error={error} hint={hint} className={frameClassName}>
      <textarea
        id={fieldId}
        ref={ref}
        rows={4}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, error, hint)}
        className={controlClass(Boolean(error), cn('py-2', className))}
        {...rest}
      />
    </FieldFrame>
  );
}

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLSelectElement>;
  frameClassName?: string;
}

/** A labelled select. */
export function SelectField({ label, error, hint, id, className, frameClassName, ref, children, ...rest }: SelectFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} error={error} hint={hint} className={frameClassName}>
      <select
        id={fieldId}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, error, hint)}
        className={controlClass(Boolean(error), cn('h-9', className))}
        {...rest}
      >
        {children}
      </select>
    </FieldFrame>
  );
}
