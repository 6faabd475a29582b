import { isIsoDate } from '../domain/business-calendar';
import './zod-messages';
import * as z from 'zod/mini';
import { can, type Action } from '../domain/policy';
import type { Role } from '../domain/roles';
import { PRODUCT_CATEGORIES, branchRefSchema } from './catalogue.schema';
import { CRANE_LIFT, OVERHEAD_LINES, VEHICLE_ACCESS } from './project.schema';

/**
 * The order book both sides share, and quote requests. Quantities are whole packs (the unit the
 * merchant sells); money is integer minor units; dates are YYYY-MM-DD; a time window is HH:MM-HH:MM.
 */

/** Stages of an order, in plain words. */
export const ORDER_STATUSES = ['sent', 'changes_offered', 'agreed', 'confirmed', 'on_the_road', 'delivered', 'cancelled', 'turned_down'] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];

export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  sent: 'Sent to the merchant',
  changes_offered: 'Changes offered by the merchant',
  agreed: 'Changes agreed, waiting for confirmation',
  confirmed: 'Confirmed',
  on_the_road: 'On the road',
  delivered: 'Delivered',
  cancelled: 'Cancelled',
  turned_down: 'Turned down by the merchant',
};

export type OrderParty = 'contractor' | 'merchant';

/**
 * The one table of who may take which step on an order in which stage: the side that takes it, the
 * policy action whose roles may take it, the stages it starts from and the stage it leaves the order
 * in (null: the step does not move the order, it only needs the stage). Every step the server takes
 * on an order is checked against this table; the client is shown the same answer as allowed_actions.
 */
export const ORDER_STEPS = {
  amend: { by: 'contractor', policy: 'orders:place', from: ['sent', 'changes_offered', 'agreed'], to: 'sent' },
  cancel: { by: 'contractor', policy: 'orders:place', from: ['sent', 'changes_offered', 'agreed'], to: 'cancelled' },
  accept_changes: { by: 'contractor', policy: 'orders:respond', from: ['changes_offered'], to: 'agreed' },
  decline_changes: { by: 'contractor', policy: 'orders:respond', from: ['changes_offered'], to: 'sent' },
  offer_changes: { by: 'merchant', policy: 'orders:confirm', from: ['sent', 'agreed'], to: 'changes_offered' },
  confirm: { by: 'merchant', policy: 'orders:confirm', from: ['sent', 'agreed'], to: 'confirmed' },
  turn_down: { by: 'merchant', policy: 'orders:confirm', from: ['sent', 'changes_offered', 'agreed'], to: 'turned_down' },
  dispatch: { by: 'merchant', policy: 'slots:book', from: ['confirmed'], to: 'on_the_road' },
  deliver: { by: 'merchant', policy: 'deliveries:record', from: ['on_the_road'], to: 'delivered' },
  book_slot: { by: 'merchant', policy: 'slots:book', from: ['confirmed'], to: null },
  release_slot: { by: 'merchant', policy: 'slots:book', from: ['confirmed'], to: null },
  /** Back-ordered packs are owed once the first part is confirmed. */
  start_follow_up: { by: 'merchant', policy: 'orders:confirm', from: ['confirmed', 'on_the_road', 'delivered'], to: null },
} as const satisfies Record<string, { by: OrderParty; policy: Action; from: readonly OrderStatus[]; to: OrderStatus | null }>;
export type OrderStep = keyof typeof ORDER_STEPS;
/** The steps that move an order to another stage. */
export type OrderAction = { [K in OrderStep]: (typeof ORDER_STEPS)[K]['to'] extends null ? never : K }[OrderStep];

/** The stage changes of ORDER_STEPS alone. */
export const ORDER_TRANSITIONS = Object.fromEntries(Object.entries(ORDER_STEPS).filter(([, s]) => s.to !== null)) as { [K in OrderAction]: (typeof ORDER_STEPS)[K] };

/** Whether a step may start from this stage (the side and role are not asked). */
export function stageAllows(step: OrderStep, status: OrderStatus): boolean {
  return (ORDER_STEPS[step].from as readonly OrderStatus[]).includes(status);
}

/** Whether a side, and when given a role, may take a step on an order in this stage. */
export function stepAllowed(step: OrderStep, status: OrderStatus, party: OrderParty, role?: Role): boolean {
  const s = ORDER_STEPS[step];
  return s.by === party && stageAllows(step, status) && (role === undefined || can(role, s.policy));
}

