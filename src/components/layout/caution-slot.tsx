import type { ReactNode } from 'react';
import { useMatches } from 'react-router-dom';
import { Alert } from '../ui/alert';

/** What a route may put in its `handle` for the shell to show. */
export interface RouteHandle {
  /** A safety caution shown above the page (work at height, loading, lifting). */
  caution?: ReactNode;
}

function cautionOf(handle: unknown): ReactNode {
  if (handle && typeof handle === 'object' && 'caution' in handle) return (handle as RouteHandle).caution ?? null;
  return null;
}

/**
 * The layout slot for cautions: pages that touch work at height, roof loading or lifting declare
 * theirs in the route handle and it appears here, above the content, on every screen size.
 */
export function CautionSlot() {
  const cautions = useMatches()
    .map((match) => ({ id: match.id, caution: cautionOf(match.handle) }))
    .filter((entry) => entry.caution);
  if (cautions.length === 0) return null;
  return (
    <aside aria-label="Safety notes" className="mb-6 space-y-3">
      {cautions.map((entry) => (
        <Alert key={entry.id} tone="caution" title="Take care" live={false}>
          {entry.caution}
        </Alert>
      ))}
    </aside>
  );
}
