import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState } from 'react';
import type { ReactNode } from 'react';

export type ToastTone = 'success' | 'danger' | 'info';

interface Toast {
  id: number;
  tone: ToastTone;
  message: string;
  /** When it was shown (ms), so a page change can drop the notes of the page before. */
  at: number;
}

interface ToastApi {
  show: (message: string, tone?: ToastTone) => void;
}

interface ToastPlace {
  toasts: Toast[];
  dismiss: (id: number) => void;
  /** Drops every note shown more than `ms` ago: called when the page changes. */
  dropOlderThan: (ms: number) => void;
  /** A layout that shows the notes in its own flow (see ToastOutlet) registers here. */
  setOutlet: (mounted: boolean) => void;
}

const ToastContext = createContext<ToastApi | null>(null);
const ToastPlaceContext = createContext<ToastPlace | null>(null);

/** A note shown this shortly before a page change says what led to it, and goes with the new page. */
export const CARRY_OVER_MS = 1500;

const toneClasses: Record<ToastTone, string> = {
  success: 'border-moss-600 bg-white text-moss-800',
  danger: 'border-brick-600 bg-white text-brick-800',
  info: 'border-ink-500 bg-white text-ink-800',
};

const DISMISS_AFTER_MS = 6000;

function ToastItem({ toast, onDismiss }: { toast: Toast; onDismiss: (id: number) => void }) {
  const [paused, setPaused] = useState(false);
  useEffect(() => {
    if (paused) return undefined;
    const timer = window.setTimeout(() => onDismiss(toast.id), DISMISS_AFTER_MS);
    return () => window.clearTimeout(timer);
  }, [paused, toast.id, onDismiss]);

  return (
    <li
      className={`pointer-events-auto flex items-start gap-3 rounded-md border-l-4 px-4 py-3 shadow-raised ${toneClasses[toast.tone]}`}
      onMouseEnter={() => setPaused(true)}
      onMouseLeave={() => setPaused(false)}
      onFocus={() => setPaused(true)}
      onBlur={() => setPaused(false)}
    >
      <p className="flex-1 font-medium">{toast.message}</p>
      <button type="button" onClick={() => onDismiss(toast.id)} className="-my-2 -mr-2 inline-flex min-h-tap min-w-tap items-center justify-center rounded-md text-ink-600 hover:bg-ink-100">
        <span className="sr-only">Dismiss message</span>
        <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true" focusable="false">
          <path d="M6 6l12 12M18 6 6 18" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        </svg>
      </button>
    </li>
  );
}

/**
 * The toast region: short notes about something that just happened (a role changed, a removal
 * failed). It is always in the page so screen readers hear what is added to it.
 */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const [outlets, setOutlets] = useState(0);
  const nextId = useRef(1);

  const dismiss = useCallback((id: number) => setToasts((list) => list.filter((toast) => toast.id !== id)), []);
  const show = useCallback((message: string, tone: ToastTone = 'info') => {
    const id = nextId.current++;
    setToasts((list) => [...list.slice(-3), { id, tone, message, at: Date.now() }]);
  }, []);
  const dropOlderThan = useCallback((ms: number) => {
    const since = Date.now() - ms;
    setToasts((list) => (list.some((t) => t.at < since) ? list.filter((t) => t.at >= since) : list));
  }, []);
  const setOutlet = useCallback((mounted: boolean) => setOutlets((n) => n + (mounted ? 1 : -1)), []);
  const api = useMemo(() => ({ show }), [show]);
  const place = useMemo(() => ({ toasts, dismiss, dropOlderThan, setOutlet }), [toasts, dismiss, dropOlderThan, setOutlet]);

  return (
    <ToastContext.Provider value={api}>
      <ToastPlaceContext.Provider value={place}>
        {children}
        {/* Without a page layout (a lone component), the notes sit in a corner region of their own. */}
        {outlets === 0 ? (
          <div aria-live="polite" aria-relevant="additions" role="region" aria-label="Notifications" className="pointer-events-none fixed inset-x-0 bottom-0 z-50 flex justify-center p-4 sm:justify-end">
            <ToastList toasts={toasts} onDismiss={dismiss} className="flex w-full max-w-sm flex-col gap-2" />
          </div>
        ) : null}
      </ToastPlaceContext.Provider>
    </ToastContext.Provider>
  );
}

function ToastList({ toasts, onDismiss, className }: { toasts: Toast[]; onDismiss: (id: number) => void; className: string }) {
  return (
    <ul className={className}>
      {toasts.map((toast) => (
        <ToastItem key={toast.id} toast={toast} onDismiss={onDismiss} />
      ))}
    </ul>
  );
}

/**
 * Where a page layout shows its notes: in the page's own flow at the top of the content, so a note
 * never covers what is under it. `pageKey` is the page's address: when it changes, notes of the page
 * before go (a note shown just before the change, which says what led to it, stays).
 */
export function ToastOutlet({ pageKey }: { pageKey: string }) {
  const place = useContext(ToastPlaceContext);
  const setOutlet = place?.setOutlet;
  const dropOlderThan = place?.dropOlderThan;
  useEffect(() => {
    setOutlet?.(true);
    return () => setOutlet?.(false);
  }, [setOutlet]);
  useEffect(() => {
    dropOlderThan?.(CARRY_OVER_MS);
  }, [pageKey, dropOlderThan]);
  if (!place) return null;
  return (
    <div aria-live="polite" aria-relevant="additions" role="region" aria-label="Notifications" className={place.toasts.length > 0 ? 'mb-4' : ''}>
      <ToastList toasts={place.toasts} onDismiss={place.dismiss} className="flex flex-col gap-2" />
    </div>
  );
}

export function useToast(): ToastApi {
  const api = useContext(ToastContext);
  if (!api) throw new Error('useToast needs a ToastProvider above it');
  return api;
}
