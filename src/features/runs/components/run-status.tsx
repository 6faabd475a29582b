import { RUN_STATUS_LABELS } from '../../../../shared/schemas/run.schema';
import type { RunStatus } from '../../../../shared/schemas/run.schema';

const tones: Record<RunStatus, string> = {
  planned: 'border-ink-300 bg-ink-50 text-ink-800',
  loading: 'border-ochre-500 bg-ochre-50 text-ochre-800',
  loaded: 'border-moss-600 bg-moss-50 text-moss-800',
  on_the_road: 'border-clay-600 bg-clay-50 text-clay-800',
  done: 'border-ink-400 bg-white text-ink-700',
};

export function RunStatusBadge({ status }: { status: RunStatus }) {
  return <span className={`inline-block whitespace-nowrap rounded border px-2 py-0.5 text-sm font-medium ${tones[status]}`}>{RUN_STATUS_LABELS[status]}</span>;
}
