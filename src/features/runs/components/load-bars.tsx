import type { Run } from '../../../../shared/schemas/run.schema';
import { kg } from '../lib/run-format';

const pct = (used: number, of: number) => (of > 0 ? Math.min(100, Math.round((used / of) * 100)) : 0);

/** A capacity fills towards a limit (amber near it, red past it); `goal` fills towards done (green). */
function Bar({ label, used, of, text, goal = false }: { label: string; used: number; of: number; text: string; goal?: boolean }) {
  const full = of > 0 && used > of;
  const share = pct(used, of);
  return (
    <div>
      <div className="flex justify-between gap-2 text-sm">
        <span>{label}</span>
        <span className={`tabular-nums ${full ? 'font-semibold text-brick-700' : ''}`}>
          {text}
          {full ? ' (over)' : ''}
        </span>
      </div>
      <div className="h-2.5 rounded bg-mortar-200" role="meter" aria-label={label} aria-valuemin={0} aria-valuemax={of} aria-valuenow={used} aria-valuetext={text}>
        <div className={`h-2.5 rounded ${full ? 'bg-brick-600' : !goal && share >= 90 ? 'bg-ochre-500' : 'bg-moss-600'}`} style={{ width: `${share}%` }} />
      </div>
    </div>
  );
}

/** What the run carries against its lorry's payload and pallet slots, and how much of it is on. */
export function LoadBars({ run }: { run: Run }) {
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      <Bar label="Payload" used={run.weight_kg} of={run.lorry.payload_kg} text={`${kg(run.weight_kg)} of ${kg(run.lorry.payload_kg)}`} />
      <Bar label="Pallet slots" used={run.pallets} of={run.lorry.pallet_slots} text={`${run.pallets} of ${run.lorry.pallet_slots}`} />
      <Bar label="Loaded" used={run.loaded_count} of={run.pallets} text={`${run.loaded_count} of ${run.pallets} pallets`} goal />
    </div>
  );
}