/** Stage changes a side (and when given, a role) may make to an order in a given stage. */
export function allowedOrderActions(status: OrderStatus, party: OrderParty, role?: Role): OrderAction[] {
  return (Object.keys(ORDER_TRANSITIONS) as OrderAction[]).filter((a) => stepAllowed(a, status, party, role));
}

/** How each line stands after the merchant's answer. */
export const ORDER_LINE_STATUSES = ['asked', 'agreed', 'part_agreed', 'back_ordered', 'replaced', 'not_available', 'substitute'] as const;
export type OrderLineStatus = (typeof ORDER_LINE_STATUSES)[number];

/** How a line stands, in words, on both sides' order pages. */
export const ORDER_LINE_STATUS_LABELS: Record<OrderLineStatus, string> = {
  asked: 'Asked for',
  agreed: 'Agreed',
  part_agreed: 'Part agreed',
  back_ordered: 'To follow',
  replaced: 'Replaced',
  not_available: 'Not available',
  substitute: 'Substitute',
};

export const DELIVERY_METHODS = ['ground', 'roof'] as const;
export const DELIVERY_METHOD_LABELS: Record<(typeof DELIVERY_METHODS)[number], string> = {
  ground: 'Set down at ground level',
  roof: 'Lifted onto the roof by the lorry crane',
};

export const PROPOSAL_STATUSES = ['open', 'accepted', 'declined', 'superseded'] as const;

const isRealDate = isIsoDate;

export const isoDateSchema = z.string({ error: 'must be a date YYYY-MM-DD' }).check(z.regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'must be a date YYYY-MM-DD' }), z.refine(isRealDate, { error: 'is not a real date' }));

const minutes = (hhmm: string) => Number(hhmm.slice(0, 2)) * 60 + Number(hhmm.slice(3, 5));

export const timeWindowSchema = z.string({ error: 'must be a time window HH:MM-HH:MM' }).check(
  z.regex(/^([01]\d|2[0-3]):[0-5]\d-([01]\d|2[0-3]):[0-5]\d$/, { error: 'must be a time window HH:MM-HH:MM, e.g. 07:30-12:00' }),
  z.refine((w) => minutes(w.slice(0, 5)) < minutes(w.slice(6, 11)), { error: 'must end after it starts' }),
);

const text = (max: number) => z.string().check(z.trim(), z.maxLength(max, { error: `must be at most ${max} characters` }));
const packs = () =>
  z.number({ error: 'must be a whole number of packs' }).check(z.int({ error: 'must be a whole number of packs' }), z.gte(1, { error: 'must be at least 1' }), z.lte(1_000_000, { error: 'must be at most 1,000,000' }));

export const orderLineInputSchema = z.object({
  product_id: z.number().check(z.int(), z.positive()),
  quantity: packs(),
});

const linesInput = z.array(orderLineInputSchema).check(
  z.minLength(1, { error: 'an order needs at least one line' }),
  z.maxLength(200, { error: 'at most 200 lines' }),
  z.superRefine((lines, ctx) => {
    const seen = new Set<number>();
    lines.forEach((l, i) => {
      if (seen.has(l.product_id)) ctx.addIssue({ code: 'custom', path: [i, 'product_id'], message: 'this product is already on the order' });
      seen.add(l.product_id);
    });
  }),
);

export const placeOrderBodySchema = z.strictObject({
  estimate_id: z.number().check(z.int(), z.positive()),
  branch_id: z.number().check(z.int(), z.positive()),
  requested_date: isoDateSchema,
  time_window: z.optional(z.nullable(timeWindowSchema)),
  delivery_method: z.enum(DELIVERY_METHODS, { error: 'must be ground or roof' }),
  notes: z.optional(text(2000)),
  po_reference: z.optional(text(60)),
  /** Packs of each product; left out, the estimate's lines are ordered as they are. */
  lines: z.optional(linesInput),
});
export type PlaceOrderBody = z.input<typeof placeOrderBodySchema>;

/** An amendment names the revision it was made on, so it never overwrites a change it has not seen. */
export const amendOrderBodySchema = z
  .strictObject({
    revision: z.number().check(z.int(), z.positive()),
    requested_date: z.optional(isoDateSchema),
    time_window: z.optional(z.nullable(timeWindowSchema)),
    delivery_method: z.optional(z.enum(DELIVERY_METHODS, { error: 'must be ground or roof' })),
    notes: z.optional(text(2000)),
    po_reference: z.optional(text(60)),
    lines: z.optional(linesInput),
  })
  .check(z.refine((b) => Object.keys(b).some((k) => k !== 'revision'), { error: 'send at least one field to change' }));
