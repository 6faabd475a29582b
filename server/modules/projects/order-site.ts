import type { OrderSite } from '../../../shared/schemas/order.schema';
import type { Project } from '../../../shared/schemas/project.schema';

/** Where an order or a quote request goes: the project's site and access copied as they stand when it is sent, so a later edit of the project leaves it as sent. */
export function orderSiteOf(p: Project): OrderSite {
  return {
    name: p.name,
    site_address: p.site_address,
    site_postcode: p.site_postcode,
    contact_name: p.contact_name,
    contact_phone: p.contact_phone,
    vehicle_access: p.vehicle_access,
    crane_lift: p.crane_lift,
    overhead_lines: p.overhead_lines,
    set_down_place: p.set_down_place,
    access_notes: p.access_notes,
  };
}
