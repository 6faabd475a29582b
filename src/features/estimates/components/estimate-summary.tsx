import { useNavigate } from 'react-router-dom';
import type { Estimate } from '../../../../shared/schemas/estimate.schema';
import { Alert, errorMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { useToast } from '../../../components/ui/toast';
import { formatDateTime } from '../../../lib/format';
import { useRecomputeEstimate } from '../api/recompute-estimate';
import { formatMoney } from '../../../lib/format';

const n = (v: number, digits = 0) => v.toLocaleString('en-GB', { maximumFractionDigits: digits });

function Figure({ label, value, hint }: { label: string; value: string; hint?: string }) {
  return (
    <div className="rounded-md bg-mortar-50 px-3 py-2">
      <dt className="text-sm text-ink-600">{label}</dt>
      <dd className="text-xl font-bold tabular-nums text-ink-900">{value}</dd>
      {hint ? <dd className="text-xs text-ink-600">{hint}</dd> : null}
    </div>
  );
}

/** The headline figures of a saved estimate and what made them: system, branch, schedule version, engine version. */
export function EstimateSummary({ estimate }: { estimate: Estimate }) {
  const { totals } = estimate.result;
  const recompute = useRecomputeEstimate();
  const navigate = useNavigate();
  const toast = useToast();
  return (
    <Card title="Summary">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <Figure
          label="Subtotal"
          value={estimate.totals.subtotal === null ? '—' : formatMoney(estimate.totals.subtotal)}
          hint={estimate.totals.subtotal === null ? 'generic system: no prices' : 'before delivery and VAT'}
        />
        <Figure label="Slope area" value={`${n(totals.slope_area_m2, 1)} m²`} hint={`${n(totals.plan_area_m2, 1)} m² on plan`} />
        <Figure label="Tiles to order" value={n(totals.tiles_order)} hint={`${n(totals.tiles)} laid, waste added`} />
        <Figure label="Battens" value={`${n(totals.batten_lengths)} lengths`} hint={`${n(totals.batten_m)} m on the roof`} />
        <Figure label="Delivery weight" value={`${n(totals.weight_kg / 1000, 1)} t`} hint={`${n(totals.weight_kg)} kg, pallets included`} />
        <Figure label="Pallets · loads" value={`${estimate.totals.pallets} · ${estimate.totals.loads}`} hint={`${totals.pallets} of tiles`} />
      </dl>
      <dl className="mt-4 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-600">Roof system</dt>
        <dd className="font-medium">
          {estimate.system.name}
          {estimate.system.branch ? ` · ${estimate.system.branch.merchant.name}, ${estimate.system.branch.name}` : ' (typed in)'}
        </dd>
        <dt className="text-ink-600">Tile</dt>
        <dd>
          {estimate.system_input.tile.name ?? (estimate.system_input.tile.kind === 'double_lap' ? 'Double-lap tile or slate' : 'Single-lap tile')}, {estimate.system_input.tile.length_mm} ×{' '}
          {estimate.system_input.tile.width_mm} mm, {estimate.system_input.tile.weight_kg} kg
        </dd>
        <dt className="text-ink-600">Waste allowed</dt>
        <dd>
          tiles {estimate.system_input.waste_pct.tiles} %, battens {estimate.system_input.waste_pct.battens} %, underlay {estimate.system_input.waste_pct.underlay} %, ridge and hip{' '}
          {estimate.system_input.waste_pct.ridge_hip} %
        </dd>
        <dt className="text-ink-600">Schedule</dt>
        <dd>Version {estimate.schedule.version}</dd>
        <dt className="text-ink-600">Worked out</dt>
        <dd>
          {formatDateTime(estimate.created_at)}
          {estimate.created_by ? ` by ${estimate.created_by.name}` : ''} · engine {estimate.engine_version}
          {estimate.recomputed_from ? ` · recomputed from estimate ${estimate.recomputed_from}` : ''}
        </dd>
      </dl>
      {!estimate.engine_current ? (
        <Alert
          tone="info"
          className="mt-4"
          title="Worked out by an earlier version of the rules"
          action={
            <Button
              variant="secondary"
              busy={recompute.isPending}
              onClick={() =>
                recompute.mutate(estimate.id, {
                  onSuccess: (fresh) => navigate(`/estimates/${fresh.id}`),
                  onError: (error) => toast.show(errorMessage(error), 'danger'),
                })
              }
            >
              Work it out again as a new estimate
            </Button>
          }
        >
          The figures are shown as first computed. A new estimate uses today&rsquo;s rules and prices; this one is kept.
        </Alert>
      ) : null}
    </Card>
  );
}
