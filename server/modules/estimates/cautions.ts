import { SAFETY_CAUTIONS } from '../../../shared/engine/defaults';

/**
 * The cautions that travel with every estimate and order. The engine's own cautions (work at
 * height, loading the roof, footholds, lifting) come first; these add what the server knows.
 */
export const FIGURES_ARE_ESTIMATES =
  "Every figure here is an estimate from the schedule and the roof system as entered. Check it against the tile maker's fixing specification for the site and local building regulations before ordering or fixing; they take precedence.";

export function estimateCautions(engineCautions: readonly string[]): string[] {
  return [...engineCautions, FIGURES_ARE_ESTIMATES];
}

export interface DeliverySite {
  crane_lift: 'allowed' | 'not_allowed' | 'unknown';
  overhead_lines: 'none' | 'present' | 'unknown';
}

/** What to watch for when this delivery arrives, then the general cautions. */
export function orderCautions(method: 'ground' | 'roof', site: DeliverySite): string[] {
  const delivery: string[] = [];
  if (method === 'roof') {
    delivery.push(
      'Lifting pallets onto the roof with the lorry crane needs a lift plan by a competent person, a clear exclusion zone below the load, and scaffold or roof areas able to take the pallets: spread them over braced rafters or trusses, never on one spot.',
    );
    if (site.overhead_lines !== 'none') {
      delivery.push(
        site.overhead_lines === 'present'
          ? 'Overhead lines are recorded near the set-down place: the crane must not lift within their safety clearance; agree the lift with the line owner and the driver before the day.'
          : 'Check the site for overhead lines before the crane lifts; none have been recorded yet.',
      );
    }
  } else {
    delivery.push('Pallets set down at ground level are moved by plant or by hand: plan each lift, keep people clear of the lorry while it unloads, and remember manual-handling figures are not safe limits.');
  }
  return [...delivery, ...SAFETY_CAUTIONS, FIGURES_ARE_ESTIMATES];
}
