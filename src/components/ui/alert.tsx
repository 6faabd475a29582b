import type { ReactNode } from 'react';
import { isApiError } from '../../lib/api-client';

export type AlertTone = 'danger' | 'caution' | 'success' | 'info';

const tones: Record<AlertTone, string> = {
  danger: 'border-brick-600 bg-brick-50 text-brick-800',
  caution: 'border-ochre-500 bg-ochre-50 text-ochre-800',
  success: 'border-moss-600 bg-moss-50 text-moss-800',
  info: 'border-ink-400 bg-ink-50 text-ink-800',
};

const icons: Record<AlertTone, string> = {
  danger: 'M12 8v5m0 3.5v.01M10.3 3.9 2.6 17.2A2 2 0 0 0 4.3 20h15.4a2 2 0 0 0 1.7-2.8L13.7 3.9a2 2 0 0 0-3.4 0Z',
  caution: 'M12 8v5m0 3.5v.01M10.3 3.9 2.6 17.2A2 2 0 0 0 4.3 20h15.4a2 2 0 0 0 1.7-2.8L13.7 3.9a2 2 0 0 0-3.4 0Z',
  success: 'm5 12.5 4.5 4.5L19 7.5',
  info: 'M12 11v6m0-9.5v.01M21 12a9 9 0 1 1-18 0 9 9 0 0 1 18 0Z',
};

interface AlertProps {
  tone?: AlertTone;
  title?: string;
  children?: ReactNode;
  action?: ReactNode;
  /** Danger alerts interrupt screen readers; the rest are announced politely. */
  live?: boolean;
  className?: string;
}

/** The inline alert: the one way a section or form says something went wrong (or right). */
export function Alert({ tone = 'info', title, children, action, live = true, className = '' }: AlertProps) {
  const role = !live ? undefined : tone === 'danger' ? 'alert' : 'status';
  return (
    <div role={role} className={`flex gap-3 rounded-md border-l-4 px-4 py-3 ${tones[tone]} ${className}`}>
      <svg viewBox="0 0 24 24" className="mt-0.5 h-5 w-5 shrink-0" aria-hidden="true" focusable="false">
        <path d={icons[tone]} fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      <div className="min-w-0 flex-1">
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className={title ? 'mt-1' : ''}>{children}</div> : null}
        {action ? <div className="mt-3">{action}</div> : null}
      </div>
    </div>
  );
}

/** Words for an error of any kind, preferring the server's own message. */
export function errorMessage(error: unknown): string {
  if (isApiError(error)) return error.message;
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again in a moment.';
}

interface ErrorAlertProps {
  error: unknown;
  title?: string;
  onRetry?: () => void;
  className?: string;
}

export function ErrorAlert({ error, title = 'This could not be loaded', onRetry, className }: ErrorAlertProps) {
  return (
    <Alert
      tone="danger"
      title={title}
      className={className}
      action={
        onRetry ? (
          <button type="button" onClick={onRetry} className="min-h-tap rounded-md border border-brick-600 bg-white px-4 font-semibold text-brick-700 hover:bg-brick-50">
            Try again
          </button>
        ) : null
      }
    >
      {errorMessage(error)}
    </Alert>
  );
}
