import { checkFacesAgainstSystem, estimate } from '../../../../shared/engine/estimate';
import type { EngineResult } from '../../../../shared/engine/result';
import { parseRoofSystem } from '../../../../shared/engine/roof-system';
import type { RoofSystemOffer } from '../../../../shared/schemas/catalogue.schema';
import type { CreateEstimateBody } from '../../../../shared/schemas/estimate.schema';
import type { Face } from '../../../../shared/schemas/schedule.schema';
import type { Opening } from '../../../../shared/schemas/openings.schema';

// Apart from estimate-form.ts: the whole engine comes with it, and the form shows before it has loaded.

export type PreviewOutcome = { state: 'empty' } | { state: 'problems'; problems: string[] } | { state: 'ready'; result: EngineResult };

/** The engine's estimate of the schedule with the system as the form stands, worked out in the browser. */
export function previewEstimate(faces: readonly Face[], body: CreateEstimateBody | null, offers: readonly RoofSystemOffer[], openings: readonly Opening[] = []): PreviewOutcome {
  if (!body) return { state: 'empty' };
  let input: Record<string, unknown>;
  if (body.system_id !== undefined) {
    const offer = offers.find((o) => o.id === body.system_id);
    if (!offer) return { state: 'empty' };
    input = { ...offer.system, waste_pct: { ...offer.system.waste_pct, ...body.waste_pct } };
  } else {
    input = { ...(body.system ?? {}), ...(body.waste_pct ? { waste_pct: body.waste_pct } : {}) };
  }
  const system = parseRoofSystem(input);
  if (!system.ok) return { state: 'problems', problems: system.errors.map((e) => `${e.field ?? 'system'}: ${e.message}`) };
  const unsuitable = checkFacesAgainstSystem(faces, system.system);
  if (unsuitable.length > 0) {
    return { state: 'problems', problems: unsuitable.map((p) => `${faces[(p.row ?? 1) - 1]?.building} · ${faces[(p.row ?? 1) - 1]?.face}: ${p.message}`) };
  }
  return { state: 'ready', result: estimate([...faces], system.system, openings) };
}