export type AmendOrderBody = z.input<typeof amendOrderBodySchema>;

export const cancelOrderBodySchema = z.strictObject({ reason: z.optional(text(500)) });
export const answerProposalBodySchema = z.strictObject({ note: z.optional(text(500)) });

/** The desk's answer to an order: what it can send now, what follows later, what it offers instead, and when. */
export const proposalBodySchema = z
  .strictObject({
    revision: z.number().check(z.int(), z.positive()),
    message: z.optional(text(2000)),
    lines: z.optional(
      z
        .array(
          z.object({
            line_id: z.number().check(z.int(), z.positive()),
            confirmed_quantity: z.number().check(z.int(), z.gte(0)),
            back_order_quantity: z._default(z.number().check(z.int(), z.gte(0)), 0),
            substitute: z.optional(
              z.object({
                product_id: z.number().check(z.int(), z.positive()),
                quantity: packs(),
                /** Price of one pack; the branch's price when left out. */
                unit_price: z.optional(z.number().check(z.int(), z.gte(0))),
              }),
            ),
            note: z.optional(text(500)),
          }),
        )
        .check(z.maxLength(200)),
    ),
    proposed_date: z.optional(isoDateSchema),
    proposed_time_window: z.optional(timeWindowSchema),
    proposed_slot_id: z.optional(z.number().check(z.int(), z.positive())),
  })
  .check(
    z.refine((b) => (b.lines?.length ?? 0) > 0 || b.proposed_date || b.proposed_slot_id, {
      error: 'propose at least one line change, a date or a slot',
    }),
  );
export type ProposalBody = z.input<typeof proposalBodySchema>;

export const ORDER_SORTS = ['placed_at', 'requested_date', 'status', 'subtotal', 'updated_at'] as const;

export const orderListQuerySchema = z.object({
  status: z.optional(z.enum(ORDER_STATUSES)),
  branch_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
  project_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
  q: z.optional(z.string().check(z.trim(), z.maxLength(100))),
  sort: z._default(z.enum(ORDER_SORTS), 'placed_at'),
  dir: z._default(z.enum(['asc', 'desc']), 'desc'),
  page: z._default(z.coerce.number().check(z.int(), z.gte(1)), 1),
  page_size: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(100)), 25),
});
export type OrderListQuery = z.input<typeof orderListQuerySchema>;

export const orgRefSchema = z.object({ id: z.number().check(z.int()), name: z.string() });

export const orderSiteSchema = z.object({
  name: z.string(),
  site_address: z.string(),
  site_postcode: z.string(),
  contact_name: z.string(),
  contact_phone: z.string(),
  vehicle_access: z.enum(VEHICLE_ACCESS),
  crane_lift: z.enum(CRANE_LIFT),
  overhead_lines: z.enum(OVERHEAD_LINES),
  set_down_place: z.string(),
  access_notes: z.string(),
});
export type OrderSite = z.infer<typeof orderSiteSchema>;

export const orderLineSchema = z.object({
  id: z.number().check(z.int()),
  position: z.number().check(z.int()),
  product_id: z.number().check(z.int()),
  sku: z.string(),
  description: z.string(),
  category: z.enum(PRODUCT_CATEGORIES),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  pack_weight_kg: z.number(),
  /** Packs asked for. */
  quantity: z.number().check(z.int()),
  /** Packs the merchant agreed to send; null until it answers. */
  confirmed_quantity: z.nullable(z.number().check(z.int())),
  back_order_quantity: z.number().check(z.int()),
  reserved_quantity: z.number().check(z.int()),
  unit_price: z.number().check(z.int()),
  /** unit_price × (agreed, or asked, packs + back-ordered packs). */
  total: z.number().check(z.int()),
  status: z.enum(ORDER_LINE_STATUSES),
  replaces_line_id: z.nullable(z.number().check(z.int())),
});
export type OrderLine = z.infer<typeof orderLineSchema>;

