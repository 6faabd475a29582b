import type { ReactNode } from 'react';
import type { z } from 'zod';
import type { orderSiteSchema } from '../../../shared/schemas/order.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../shared/schemas/project.schema';

type OrderSite = z.infer<typeof orderSiteSchema>;

/**
 * The site as an order carries it (address, contact, lorry and crane access, set-down, notes), shown
 * alike to the contractor and the desk; `name` lets each side link the site its own way.
 */
export function OrderSiteDetails({ site, name }: { site: OrderSite; name?: ReactNode }) {
  return (
    <dl className="grid grid-cols-[minmax(7rem,auto)_1fr] gap-x-6 gap-y-2">
      <dt className="text-sm text-ink-600">Site</dt>
      <dd>
        {name ?? site.name}
        <span className="block">
          {site.site_address}
          {site.site_postcode ? `, ${site.site_postcode}` : ''}
        </span>
      </dd>
      <dt className="text-sm text-ink-600">Contact</dt>
      <dd>
        {site.contact_name || '—'} {site.contact_phone}
      </dd>
      <dt className="text-sm text-ink-600">Access</dt>
      <dd>
        {VEHICLE_ACCESS_LABELS[site.vehicle_access]}; {CRANE_LIFT_LABELS[site.crane_lift]}; {OVERHEAD_LINES_LABELS[site.overhead_lines]}
      </dd>
      <dt className="text-sm text-ink-600">Set-down</dt>
      <dd>{site.set_down_place || '—'}</dd>
      <dt className="text-sm text-ink-600">Notes</dt>
      <dd className="whitespace-pre-line">{site.access_notes || '—'}</dd>
    </dl>
  );
}
