import { BusinessCalendar, DEFAULT_BUSINESS_TIME_ZONE, addDays, nextWorkingDay } from '../shared/domain/business-calendar';
import type { Knex } from 'knex';
import pino from 'pino';
import { can, type Action } from '../shared/domain/policy';
import { createProjectBodySchema } from '../shared/schemas/project.schema';
import { confirmOrderBodySchema, createQuoteRequestBodySchema, answerQuoteBodySchema, placeOrderBodySchema, proposalBodySchema, type OrderDetail } from '../shared/schemas/order.schema';
import type { AuthUser } from '../server/auth/auth-user';
import type { Config } from '../server/config/env';
import type { Mailer } from '../server/mail/mailer';
import { deliveriesService } from '../server/modules/deliveries/deliveries.service';
import { estimatesService } from '../server/modules/estimates/estimates.service';
import { invoicesRepository } from '../server/modules/invoices/invoices.repository';
import { invoicesService } from '../server/modules/invoices/invoices.service';
import { demoProofFiles } from './demo-proof-images';
import { usersRepository } from '../server/modules/members/users.repository';
import { ordersService } from '../server/modules/orders/orders.service';
import { paymentsService } from '../server/modules/payments/payments.service';
import { projectsService } from '../server/modules/projects/projects.service';
import { quotesService } from '../server/modules/quotes/quotes.service';
import { schedulesService } from '../server/modules/schedules/schedules.service';
import { runsService } from '../server/modules/runs/runs.service';
import { slotsService } from '../server/modules/slots/slots.service';

/**
 * A believable order book for the demo desks, made the way people make it: the demo estimators
 * estimate and order, the desks offer changes, confirm (holding stock), book lorries and invoice,
 * the yard sends lorries out, the drivers record the drops, one invoice is paid by card. Every step
 * goes through the product's own services, so stock holds, lorry loads, invoice numbers and
 * timelines are exactly what the app itself would have made. Quantities are a plot's share of an
 * estimate, so each load fits one lorry. Names, places and references are invented.
 */

/** A second demo site, for the second demo contractor (invented place and people). */
const SECOND_SITE = {
  organisation: 'Wrenhallow Slate & Tile',
  estimator: 'estimator2@demo.test',
  project: {
    name: 'Ferncombe Rise, plots 1–4',
    reference: 'WST-0412',
    site_address: 'Ferncombe Rise, off Pellingsby Road, Caddonmere',
    site_postcode: 'QD4 8NT',
    contact_name: 'Ysolde Parrack',
    contact_phone: '07700 900 772',
    vehicle_access: 'any',
    crane_lift: 'unknown',
    overhead_lines: 'none',
    set_down_place: 'Front drive of plot 1, on boards',
    access_notes: 'Narrow lane: the lorry backs in from Pellingsby Road. No deliveries before 08:00.',
    buildings: [{ name: 'Rowan', kind: 'building', notes: 'Terrace of four, gable ends, plots 1–4' }],
  },
  /** A terrace of four with plain gable roofs, in millimetres. */
  schedule: ['building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top', 'Rowan,Front,4,40,4800,7800,verge,verge,ridge', 'Rowan,Back,4,40,4800,7800,verge,verge,ridge'].join('\r\n'),
} as const;

/** The app's settings a seed needs: links in e-mails that are never sent, and the currency invoices carry. */
function seedConfig(): Config {
  return {
    nodeEnv: 'development',
    isProduction: false,
    port: 3000,
    host: '127.0.0.1',
    dataDir: '.',
    databaseFile: '',
    database: '',
    sessionSecret: '',
    appUrl: process.env.APP_URL ?? 'http://localhost:3000',
    allowedOrigins: [],
    devSmtpPort: 0,
    mailFrom: 'Ridgeload <no-reply@ridgeload.test>',
    mailDomain: 'ridgeload.test',
    mailWorker: false,
    logLevel: 'silent',
    loginRateLimit: 10,
    resetRateLimit: 5,
    seedDemo: 'auto',
    calendar: new BusinessCalendar(process.env.BUSINESS_TIME_ZONE ?? DEFAULT_BUSINESS_TIME_ZONE),
    currency: (process.env.CURRENCY ?? 'GBP').toUpperCase(),
    stripe: { devPort: 0 },
  };
}