/** One item of a bill as it was and as the engine works it out again with another tile. */
const billItemSchema = z.object({
  product_id: z.nullable(z.number().check(z.int())),
  sku: z.nullable(z.string()),
  description: z.string(),
  /** The engine's count in the product's unit (tiles, lengths, nails, rolls). */
  quantity: z.number(),
  unit: z.string(),
  packs: z.number().check(z.int()),
  unit_price: z.nullable(z.number().check(z.int())),
  total: z.nullable(z.number().check(z.int())),
});

/**
 * What a substitute tile means for the order's own roof, from the engine: each item of the bill before
 * and after side by side, the faces the tile may not be laid on (below its lowest pitch), and what the
 * bill costs more or less. Money in minor units.
 */
export const substituteFiguresSchema = z.object({
  engine_version: z.string(),
  tile: z.object({ sku: z.string(), description: z.string(), kind: z.string(), lowest_pitch_deg: z.number() }),
  refused_faces: z.array(z.object({ building: z.string(), face: z.string(), pitch_deg: z.number(), message: z.string() })),
  rows: z.array(z.object({ role: z.string(), label: z.string(), before: z.nullable(billItemSchema), after: z.nullable(billItemSchema), changes: z.boolean() })),
  /** Counted items with no product on the order to meet them (add them by hand). */
  not_counted: z.array(z.string()),
  before_total: z.number().check(z.int()),
  after_total: z.number().check(z.int()),
  price_difference_minor: z.number().check(z.int()),
});
export type SubstituteFigures = z.infer<typeof substituteFiguresSchema>;

/** A product the desk may offer instead of a line, with the figures that go with it. */
export const substituteOptionSchema = z.object({
  product_id: z.number().check(z.int()),
  sku: z.string(),
  name: z.string(),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  pack_price: z.number().check(z.int()),
  available: z.number().check(z.int()),
  /** Packs to offer: the engine's count for a tile, the same quantity in the new pack size otherwise. */
  quantity: z.number().check(z.int()),
  /** False when the tile does not suit every face of the order's roof; the desk cannot offer it. */
  suitable: z.boolean(),
  reason: z.nullable(z.string()),
  figures: z.nullable(substituteFiguresSchema),
});
export type SubstituteOption = z.infer<typeof substituteOptionSchema>;
export const substituteOptionsSchema = z.object({ line_id: z.number().check(z.int()), options: z.array(substituteOptionSchema) });
export type SubstituteOptions = z.infer<typeof substituteOptionsSchema>;

export const proposalLineSchema = z.object({
  order_line_id: z.number().check(z.int()),
  sku: z.string(),
  description: z.string(),
  quantity: z.number().check(z.int()),
  confirmed_quantity: z.number().check(z.int()),
  back_order_quantity: z.number().check(z.int()),
  substitute: z.nullable(
    z.object({
      product_id: z.number().check(z.int()),
      sku: z.string(),
      description: z.string(),
      unit: z.string(),
      pack_size: z.number().check(z.int()),
      quantity: z.number().check(z.int()),
      unit_price: z.number().check(z.int()),
      total: z.number().check(z.int()),
      /** The engine's figures for a substitute tile on the order's roof; null for other products. */
      figures: z.nullable(substituteFiguresSchema),
    }),
  ),
  note: z.string(),
});

const personRef = z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() }));

export const proposalSchema = z.object({
  id: z.number().check(z.int()),
  status: z.enum(PROPOSAL_STATUSES),
  order_revision: z.number().check(z.int()),
  message: z.string(),
  proposed_date: z.nullable(z.string()),
  proposed_time_window: z.nullable(z.string()),
  proposed_slot_id: z.nullable(z.number().check(z.int())),
  proposed_at: z.string(),
  proposed_by: personRef,
  answered_at: z.nullable(z.string()),
  answered_by: personRef,
  lines: z.array(proposalLineSchema),
});
export type Proposal = z.infer<typeof proposalSchema>;

export const orderEventSchema = z.object({
  id: z.number().check(z.int()),
  kind: z.string(),
  at: z.string(),
  actor: z.object({ name: z.string(), organisation: z.nullable(orgRefSchema) }),
  summary: z.string(),
  data: z.record(z.string(), z.unknown()),
});
export type OrderEvent = z.infer<typeof orderEventSchema>;

