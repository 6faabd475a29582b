import type { ButtonHTMLAttributes, Ref } from 'react';
import { Spinner } from './spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';
export type ButtonSize = 'md' | 'lg';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-clay-600 text-white hover:bg-clay-700 active:bg-clay-800 border border-clay-700',
  secondary: 'bg-white text-ink-900 border border-ink-300 hover:bg-ink-50 active:bg-ink-100',
  danger: 'bg-brick-600 text-white border border-brick-700 hover:bg-brick-700 active:bg-brick-800',
  ghost: 'bg-transparent text-ink-800 border border-transparent hover:bg-ink-100',
};

const sizes: Record<ButtonSize, string> = {
  // Both sizes keep at least a 44 px target; lg is for phone-first pages.
  md: 'min-h-tap px-4 text-base',
  lg: 'min-h-tap-lg px-6 text-lg',
};

/** Classes of a button, for links that look like one. */
export function buttonClasses(variant: ButtonVariant = 'primary', size: ButtonSize = 'md', extra = ''): string {
  return ['inline-flex items-center justify-center gap-2 rounded-md font-semibold transition-colors', 'disabled:cursor-not-allowed disabled:opacity-60', variants[variant], sizes[size], extra].join(' ');
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a spinner and blocks a second press while work is under way. */
  busy?: boolean;
  ref?: Ref<HTMLButtonElement>;
}

export function Button({ variant = 'primary', size = 'md', busy = false, className = '', type = 'button', disabled, children, ...rest }: ButtonProps) {
  return (
    <button type={type} className={buttonClasses(variant, size, className)} disabled={disabled || busy} aria-busy={busy || undefined} {...rest}>
      {busy ? <Spinner className="h-4 w-4" label={null} /> : null}
      {children}
    </button>
  );
}