/** The demo history happened before anyone signed in: nobody is e-mailed about it. */
const silentMailer: Mailer = { send: async () => {}, close: () => {} };

/** The n-th working day after today (n ≥ 1), as YYYY-MM-DD. */
function workingDay(today: string, n: number): string {
  let d = today;
  for (let left = n; left > 0; left--) d = nextWorkingDay(d);
  return d;
}

const MORNING = '07:30-12:00';
const AFTERNOON = '12:30-16:30';

/**
 * Safe to run again: once either demo contractor has an order or a quote request, the book is left
 * as it is. It is made in one transaction (the services' own transactions nest inside it), so a
 * step that fails leaves no half-made book behind.
 */
export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    const before = Number((await trx('mail_outbox').max({ id: 'id' }).first())?.id ?? 0);
    await buildOrderBook(trx);
    // The services wrote their e-mails about this history to the outbox; nobody is told of it.
    await trx('mail_outbox').where('id', '>', before).delete();
  });
}

async function buildOrderBook(knex: Knex): Promise<void> {
  const emails = ['estimator@demo.test', 'estimator2@demo.test', 'sales@demo.test', 'sales2@demo.test', 'dispatch@demo.test', 'dispatch2@demo.test', 'driver@demo.test', 'driver2@demo.test'];
  const rows = await knex('users').whereIn('email', emails).select('id', 'email');
  if (rows.length !== emails.length) return;
  const users = usersRepository(knex);
  const people = new Map<string, AuthUser>();
  for (const r of rows) people.set(r.email as string, (await users.findAuthUser(r.id as number))!);
  const person = (email: string) => people.get(email)!;

  const contractorIds = [person('estimator@demo.test').organisation.id, person('estimator2@demo.test').organisation.id];
  if (await knex('orders').whereIn('contractor_organisation_id', contractorIds).first()) return;
  if (await knex('quote_requests').whereIn('contractor_organisation_id', contractorIds).first()) return;
  const hollin = await knex('projects').where({ organisation_id: contractorIds[0], name: 'Hollin Brow, plots 1–20' }).first();
  if (!hollin) return;

  const deps = { db: knex, mailer: silentMailer, logger: pino({ level: 'silent' }), config: seedConfig() };
  const orders = ordersService(deps);
  const quotes = quotesService(deps, orders);
  const estimates = estimatesService(deps);
  const projects = projectsService(deps);
  const schedules = schedulesService(deps);
  const slots = slotsService(deps);
  const runs = runsService(deps);
  const payments = paymentsService(deps, null);
  const invoices = invoicesService(deps, payments);
  const deliveries = deliveriesService(deps);

  /** Each step is taken as the demo person whose job it is; a seed that slips past the policy fails loudly. */
  const as = (email: string, action: Action) => {
    const u = person(email);
    if (!can(u.role, action)) throw new Error(`demo orders: ${email} (${u.role}) may not ${action}`);
    return u;
  };
  const EST1 = 'estimator@demo.test';
  const EST2 = 'estimator2@demo.test';
  const SALES1 = 'sales@demo.test';
  const SALES2 = 'sales2@demo.test';

  const merchantIds = [person(SALES1).organisation.id, person(SALES2).organisation.id];
  const branchOf = async (merchantId: number, name: string) => (await knex('branches').where({ organisation_id: merchantId, name }).first()) as { id: number } | undefined;
  const tollerbeckYard = await branchOf(merchantIds[0], 'Tollerbeck Yard');
  const cindermoor = await branchOf(merchantIds[0], 'Cindermoor Depot');
  const caddonmereWharf = await branchOf(merchantIds[1], 'Caddonmere Wharf');
  const pellingsby = await branchOf(merchantIds[1], 'Pellingsby Yard');
  if (!tollerbeckYard || !cindermoor || !caddonmereWharf || !pellingsby) return;
  const systemAt = async (branchId: number, name: string) => ((await knex('roof_systems').where({ branch_id: branchId, name }).first()) as { id: number } | undefined)?.id;

  // The second contractor's site and schedule, entered as its estimator would.
  const est2 = as(EST2, 'projects:write');
  const ferncombe = await projects.create(est2, createProjectBodySchema.parse(SECOND_SITE.project));
  await schedules.importCsv(est2, ferncombe.id, SECOND_SITE.schedule, 'ferncombe-rise.csv');

  // Estimates from the merchants' own roof systems.
  const estimateOf = async (email: string, projectId: number, branchId: number, systemName: string) => {
    const systemId = await systemAt(branchId, systemName);
    if (!systemId) throw new Error(`demo orders: no roof system ${systemName} at branch ${branchId}`);
    return estimates.create(as(email, 'estimates:write'), projectId, { system_id: systemId });
  };
  const hbFlatlock = await estimateOf(EST1, hollin.id, tollerbeckYard.id, 'Flatlock 420 interlocking tile roof');
  const hbWharfLock = await estimateOf(EST1, hollin.id, caddonmereWharf.id, 'Wharf-Lock 380 interlocking tile roof');
  const frSlate = await estimateOf(EST2, ferncombe.id, pellingsby.id, 'Pellingsby slate roof 500 × 250');
  const frPlain = await estimateOf(EST2, ferncombe.id, tollerbeckYard.id, 'Kilnworth clay plain tile roof');
  type Estimate = typeof hbFlatlock;

  /**
   * A share of an estimate's lines in whole packs (at least one of each): one plot of the twenty at
   * Hollin Brow, one house of the four at Ferncombe Rise. `only` keeps some categories.
   */
  const share = (e: Estimate, fraction: number, only?: string[]) =>
    e.lines.filter((l) => l.product_id !== null && (!only || only.includes(l.category))).map((l) => ({ product_id: l.product_id!, quantity: Math.max(1, Math.ceil(l.packs * fraction)) }));

  const today = deps.config.calendar.today();
  const day = (n: number) => workingDay(today, n);

  const place = (
    email: string,
    e: Estimate,
    branchId: number,
    body: { requested_date: string; po_reference: string; delivery_method?: 'ground' | 'roof'; time_window?: string; notes?: string; lines: { product_id: number; quantity: number }[] },
  ) => orders.place(as(email, 'orders:place'), placeOrderBodySchema.parse({ estimate_id: e.id, branch_id: branchId, delivery_method: 'ground', ...body }));

  const slotIdOf = async (registration: string, date: string, window: string): Promise<number> => {
    const lorry = (await knex('lorries').where({ registration }).whereIn('organisation_id', merchantIds).first()) as { id: number; branch_id: number; organisation_id: number; has_crane: number | boolean };
    const slot = await knex('delivery_slots').where({ lorry_id: lorry.id, date, time_window: window }).first();
    if (slot) return slot.id as number;
    // A weekend today has no run in the calendar: the yard adds one, with the driver, as it would for a Saturday delivery.
    const dispatcher = [...people.values()].find((u) => u.role === 'merchant_dispatcher' && u.organisation.id === lorry.organisation_id)!;
    const driver = [...people.values()].find((u) => u.role === 'driver' && u.organisation.id === lorry.organisation_id)!;
    const made = await slots.create(as(dispatcher.email, 'fleet:manage'), lorry.branch_id, { lorry_id: lorry.id, date, time_window: window, driver_id: lorry.has_crane ? driver.id : null });
    return made.id;
  };

  const confirm = (email: string, o: OrderDetail, slot?: number) => orders.confirm(as(email, 'orders:confirm'), o.id, confirmOrderBodySchema.parse(slot ? { slot_id: slot } : {}));
  /** The yard ticks every pallet of the order loaded on its run, then sends it out. */
  const dispatch = async (email: string, o: OrderDetail) => {
    const yard = as(email, 'runs:load');
    const booking = (await knex('slot_bookings').where({ order_id: o.id }).first('slot_id')) as { slot_id: number };
    const run = await runs.get(yard, booking.slot_id);
    for (const [i, p] of run.deck.positions.entries()) if (p.order_id === o.id && !p.loaded) await runs.setLoaded(yard, run.id, i, true);
    return orders.dispatch(as(email, 'slots:book'), o.id);
  };
  /** The driver's record of a drop; `proof` adds the signature and a photo made for the demo. */
  const deliver = async (email: string, o: OrderDetail, body: { received_by: string; notes?: string }, proof = false) =>
    deliveries.record(
      as(email, 'deliveries:record'),
      o.id,
      { receiver_name: body.received_by, note: body.notes ?? '', ...(proof ? { position: { lat: 53.4862, lng: -2.0871, accuracy_m: 9 } } : {}) },
      proof ? await demoProofFiles() : [],
    );
  const invoice = (email: string, o: OrderDetail) => invoices.issue(as(email, 'invoices:issue'), o.id);

  // ---- Tollerbeck Roofing Supplies ----

  // Delivered this morning and invoiced on Brackenfold's 30-day account.
  const plot1 = await place(EST1, hbFlatlock, tollerbeckYard.id, {
    requested_date: today,
    time_window: MORNING,
    po_reference: 'HB-P01',
    delivery_method: 'roof',
    notes: 'Plot 1 (Alder). Lift onto the scaffold loading bay.',
    lines: share(hbFlatlock, 1 / 20),
  });
  await confirm(SALES1, plot1, await slotIdOf('RL-TY01', today, MORNING));
  await dispatch('dispatch@demo.test', plot1);
  await deliver('driver@demo.test', plot1, { received_by: 'Gethin Marlow', notes: 'Lifted onto the loading bay of plot 1; stacks spread along both slopes.' }, true);
  await invoice(SALES1, plot1);

  // On the road now.
  const plot2 = await place(EST1, hbFlatlock, tollerbeckYard.id, { requested_date: today, time_window: AFTERNOON, po_reference: 'HB-P02', lines: share(hbFlatlock, 1 / 20) });
  await confirm(SALES1, plot2, await slotIdOf('RL-TY01', today, AFTERNOON));
  await dispatch('dispatch@demo.test', plot2);

  // Confirmed and booked on the crane lorry for the next working day.
  const plot3 = await place(EST1, hbFlatlock, tollerbeckYard.id, { requested_date: day(1), time_window: MORNING, po_reference: 'HB-P03', delivery_method: 'roof', lines: share(hbFlatlock, 1 / 20) });
  await confirm(SALES1, plot3, await slotIdOf('RL-TY01', day(1), MORNING));

  // Battens, nails and underlay for the felt-and-batten gang: booked on the tail-lift lorry, no driver on that run yet.
  const battens = await place(EST1, hbFlatlock, tollerbeckYard.id, {
    requested_date: day(2),
    po_reference: 'HB-FB-04',
    notes: 'Felt and batten for plots 4–6 ahead of the tiles.',
    lines: share(hbFlatlock, 3 / 20, ['batten', 'batten_nail', 'underlay']),
  });
  await confirm(SALES1, battens, await slotIdOf('RL-TY02', day(2), MORNING));

  // Confirmed from the Cindermoor depot's stock with half the hip tiles back-ordered, waiting for the desk
  // to book a lorry; the desk starts the follow-up order for the rest of the hips when they come in.
  const plot5 = await place(EST1, hbFlatlock, cindermoor.id, { requested_date: day(3), po_reference: 'HB-P05', lines: share(hbFlatlock, 1 / 20) });
  const plot5Hips = plot5.lines.find((l) => l.category === 'hip');
  await orders.confirm(
    as(SALES1, 'orders:confirm'),
    plot5.id,
    confirmOrderBodySchema.parse(plot5Hips && plot5Hips.quantity > 1 ? { lines: [{ line_id: plot5Hips.id, quantity: Math.floor(plot5Hips.quantity / 2) }] } : {}),
  );

  // The desk offered changes: the hip tiles in two drops and a later day; the estimator has not answered.
  const plot6 = await place(EST1, hbFlatlock, tollerbeckYard.id, { requested_date: day(4), po_reference: 'HB-P06', lines: share(hbFlatlock, 1 / 20) });
  const hipLine = plot6.lines.find((l) => l.category === 'hip') ?? plot6.lines[plot6.lines.length - 1];
  await orders.offerChanges(
    as(SALES1, 'orders:confirm'),
    plot6.id,
    proposalBodySchema.parse({
      revision: plot6.revision,
      message: 'Half the hips now, the rest from our next delivery into the yard. Can we come a day later?',
      proposed_date: day(5),
      lines: [{ line_id: hipLine.id, confirmed_quantity: Math.ceil(hipLine.quantity / 2), back_order_quantity: hipLine.quantity - Math.ceil(hipLine.quantity / 2), note: 'Rest to follow' }],
    }),
  );

  // Changes agreed by the estimator, waiting for the desk to confirm.
  const plot7 = await place(EST1, hbFlatlock, tollerbeckYard.id, { requested_date: day(5), po_reference: 'HB-P07', lines: share(hbFlatlock, 1 / 20) });
  const { proposal_id: plot7Offer } = await orders.offerChanges(
    as(SALES1, 'orders:confirm'),
    plot7.id,
    proposalBodySchema.parse({ revision: plot7.revision, message: 'The morning run is full that day; afternoon instead?', proposed_date: day(6), proposed_time_window: AFTERNOON }),
  );
  await orders.acceptChanges(as(EST1, 'orders:respond'), plot7.id, plot7Offer, 'Afternoon is fine, the gang will be on site.');

  // Newly sent, waiting for the desk.
  await place(EST1, hbFlatlock, tollerbeckYard.id, { requested_date: day(7), po_reference: 'HB-P08', lines: share(hbFlatlock, 1 / 20) });
  await place(EST2, frPlain, tollerbeckYard.id, { requested_date: day(6), po_reference: 'FR-CL-2', notes: 'Plot 2 of the Rowan terrace.', lines: share(frPlain, 1 / 4) });

  // Delivered to Wrenhallow from the Cindermoor depot (no account there: card) and paid.
  const frPlot1 = await place(EST2, frPlain, cindermoor.id, { requested_date: today, time_window: MORNING, po_reference: 'FR-CL-1', notes: 'Plot 1 of the Rowan terrace.', lines: share(frPlain, 1 / 4) });
  await confirm(SALES1, frPlot1, await slotIdOf('RL-CD01', today, MORNING));
  await dispatch('dispatch@demo.test', frPlot1);
  await deliver('driver@demo.test', frPlot1, { received_by: 'Ysolde Parrack', notes: 'Set down on boards on the front drive of plot 1.' });
  const frInvoice = await invoice(SALES1, frPlot1);
  await payByCard(knex, payments, frInvoice.id, frInvoice.balance, frInvoice.currency, person(EST2).id);

  // Turned down: the depot's crane lorry is off the road that week.
  const turned = await place(EST1, hbFlatlock, cindermoor.id, { requested_date: day(2), po_reference: 'HB-P10', delivery_method: 'roof', lines: share(hbFlatlock, 1 / 20) });
  await orders.turnDown(as(SALES1, 'orders:confirm'), turned.id, 'The Cindermoor crane lorry is in for its thorough examination that week: please order the lift from Tollerbeck Yard.');

  // ---- Caddonmere Tile & Timber ----

  const fr1 = await place(EST2, frSlate, pellingsby.id, { requested_date: today, po_reference: 'FR-SL-1', lines: share(frSlate, 1 / 4) });
  await confirm(SALES2, fr1, await slotIdOf('RL-PY01', today, MORNING));
  await dispatch('dispatch2@demo.test', fr1);
  await deliver('driver2@demo.test', fr1, { received_by: 'Ysolde Parrack', notes: 'Set down on boards on the drive of plot 1.' });
  await invoice(SALES2, fr1);

  const fr3 = await place(EST2, frSlate, pellingsby.id, { requested_date: day(2), po_reference: 'FR-SL-3', lines: share(frSlate, 1 / 4) });
  await confirm(SALES2, fr3, await slotIdOf('RL-PY01', day(2), MORNING));

  // ---- Runs for the yards: today's and the next working days' loads, built pallet by pallet ----

  /** The yard ticks a share of an order's pallets loaded on its run (1 = all of them). */
  const load = async (email: string, o: OrderDetail, fraction: number) => {
    const yard = as(email, 'runs:load');
    const booking = (await knex('slot_bookings').where({ order_id: o.id }).first('slot_id')) as { slot_id: number };
    const run = await runs.get(yard, booking.slot_id);
    const mine = [...run.deck.positions.entries()].filter(([, p]) => p.order_id === o.id);
    for (const [i] of mine.slice(0, Math.ceil(mine.length * fraction))) await runs.setLoaded(yard, run.id, i, true);
  };
  const withDriver = async (email: string, slotId: number, driverEmail: string) => slots.update(as(email, 'fleet:manage'), slotId, { driver_id: person(driverEmail).id });

  // Tollerbeck Yard, next working day: the crane lorry's morning run gets a second drop, set down at
  // ground level after the lift at plot 3; the yard loaded it all this evening.
  const plot4 = await place(EST1, hbFlatlock, tollerbeckYard.id, {
    requested_date: day(1),
    time_window: MORNING,
    po_reference: 'HB-P04',
    notes: 'Plot 4: ridge, hips and tile nails, set down on the hardstanding by the site cabin.',
    lines: share(hbFlatlock, 1 / 20, ['ridge', 'hip', 'tile_nail']),
  });
  await confirm(SALES1, plot4, await slotIdOf('RL-TY01', day(1), MORNING));
  await load('dispatch@demo.test', plot3, 1);
  await load('dispatch@demo.test', plot4, 1);

  // Tollerbeck Yard, this afternoon: the tail-lift lorry takes two drops and is half loaded.
  const tailLiftToday = await slotIdOf('RL-TY02', today, AFTERNOON);
  await withDriver('dispatch@demo.test', tailLiftToday, 'driver@demo.test');
  const frPlot3 = await place(EST2, frPlain, tollerbeckYard.id, { requested_date: today, time_window: AFTERNOON, po_reference: 'FR-CL-3', notes: 'Plot 3 of the Rowan terrace.', lines: share(frPlain, 1 / 8) });
  await confirm(SALES1, frPlot3, tailLiftToday);
  const fb7 = await place(EST1, hbFlatlock, tollerbeckYard.id, {
    requested_date: today,
    time_window: AFTERNOON,
    po_reference: 'HB-FB-07',
    notes: 'Felt and batten for plot 7.',
    lines: share(hbFlatlock, 1 / 20, ['batten', 'batten_nail', 'underlay']),
  });
  await confirm(SALES1, fb7, tailLiftToday);
  await load('dispatch@demo.test', frPlot3, 1);

  // Cindermoor Depot, next working day: a crane drop with part of the tiles back-ordered, so a face is short.
  const plot11 = await place(EST1, hbFlatlock, cindermoor.id, { requested_date: day(1), time_window: MORNING, po_reference: 'HB-P11', delivery_method: 'roof', lines: share(hbFlatlock, 1 / 40) });
  const plot11Tiles = plot11.lines.find((l) => l.category === 'tile')!;
  await orders.confirm(
    as(SALES1, 'orders:confirm'),
    plot11.id,
    confirmOrderBodySchema.parse({ slot_id: await slotIdOf('RL-CD01', day(1), MORNING), lines: [{ line_id: plot11Tiles.id, quantity: Math.max(1, Math.floor(plot11Tiles.quantity * 0.7)) }] }),
  );

  // Caddonmere Wharf, this afternoon: a crane lift and a ground drop on one run, not yet loaded.
  const wharfToday = await slotIdOf('RL-CW01', today, AFTERNOON);
  await withDriver('dispatch2@demo.test', wharfToday, 'driver2@demo.test');
  const plot12 = await place(EST1, hbWharfLock, caddonmereWharf.id, { requested_date: today, time_window: AFTERNOON, po_reference: 'HB-P12', delivery_method: 'roof', lines: share(hbWharfLock, 1 / 40) });
  await confirm(SALES2, plot12, wharfToday);
  const plot13 = await place(EST1, hbWharfLock, caddonmereWharf.id, {
    requested_date: today,
    time_window: AFTERNOON,
    po_reference: 'HB-P13',
    lines: share(hbWharfLock, 1 / 40, ['ridge', 'hip', 'batten', 'batten_nail', 'tile_nail', 'underlay']),
  });
  await confirm(SALES2, plot13, wharfToday);

  // Pellingsby Yard, next working day: slates on the tail-lift lorry.
  const fr2 = await place(EST2, frSlate, pellingsby.id, { requested_date: day(1), time_window: MORNING, po_reference: 'FR-SL-2', lines: share(frSlate, 1 / 8) });
  await confirm(SALES2, fr2, await slotIdOf('RL-PY02', day(1), MORNING));

  await place(EST1, hbWharfLock, caddonmereWharf.id, { requested_date: day(8), po_reference: 'HB-P09', notes: 'Price check against our usual merchant.', lines: share(hbWharfLock, 1 / 20) });

  // ---- Quote requests ----

  // A price for the whole of Hollin Brow asked of both Tollerbeck branches; Cindermoor has priced it, Tollerbeck Yard has not answered yet.
  const wholeSite = await quotes.create(
    as(EST1, 'orders:place'),
    createQuoteRequestBodySchema.parse({
      estimate_id: hbFlatlock.id,
      branch_ids: [tollerbeckYard.id, cindermoor.id],
      requested_date: day(9),
      delivery_method: 'ground',
      po_reference: 'HB-Q-SITE',
      notes: 'A price for all twenty plots, delivered a plot at a time, before we order the rest.',
    }),
  );
  const cindermoorQuote = wholeSite.quotes.find((q) => q.branch.id === cindermoor.id)!;
  // Both branches sell the merchant's whole range, so each line is priced with the product the estimate was made with.
  const productOf = new Map(hbFlatlock.lines.filter((l) => l.product_id !== null).map((l) => [l.category, l.product_id!]));
  await quotes.answer(
    as(SALES1, 'orders:confirm'),
    cindermoorQuote.id,
    answerQuoteBodySchema.parse({
      lines: wholeSite.lines.filter((rl) => productOf.has(rl.category)).map((rl) => ({ request_line_id: rl.id, product_id: productOf.get(rl.category)! })),
      valid_until: addDays(today, 30),
      message: 'Our list prices for the whole site; we deliver a plot to a load.',
    }),
  );

  // Ferncombe Rise's slate asked of both Caddonmere branches; neither has answered.
  await quotes.create(
    as(EST2, 'orders:place'),
    createQuoteRequestBodySchema.parse({
      estimate_id: frSlate.id,
      branch_ids: [caddonmereWharf.id, pellingsby.id],
      requested_date: day(10),
      delivery_method: 'ground',
      po_reference: 'FR-Q-SLATE',
    }),
  );
}

/**
 * A card payment of the whole balance, recorded as the payment provider's completed-checkout event
 * records it (the seed cannot open the provider's card page), so the invoice's paid total and
 * status come from the payments service itself.
 */
async function payByCard(knex: Knex, payments: ReturnType<typeof paymentsService>, invoiceId: number, amount: number, currency: string, userId: number) {
  const repo = invoicesRepository(knex);
  const sessionId = `cs_demo_${invoiceId}`;
  await knex.transaction(async (trx) => {
    const id = await repo.insertPayment(trx, { invoice_id: invoiceId, amount, currency, created_by: userId });
    await repo.updatePayment(trx, id, { provider_session_id: sessionId });
  });
  const event = {
    id: `evt_demo_${invoiceId}`,
    type: 'checkout.session.completed',
    data: { object: { id: sessionId, payment_status: 'paid', amount_total: amount, payment_intent: `pi_demo_${invoiceId}` } },
  };
  await payments.handleEvent(event as unknown as Parameters<typeof payments.handleEvent>[0]);
}