export const orderSummarySchema = z.object({
  id: z.number().check(z.int()),
  reference: z.string(),
  status: z.enum(ORDER_STATUSES),
  status_label: z.string(),
  revision: z.number().check(z.int()),
  contractor: orgRefSchema,
  branch: branchRefSchema,
  project: z.object({ id: z.number().check(z.int()), name: z.string() }),
  requested_date: z.string(),
  time_window: z.nullable(z.string()),
  delivery_method: z.enum(DELIVERY_METHODS),
  po_reference: z.string(),
  subtotal: z.number().check(z.int()),
  line_count: z.number().check(z.int()),
  placed_at: z.string(),
  updated_at: z.string(),
});
export type OrderSummary = z.infer<typeof orderSummarySchema>;

export const orderSchema = z.extend(orderSummarySchema, {
  estimate_id: z.nullable(z.number().check(z.int())),
  quote_id: z.nullable(z.number().check(z.int())),
  notes: z.string(),
  site: orderSiteSchema,
  lines: z.array(orderLineSchema),
  proposals: z.array(proposalSchema),
  timeline: z.array(orderEventSchema),
  /** What the caller's side may do now (see ORDER_TRANSITIONS). */
  allowed_actions: z.array(z.string()),
  cautions: z.array(z.string()),
  confirmed_at: z.nullable(z.string()),
  cancelled_at: z.nullable(z.string()),
});
export type Order = z.infer<typeof orderSchema>;

/** The order book counts matches up to this many; past it, `total` is this and `total_capped` is true ("10,000+"). */
export const ORDER_COUNT_CAP = 10_000;

export const orderListSchema = z.object({
  orders: z.array(orderSummarySchema),
  total: z.number().check(z.int()),
  /** True when more orders match than ORDER_COUNT_CAP: total is then a floor, not the count. */
  total_capped: z._default(z.boolean(), false),
  page: z.number().check(z.int()),
  page_size: z.number().check(z.int()),
});

export const orderParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
export const orderLineParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), lineId: z.coerce.number().check(z.int(), z.positive()) });
export const proposalParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()), proposalId: z.coerce.number().check(z.int(), z.positive()) });

/** The reference both sides quote on the phone. */
export function orderReference(id: number): string {
  return `RL-${String(id).padStart(6, '0')}`;
}

// Quote requests: one request to up to three branches; each branch answers with its own products and prices.

export const QUOTE_REQUEST_STATUSES = ['open', 'accepted', 'withdrawn'] as const;
export const QUOTE_STATUSES = ['asked', 'answered', 'declined', 'accepted', 'not_chosen', 'withdrawn'] as const;
export const QUOTE_STATUS_LABELS: Record<(typeof QUOTE_STATUSES)[number], string> = {
  asked: 'Waiting for a price',
  answered: 'Priced',
  declined: 'The merchant cannot quote',
  accepted: 'Accepted: became an order',
  not_chosen: 'Another quote was accepted',
  withdrawn: 'Request withdrawn',
};
export const MAX_QUOTE_BRANCHES = 3;

export const createQuoteRequestBodySchema = z.strictObject({
  estimate_id: z.number().check(z.int(), z.positive()),
  branch_ids: z.array(z.number().check(z.int(), z.positive())).check(
    z.minLength(1, { error: 'choose at least one merchant branch' }),
    z.maxLength(MAX_QUOTE_BRANCHES, { error: `a quote request goes to at most ${MAX_QUOTE_BRANCHES} branches` }),
    z.refine((ids) => new Set(ids).size === ids.length, { error: 'a branch is chosen twice' }),
  ),
  requested_date: isoDateSchema,
  time_window: z.optional(z.nullable(timeWindowSchema)),
  delivery_method: z.enum(DELIVERY_METHODS, { error: 'must be ground or roof' }),
  notes: z.optional(text(2000)),
  po_reference: z.optional(text(60)),
});
export type CreateQuoteRequestBody = z.input<typeof createQuoteRequestBodySchema>;

export const answerQuoteBodySchema = z.strictObject({
  lines: z
    .array(
      z.object({
        request_line_id: z.number().check(z.int(), z.positive()),
        product_id: z.number().check(z.int(), z.positive()),
        /** Packs offered; enough packs for the quantity asked when left out. */
        packs: z.optional(packs()),
        /** Price of one pack; the branch's price when left out. */
        unit_price: z.optional(z.number().check(z.int(), z.gte(0))),
        note: z.optional(text(500)),
      }),
    )
    .check(z.minLength(1, { error: 'price at least one line, or decline the request' }), z.maxLength(200)),
  valid_until: z.optional(isoDateSchema),
  message: z.optional(text(2000)),
});
export type AnswerQuoteBody = z.input<typeof answerQuoteBodySchema>;
export const declineQuoteBodySchema = z.strictObject({ message: z.optional(text(2000)) });

