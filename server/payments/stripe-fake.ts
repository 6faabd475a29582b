import { createHmac, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import qs from 'qs';
import escapeHtml from 'escape-html';
import { formatMoney } from '../../shared/domain/money';

/**
 * A local stand-in for the card-payment provider's REST API, for development and tests only. It speaks
 * the small subset the app uses, the way the official SDK expects it: form-encoded request bodies,
 * provider-style JSON objects and errors, Idempotency-Key replay (same key and parameters → the same
 * answer, nothing done twice), hosted checkout sessions with their own payment page on this server,
 * payment intents, refunds, and signed webhook events posted to the app.
 *
 * Test cards follow the provider's published testing guide: 4242 4242 4242 4242 succeeds,
 * 4000 0000 0000 0002 is declined, 4000 0000 0000 9995 is declined for insufficient funds. Any other
 * number is refused, so a real card number is never accepted here.
 */

type Json = Record<string, unknown>;

export interface StripeFakeOptions {
  /** The secret key the app uses; calls with another key get 401 like the real service. */
  secretKey: string;
  /** Signs each webhook event (Stripe-Signature: t=…,v1=HMAC-SHA256 of "t.payload"). */
  webhookSecret: string;
  /** Where events are posted; may be set later, once the app listens. */
  webhookUrl?: string;
  port?: number;
  host?: string;
}

export interface DeliveredEvent {
  event: Json;
  payload: string;
  status: number | null;
}

export interface StripeFake {
  port: number;
  /** http://127.0.0.1:port, what the SDK is pointed at. */
  url: string;
  setWebhookUrl(url: string): void;
  /** Every event sent, with the app's answer, oldest first. */
  events: DeliveredEvent[];
  close(): Promise<void>;
}

const TEST_CARDS: Record<string, { ok: true } | { ok: false; code: string; decline_code: string; message: string }> = {
  '4242424242424242': { ok: true },
  '4000000000000002': { ok: false, code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' },
  '4000000000009995': { ok: false, code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' },
};

const API_VERSION = '2026-10-28.endive';

const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;
const nowSeconds = () => Math.floor(Date.now() / 1000);

/** Key parts that would reach an object's prototype rather than a property of its own. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Turns a form body with bracketed keys (a[b][0][c]=v) into nested objects and arrays, with `qs` (the
 * parser whose bracket format the provider's SDK writes). The fake runs inside the app's process, so a
 * key that names a prototype (__proto__[x], constructor[prototype][x]) is refused outright rather than
 * merely skipped, and every object made has no prototype at all.
 */
export function parseForm(body: string): Json {
  for (const key of new URLSearchParams(body).keys()) {
    const parts = key.split(/[[\].]+/).filter(Boolean);
    const bad = parts.find((p) => PROTOTYPE_KEYS.has(p));
    if (bad !== undefined) throw invalid(`Received unknown parameter: ${key}`, key, 'parameter_unknown');
  }
  return qs.parse(body, { allowPrototypes: false, plainObjects: true, depth: 8, arrayLimit: 1000, parameterLimit: 2000, allowDots: false }) as Json;
}

class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: Json,
  ) {
    super(String(body.message));
  }
}

const invalid = (message: string, param?: string, code = 'parameter_invalid') => new ApiError(400, { type: 'invalid_request_error', code, message, ...(param ? { param } : {}) });

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > 1_000_000) reject(new Error('body too large'));
      else chunks.push(c);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

function luhn(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return digits.length >= 12 && sum % 10 === 0;
}

