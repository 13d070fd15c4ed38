import type { ButtonHTMLAttributes } from 'react';
import { cn } from '../lib/cn';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-accent text-on-accent border-accent hover:bg-accent-strong hover:border-accent-strong',
  secondary: 'bg-paper-raised text-ink border-rule-strong hover:bg-paper-sunk',
  danger: 'bg-paper-raised text-finding-critical border-finding-critical hover:bg-finding-critical-wash',
  quiet: 'bg-transparent text-ink-muted border-transparent hover:text-ink hover:bg-paper-sunk',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: 'md' | 'sm';
  /** Shows the button as busy and blocks a second click. */
  busy?: boolean;
}

/** The one button of the app; `type` defaults to "button" so only submit buttons submit forms. */
export function Button({ variant = 'secondary', size = 'md', busy = false, className, disabled, type, children, ...rest }: ButtonProps) {
  return (
    <button
      type={type ?? 'button'}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={cn(
        'inline-flex items-center justify-center gap-2 rounded-control border font-bold whitespace-nowrap transition-colors',
        'disabled:cursor-not-allowed disabled:opacity-55',
        size === 'md' ? 'h-9 px-4 text-sm' : 'h-7 px-2.5 text-xs',
        VARIANTS[variant],
        className,
      )}
      {...rest}
    >
      {children}
    </button>
  );
}