export const quoteRequestLineSchema = z.object({
  id: z.number().check(z.int()),
  position: z.number().check(z.int()),
  category: z.enum(PRODUCT_CATEGORIES),
  description: z.string(),
  /** The engine's quantity from the estimate, in `unit`. */
  quantity: z.number(),
  unit: z.string(),
});

export const quoteLineSchema = z.object({
  request_line_id: z.number().check(z.int()),
  product_id: z.nullable(z.number().check(z.int())),
  sku: z.nullable(z.string()),
  description: z.string(),
  unit: z.string(),
  pack_size: z.number().check(z.int()),
  packs: z.number().check(z.int()),
  unit_price: z.number().check(z.int()),
  total: z.number().check(z.int()),
  note: z.string(),
});

export const quoteSchema = z.object({
  id: z.number().check(z.int()),
  status: z.enum(QUOTE_STATUSES),
  status_label: z.string(),
  branch: branchRefSchema,
  message: z.string(),
  valid_until: z.nullable(z.string()),
  total: z.nullable(z.number().check(z.int())),
  answered_at: z.nullable(z.string()),
  order_id: z.nullable(z.number().check(z.int())),
  lines: z.array(quoteLineSchema),
});
export type Quote = z.infer<typeof quoteSchema>;

export const quoteComparisonSchema = z.object({
  quote_ids: z.array(z.number().check(z.int())),
  rows: z.array(
    z.object({
      request_line_id: z.number().check(z.int()),
      category: z.enum(PRODUCT_CATEGORIES),
      description: z.string(),
      quantity: z.number(),
      unit: z.string(),
      /** One entry per quote, in quote_ids order; null where that merchant offers nothing for the line. */
      offers: z.array(z.nullable(z.object({ sku: z.nullable(z.string()), description: z.string(), packs: z.number().check(z.int()), unit_price: z.number().check(z.int()), total: z.number().check(z.int()) }))),
    }),
  ),
  totals: z.array(z.object({ quote_id: z.number().check(z.int()), total: z.nullable(z.number().check(z.int())), lines_offered: z.number().check(z.int()), lines_missing: z.number().check(z.int()) })),
});

export const quoteRequestSchema = z.object({
  id: z.number().check(z.int()),
  status: z.enum(QUOTE_REQUEST_STATUSES),
  contractor: orgRefSchema,
  project: z.object({ id: z.number().check(z.int()), name: z.string() }),
  site: orderSiteSchema,
  estimate_id: z.number().check(z.int()),
  requested_date: z.string(),
  time_window: z.nullable(z.string()),
  delivery_method: z.enum(DELIVERY_METHODS),
  po_reference: z.string(),
  notes: z.string(),
  lines: z.array(quoteRequestLineSchema),
  /** The contractor sees every branch's quote; a merchant only its own. */
  quotes: z.array(quoteSchema),
  /** Side by side, for the contractor only (null for a merchant). */
  comparison: z.nullable(quoteComparisonSchema),
  cautions: z.array(z.string()),
  created_at: z.string(),
  updated_at: z.string(),
});

/** POST /api/quotes/:id/accept: the order the quote became, and the request with its other quotes closed. */
export const acceptQuoteResponseSchema = z.object({
  order: z.object({ id: z.number().check(z.int()), status: z.enum(ORDER_STATUSES), reference: z.string() }),
  quote_request: quoteRequestSchema,
});
export type QuoteRequest = z.infer<typeof quoteRequestSchema>;

export const quoteRequestListSchema = z.object({
  quote_requests: z.array(
    z.extend(z.pick(quoteRequestSchema, { id: true, status: true, contractor: true, project: true, requested_date: true, created_at: true, updated_at: true }), {
      quotes: z.array(z.pick(quoteSchema, { id: true, status: true, branch: true, total: true })),
    }),
  ),
  total: z.number().check(z.int()),
  page: z.number().check(z.int()),
  page_size: z.number().check(z.int()),
});
export type QuoteRequestList = z.infer<typeof quoteRequestListSchema>;

/** Columns the quote-request list sorts by: when it was asked, and the delivery day wanted. */
export const QUOTE_REQUEST_SORTS = ['created_at', 'requested_date'] as const;