function money(amount: number, currency: string): string {
  try {
    return formatMoney(amount, currency);
  } catch {
    return `${(amount / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** The fake's hosted payment page: plain HTML on the fake's own port, so no card number reaches the app. */
function paymentPage(session: Json, error?: string): string {
  const items = (session.line_items_data as Json[]) ?? [];
  const paid = session.payment_status === 'paid';
  const amount = money(Number(session.amount_total), String(session.currency));
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Test card payment</title>
<style>body{font-family:system-ui,Arial,sans-serif;background:#eef1f4;color:#1b2530;margin:0}main{max-width:440px;margin:32px auto;background:#fff;border-radius:8px;padding:24px 28px;box-shadow:0 1px 3px #0002}
label{display:block;margin:14px 0 4px;font-weight:600}input{width:100%;box-sizing:border-box;padding:10px;font-size:17px;border:1px solid #8a97a3;border-radius:6px}
button{margin-top:20px;width:100%;padding:12px;font-size:17px;font-weight:600;background:#24435a;color:#fff;border:0;border-radius:6px}.err{background:#fde8e6;color:#8b1c12;padding:10px;border-radius:6px}
.note{font-size:13px;color:#4c5a66}</style></head><body><main>
<p class="note">Local test payment page: no real card is charged. Use 4242 4242 4242 4242 to pay, 4000 0000 0000 0002 to see a decline.</p>
<h1 style="font-size:22px;margin:8px 0">${escapeHtml(amount)}</h1>
<ul>${items.map((i) => `<li>${escapeHtml(String(i.name))}</li>`).join('')}</ul>
${error ? `<p class="err" role="alert" id="error">${escapeHtml(error)}</p>` : ''}
${
  paid
    ? `<p role="status">This payment is complete.</p>${session.success_url ? `<p><a href="${escapeHtml(String(session.success_url))}">Back to the merchant</a></p>` : ''}`
    : `<form method="post" action="/pay/${escapeHtml(String(session.id))}">
<label for="card_number">Card number</label><input id="card_number" name="card_number" inputmode="numeric" autocomplete="cc-number" required>
<label for="expiry">Expiry (MM/YY)</label><input id="expiry" name="expiry" autocomplete="cc-exp" required>
<label for="cvc">Security code</label><input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" required>
<label for="name">Name on card</label><input id="name" name="name" autocomplete="cc-name">
<button type="submit">Pay ${escapeHtml(amount)}</button></form>
${session.cancel_url ? `<p><a href="/pay/${escapeHtml(String(session.id))}/cancel">Cancel and go back</a></p>` : ''}`
}
</main></body></html>`;
}

/** Starts the fake on loopback (port 0 = any free port). */
export async function startStripeFake(opts: StripeFakeOptions): Promise<StripeFake> {
  const host = opts.host ?? '127.0.0.1';
  let webhookUrl = opts.webhookUrl;
  const sessions = new Map<string, Json>();
  const intents = new Map<string, Json>();
  const refunds = new Map<string, Json>();
  const idempotent = new Map<string, { fingerprint: string; status: number; body: Json }>();
  const events: DeliveredEvent[] = [];
  let baseUrl = '';

  async function sendEvent(type: string, object: Json): Promise<void> {
    const event = { id: newId('evt'), object: 'event', api_version: API_VERSION, created: nowSeconds(), livemode: false, pending_webhooks: 1, type, data: { object } };
    const payload = JSON.stringify(event, null, 2);
    const record: DeliveredEvent = { event, payload, status: null };
    events.push(record);
    if (!webhookUrl) return;
    const t = nowSeconds();
    const signature = createHmac('sha256', opts.webhookSecret).update(`${t}.${payload}`).digest('hex');
    try {
      const res = await fetch(webhookUrl, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': `t=${t},v1=${signature}` },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      record.status = res.status;
      await res.arrayBuffer();
    } catch {
      record.status = null;
    }
  }

  const publicSession = (s: Json): Json => {
    const { line_items_data: _items, ...rest } = s;
    return rest;
  };

  function createSession(p: Json): Json {
    if (p.mode !== 'payment') throw invalid('Only mode=payment is supported here.', 'mode');
    if (typeof p.success_url !== 'string' || !p.success_url) throw invalid('Missing required param: success_url.', 'success_url', 'parameter_missing');
    const items = p.line_items as Json[] | undefined;
    if (!Array.isArray(items) || items.length === 0) throw invalid('Missing required param: line_items.', 'line_items', 'parameter_missing');
    let amount = 0;
    let currency = '';
    const data = items.map((item, i) => {
      const price = item.price_data as Json | undefined;
      const quantity = Number(item.quantity ?? 1);
      if (!price) throw invalid(`Missing required param: line_items[${i}][price_data].`, `line_items[${i}][price_data]`, 'parameter_missing');
      const unit = Number(price.unit_amount);
      if (!Number.isInteger(unit) || unit < 0) throw invalid('Invalid integer: unit_amount.', `line_items[${i}][price_data][unit_amount]`);
      if (!Number.isInteger(quantity) || quantity < 1) throw invalid('Invalid integer: quantity.', `line_items[${i}][quantity]`);
      const cur = String(price.currency ?? '').toLowerCase();
      if (!/^[a-z]{3}$/.test(cur)) throw invalid('Invalid currency.', `line_items[${i}][price_data][currency]`);
      if (currency && cur !== currency) throw invalid('All line items must share one currency.', `line_items[${i}][price_data][currency]`);
      currency = cur;
      amount += unit * quantity;
      return { name: String((price.product_data as Json | undefined)?.name ?? 'Item'), amount: unit * quantity };
    });
    if (amount < 30) throw invalid('The Checkout Session total must be at least 0.30.', 'line_items', 'amount_too_small');
    const id = newId('cs');
    const session: Json = {
      id,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: amount,
      amount_subtotal: amount,
      currency,
      client_reference_id: p.client_reference_id ?? null,
      customer_email: p.customer_email ?? null,
      metadata: (p.metadata as Json) ?? {},
      payment_intent: null,
      payment_intent_metadata: ((p.payment_intent_data as Json | undefined)?.metadata as Json) ?? {},
      success_url: p.success_url,
      cancel_url: p.cancel_url ?? null,
      url: `${baseUrl}/pay/${id}`,
      created: nowSeconds(),
      expires_at: nowSeconds() + 24 * 3600,
      livemode: false,
      line_items_data: data,
    };
    sessions.set(id, session);
    return publicSession(session);
  }

  function createRefund(p: Json): Json {
    const pi = intents.get(String(p.payment_intent ?? ''));
    if (!pi) throw new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', param: 'payment_intent', message: `No such payment_intent: '${String(p.payment_intent)}'` });
    if (pi.status !== 'succeeded') throw invalid('This PaymentIntent has no successful charge to refund.', 'payment_intent');
    const refundable = Number(pi.amount) - Number(pi.amount_refunded ?? 0);
    const amount = p.amount === undefined ? refundable : Number(p.amount);
    if (!Number.isInteger(amount) || amount <= 0) throw invalid('Invalid integer: amount.', 'amount');
    if (amount > refundable) {
      throw invalid(`Refund amount (${amount}) is greater than unrefunded amount on charge (${refundable})`, 'amount', refundable === 0 ? 'charge_already_refunded' : 'amount_too_large');
    }
    pi.amount_refunded = Number(pi.amount_refunded ?? 0) + amount;
    const refund = { id: newId('re'), object: 'refund', amount, currency: pi.currency, payment_intent: pi.id, charge: pi.latest_charge, status: 'succeeded', metadata: (p.metadata as Json) ?? {}, created: nowSeconds() };
    refunds.set(refund.id, refund);
    return refund;
  }

  function route(method: string, path: string, params: Json): { status: number; body: Json } {
    let m: RegExpMatchArray | null;
    if (method === 'POST' && path === '/v1/checkout/sessions') return { status: 200, body: createSession(params) };
    if (method === 'GET' && (m = path.match(/^\/v1\/checkout\/sessions\/([\w]+)$/))) {
      const s = sessions.get(m[1]);
      if (!s) throw new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such checkout.session: '${m[1]}'` });
      return { status: 200, body: publicSession(s) };
    }
    if (method === 'POST' && (m = path.match(/^\/v1\/checkout\/sessions\/([\w]+)\/expire$/))) {
      const s = sessions.get(m[1]);
      if (!s) throw new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such checkout.session: '${m[1]}'` });
      if (s.status !== 'open') throw invalid(`This Checkout Session is ${String(s.status)} and cannot be expired.`);
      s.status = 'expired';
      return { status: 200, body: publicSession(s) };
    }
    if (method === 'GET' && (m = path.match(/^\/v1\/payment_intents\/([\w]+)$/))) {
      const pi = intents.get(m[1]);
      if (!pi) throw new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such payment_intent: '${m[1]}'` });
      return { status: 200, body: pi };
    }
    if (method === 'POST' && path === '/v1/refunds') return { status: 200, body: createRefund(params) };
    if (method === 'GET' && (m = path.match(/^\/v1\/refunds\/([\w]+)$/))) {
      const r = refunds.get(m[1]);
      if (!r) throw new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such refund: '${m[1]}'` });
      return { status: 200, body: r };
    }
    throw new ApiError(404, { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${path}).` });
  }

  async function api(req: IncomingMessage, res: ServerResponse, path: string) {
    const send = (status: number, body: Json, replayed = false) => {
      res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req'), ...(replayed ? { 'idempotent-replayed': 'true' } : {}) });
      res.end(JSON.stringify(status >= 400 ? { error: body } : body));
    };
    const auth = req.headers.authorization ?? '';
    if (auth !== `Bearer ${opts.secretKey}`) {
      send(401, { type: 'invalid_request_error', message: `Invalid API Key provided: ${auth.replace(/^Bearer /, '').slice(0, 8)}…` });
      return;
    }
    const raw = await readBody(req);
    const url = new URL(path, 'http://x');
    let params: Json;
    try {
      params = req.method === 'GET' ? parseForm(url.search.slice(1)) : parseForm(raw);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      send(err.status, err.body);
      return;
    }
    const key = req.headers['idempotency-key'];
    const fingerprint = `${req.method} ${url.pathname} ${raw}`;
    if (typeof key === 'string' && req.method === 'POST') {
      const seen = idempotent.get(key);
      if (seen) {
        if (seen.fingerprint !== fingerprint) {
          send(400, {
            type: 'idempotency_error',
            message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
          });
        } else {
          send(seen.status, seen.body, true);
        }
        return;
      }
    }
    let status: number;
    let body: Json;
    try {
      ({ status, body } = route(req.method ?? 'GET', url.pathname, params));
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      status = err.status;
      body = err.body;
    }
    if (typeof key === 'string' && req.method === 'POST' && status < 500) idempotent.set(key, { fingerprint, status, body });
    send(status, body);
  }

  async function hosted(req: IncomingMessage, res: ServerResponse, path: string) {
    const html = (status: number, page: string) => {
      res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
      res.end(page);
    };
    const m = path.match(/^\/pay\/([\w]+)(\/cancel)?$/);
    const session = m ? sessions.get(m[1]) : undefined;
    if (!m || !session) return html(404, '<!doctype html><title>Not found</title><p>No such payment page.</p>');
    if (m[2]) {
      res.writeHead(303, { location: String(session.cancel_url ?? '/') });
      return res.end();
    }
    if (req.method === 'GET') return html(200, paymentPage(session, session.status === 'expired' ? 'This payment page has expired.' : undefined));
    if (req.method !== 'POST') return html(405, '<!doctype html><p>Method not allowed</p>');
    const form = new URLSearchParams(await readBody(req));
    // One payment per session: a second submission of a paid page charges nothing.
    if (session.payment_status === 'paid') return html(200, paymentPage(session));
    if (session.status !== 'open') return html(410, paymentPage(session, 'This payment page has expired.'));
    const number = (form.get('card_number') ?? '').replace(/[\s-]/g, '');
    const expiry = (form.get('expiry') ?? '').trim().match(/^(\d{2})\s*\/\s*(\d{2})$/);
    const cvc = (form.get('cvc') ?? '').trim();
    let problem: string | undefined;
    if (!/^\d{12,19}$/.test(number) || !luhn(number)) problem = 'Your card number is incorrect.';
    else if (!expiry || Number(expiry[1]) < 1 || Number(expiry[1]) > 12) problem = "Your card's expiry date is incomplete.";
    else if (new Date(Date.UTC(2000 + Number(expiry[2]), Number(expiry[1]), 1)).getTime() <= Date.now()) problem = "Your card's expiry date is in the past.";
    else if (!/^\d{3,4}$/.test(cvc)) problem = "Your card's security code is incomplete.";
    if (problem) return html(400, paymentPage(session, problem));

    const outcome = TEST_CARDS[number] ?? { ok: false as const, code: 'card_declined', decline_code: 'test_mode_live_card', message: 'Your card was declined: this is a test page, use a test card.' };
    let pi = session.payment_intent ? intents.get(String(session.payment_intent)) : undefined;
    if (!pi) {
      pi = {
        id: newId('pi'),
        object: 'payment_intent',
        amount: session.amount_total,
        amount_received: 0,
        amount_refunded: 0,
        currency: session.currency,
        status: 'requires_payment_method',
        metadata: { ...(session.payment_intent_metadata as Json) },
        latest_charge: null,
        last_payment_error: null,
        created: nowSeconds(),
        livemode: false,
      };
      intents.set(String(pi.id), pi);
      session.payment_intent = pi.id;
    }
    if (!outcome.ok) {
      pi.last_payment_error = { type: 'card_error', code: outcome.code, decline_code: outcome.decline_code, message: outcome.message };
      await sendEvent('payment_intent.payment_failed', { ...pi });
      return html(402, paymentPage(session, outcome.message));
    }
    pi.status = 'succeeded';
    pi.amount_received = pi.amount;
    pi.latest_charge = newId('ch');
    pi.last_payment_error = null;
    session.status = 'complete';
    session.payment_status = 'paid';
    await sendEvent('payment_intent.succeeded', { ...pi });
    await sendEvent('checkout.session.completed', publicSession(session));
    res.writeHead(303, { location: String(session.success_url).replace('{CHECKOUT_SESSION_ID}', String(session.id)) });
    res.end();
  }

  const server: Server = createServer((req, res) => {
    const path = req.url ?? '/';
    const handler = path.startsWith('/v1/') ? api : hosted;
    handler(req, res, path).catch(() => {
      if (!res.headersSent) res.writeHead(500, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ error: { type: 'api_error', message: 'The local payment fake failed.' } }));
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  baseUrl = `http://${host}:${port}`;
  return {
    port,
    url: baseUrl,
    events,
    setWebhookUrl(url: string) {
      webhookUrl = url;
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