/**
 * The quote-request list's query, for either side: the request's stage, only those still waiting for
 * the caller's own price (a merchant's desk), a search over the request number, site, contractor and
 * PO reference, a sort and a page.
 */
export const quoteRequestListQuerySchema = z.strictObject({
  status: z.optional(z.enum(QUOTE_REQUEST_STATUSES)),
  waiting: z.optional(
    z.pipe(
      z.enum(['true', 'false']),
      z.transform((v) => v === 'true'),
    ),
  ),
  q: z.optional(z.string().check(z.trim(), z.maxLength(100, { error: 'must be at most 100 characters' }))),
  sort: z._default(z.enum(QUOTE_REQUEST_SORTS), 'created_at'),
  dir: z._default(z.enum(['asc', 'desc']), 'desc'),
  page: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(10_000)), 1),
  page_size: z._default(z.coerce.number().check(z.int(), z.gte(1), z.lte(100)), 25),
});
export type QuoteRequestListQuery = z.input<typeof quoteRequestListQuerySchema>;
export const quoteParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });

// The merchant's desk: confirming against stock, turning down, the delivery, comments, the order book's filters.

/** Several stages at once for the order book, as a comma list: `sent,agreed`. */
const statusParts = (s: string) =>
  s
    .split(',')
    .map((p) => p.trim())
    .filter(Boolean);
const statusList = z.pipe(
  z.string().check(
    z.trim(),
    z.maxLength(200),
    z.superRefine((s, ctx) => {
      const wrong = statusParts(s).find((p) => !(ORDER_STATUSES as readonly string[]).includes(p));
      if (wrong !== undefined) ctx.addIssue({ code: 'custom', message: `"${wrong}" is not a stage; use ${ORDER_STATUSES.join(', ')}` });
    }),
  ),
  z.transform((s) => statusParts(s) as OrderStatus[]),
);

/** The dates the order book filters on: the delivery day asked for, or the day the order was sent. */
export const ORDER_DATE_FIELDS = ['requested_date', 'placed_at'] as const;

/**
 * The order book's query: the contractor's filters plus the desk's (several stages, a contractor,
 * a date range). Dates are inclusive YYYY-MM-DD; `date_field` says which date they filter.
 */
export const orderBookQuerySchema = z
  .extend(orderListQuerySchema, {
    statuses: z.optional(statusList),
    contractor_id: z.optional(z.coerce.number().check(z.int(), z.positive())),
    date_from: z.optional(isoDateSchema),
    date_to: z.optional(isoDateSchema),
    date_field: z._default(z.enum(ORDER_DATE_FIELDS), 'requested_date'),
  })
  .check(z.refine((q) => !q.date_from || !q.date_to || q.date_from <= q.date_to, { path: ['date_to'], error: 'must be on or after date_from' }));
export type OrderBookQuery = z.input<typeof orderBookQuerySchema>;

/** Confirming: packs to send now per line (the rest is back-ordered), and optionally the slot to book. */
export const confirmOrderBodySchema = z.strictObject({
  lines: z.optional(
    z.array(z.object({ line_id: z.number().check(z.int(), z.positive()), quantity: z.number().check(z.int(), z.gte(0), z.lte(1_000_000)) })).check(
      z.maxLength(200),
      z.superRefine((lines, ctx) => {
        const seen = new Set<number>();
        lines.forEach((l, i) => {
          if (seen.has(l.line_id)) ctx.addIssue({ code: 'custom', path: [i, 'line_id'], message: 'this line is listed twice' });
          seen.add(l.line_id);
        });
      }),
    ),
  ),
  slot_id: z.optional(z.number().check(z.int(), z.positive())),
});
export type ConfirmOrderBody = z.input<typeof confirmOrderBodySchema>;

/** One line short of stock in a refused confirmation: packs free at the branch and packs asked for. */
export const stockShortfallSchema = z.object({ sku: z.string(), line_id: z.number().check(z.int()), available: z.number().check(z.int()), requested: z.number().check(z.int()), message: z.string() });

export const turnDownBodySchema = z.strictObject({ reason: text(500).check(z.minLength(1, { error: 'say why, so the contractor can order elsewhere' })) });

/** Starting the delivery of an order's back-ordered packs: the day (and window) it is now wanted. */
export const followUpBodySchema = z.strictObject({
  requested_date: isoDateSchema,
  time_window: z.optional(z.nullable(timeWindowSchema)),
  note: z.optional(text(500)),
});
export type FollowUpBody = z.input<typeof followUpBodySchema>;

export const bookSlotBodySchema = z.strictObject({ slot_id: z.number().check(z.int(), z.positive()) });

export const commentBodySchema = z.strictObject({ body: text(2000).check(z.minLength(1, { error: 'write a comment' })) });

export const orderCommentSchema = z.object({
  id: z.number().check(z.int()),
  body: z.string(),
  at: z.string(),
  author: z.object({ id: z.nullable(z.number().check(z.int())), name: z.string(), organisation: orgRefSchema }),
  /** Which side wrote it, so each side can tell its own comments from the other's. */
  side: z.enum(['contractor', 'merchant']),
});
export type OrderComment = z.infer<typeof orderCommentSchema>;

/** What the driver records at the site: packs handed over per line (others as sent), who took them, notes. */
export const recordDeliveryBodySchema = z.strictObject({
  lines: z.optional(z.array(z.object({ line_id: z.number().check(z.int(), z.positive()), delivered_quantity: z.number().check(z.int(), z.gte(0), z.lte(1_000_000)) })).check(z.maxLength(200))),
  received_by: text(120).check(z.minLength(1, { error: 'name the person who took the delivery' })),
  notes: z.optional(text(2000)),
  /** When it was handed over; now when left out. */
  delivered_at: z.optional(z.iso.datetime({ error: 'must be an ISO date and time' })),
});
export type RecordDeliveryBody = z.input<typeof recordDeliveryBodySchema>;

/** The booked delivery as both sides see it on the order. */
export const orderSlotSchema = z.object({
  slot_id: z.number().check(z.int()),
  date: z.string(),
  time_window: z.string(),
  lorry: z.object({ id: z.number().check(z.int()), registration: z.string(), has_crane: z.boolean() }),
  driver: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
  weight_kg: z.number(),
  pallets: z.number().check(z.int()),
  booked_at: z.string(),
});

export const orderDeliverySchema = z.object({
  delivered_at: z.string(),
  received_by: z.string(),
  notes: z.string(),
  recorded_by: z.nullable(z.object({ id: z.number().check(z.int()), name: z.string() })),
});

/**
 * One line split three ways, in packs and priced at its pack price: packs on this order's delivery
 * (delivered once recorded, else agreed, else asked), packs to follow on a follow-up order, and packs
 * dropped (neither sent nor following: not available, replaced by a substitute, short on delivery,
 * or the whole order cancelled or turned down).
 */
export const lineAmountsShape = {
  now_quantity: z.number().check(z.int()),
  now_total: z.number().check(z.int()),
  to_follow_total: z.number().check(z.int()),
  dropped_quantity: z.number().check(z.int()),
  dropped_total: z.number().check(z.int()),
};

export const orderAmountsSchema = z.object({
  agreed_now_minor: z.number().check(z.int()),
  to_follow_minor: z.number().check(z.int()),
  dropped_minor: z.number().check(z.int()),
});
export type OrderAmounts = z.infer<typeof orderAmountsSchema>;

export const orderLinkSchema = z.object({ id: z.number().check(z.int()), reference: z.string(), status: z.enum(ORDER_STATUSES), status_label: z.string() });

/**
 * An order as the detail page shows it: the shared order, the packs delivered per line, the booked
 * slot, the delivery record, the comments and the invoice once there is one.
 */
export const orderDetailSchema = z.extend(orderSchema, {
  lines: z.array(z.extend(z.extend(orderLineSchema, { delivered_quantity: z.nullable(z.number().check(z.int())) }), lineAmountsShape)),
  slot: z.nullable(orderSlotSchema),
  delivery: z.nullable(orderDeliverySchema),
  comments: z.array(orderCommentSchema),
  invoice: z.nullable(z.object({ id: z.number().check(z.int()), number: z.string() })),
  /** The order whose back-ordered packs this one carries. */
  follows: z.nullable(orderLinkSchema),
  /** The order that carries this one's back-ordered packs, once started. */
  followed_by: z.nullable(orderLinkSchema),
  /** Packs promised on this order that travel later (its lines' back-ordered packs). */
  back_ordered_packs: z.number().check(z.int()),
  /**
   * The order's money in three parts that add up to what was asked: what comes on this order's
   * delivery (the invoice for it has this net), what follows on the follow-up order, what was dropped.
   */
  amounts: orderAmountsSchema,
});
export type OrderDetail = z.infer<typeof orderDetailSchema>;
