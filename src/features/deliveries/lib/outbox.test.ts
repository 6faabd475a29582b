// @vitest-environment node
// Node's own Blob, FormData and structured clone, with an in-memory IndexedDB: what the phone stores
// (photos and signature as Blobs) comes back out of the database intact, as it does in a browser.
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { deliveryIsRecorded, sendCautionsRead, sendDelivery } from '../api/send-queued';
import { ALREADY_RECORDED_CODES, createOutbox, indexedDbStorage, startOutboxSync } from './outbox';
import type { QueuedDelivery } from './outbox-types';

interface Answer {
  status: number;
  body?: unknown;
}
type Call = { method: string; path: string; headers: Record<string, string>; body: unknown };

/** A server stand-in: answers by "METHOD /path" in turn (the last answer repeats), or fails like a dead connection. */
function fakeServer(answers: Record<string, Array<Answer | 'offline'>>) {
  const calls: Call[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const path = String(input);
    const method = (init?.method ?? 'GET').toUpperCase();
    const key = `${method} ${path}`;
    if (key === 'GET /api/auth/csrf') return new Response(JSON.stringify({ token: 't' }), { status: 200 });
    calls.push({ method, path, headers: { ...(init?.headers as Record<string, string>) }, body: init?.body });
    const queue = answers[key];
    if (!queue || queue.length === 0) throw new Error(`No answer for ${key}`);
    const answer = queue.length > 1 ? queue.shift()! : queue[0];
    if (answer === 'offline') throw new TypeError('fetch failed');
    return new Response(answer.body === undefined ? null : JSON.stringify(answer.body), { status: answer.status, headers: { 'Content-Type': 'application/json' } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { calls, deliveries: () => calls.filter((c) => c.method === 'POST' && c.path === '/api/orders/11/delivery') };
}

function delivery(overrides: Partial<QueuedDelivery> = {}): QueuedDelivery {
  return {
    kind: 'delivery',
    key: crypto.randomUUID(),
    order_id: 11,
    reference: 'RL-000011',
    site_name: 'Hollin Brow',
    data: { receiver_name: 'Gethin Marlow', note: '', delivered_at: '2027-03-01T09:41:00.000Z', lines: [{ line_id: 101, handed_over: 10, short: 0, damaged: 0 }] },
    signature: new Blob([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], { type: 'image/png' }),
    photos: [{ blob: new Blob([new Uint8Array(2048)], { type: 'image/jpeg' }), name: 'pallets.jpg', type: 'image/jpeg' }],
    queued_at: '2027-03-01T09:41:00.000Z',
    attempts: 0,
    state: 'waiting',
    last_error: null,
    ...overrides,
  };
}

let online = false;
function phone() {
  const storage = indexedDbStorage('ridgeload-test', 'outbox');
  const outbox = createOutbox({
    storage,
    send: (entry) => (entry.kind === 'delivery' ? sendDelivery(entry) : sendCautionsRead(entry)),
    isAlreadyRecorded: (entry) => (entry.kind === 'delivery' ? deliveryIsRecorded(entry.order_id) : Promise.resolve(false)),
    isOnline: () => online,
  });
  return { storage, outbox };
}

beforeEach(() => {
  vi.stubGlobal('indexedDB', new IDBFactory());
  online = false;
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('the phone outbox', () => {
  it('keeps a delivery recorded without signal in IndexedDB, with its key, signature and photos as Blobs', async () => {
    const server = fakeServer({});
    const { outbox } = phone();
    const entry = delivery();
    expect(await outbox.record(entry)).toBe('queued');
    expect(server.calls).toHaveLength(0);
    // Read back through a fresh storage, as after the app was closed and opened again.
    const [stored] = await indexedDbStorage('ridgeload-test', 'outbox').all();
    expect(stored.key).toBe(entry.key);
    expect(stored.kind === 'delivery' && stored.signature).toBeInstanceOf(Blob);
    const photo = stored.kind === 'delivery' ? stored.photos[0] : null;
    expect(photo?.blob).toBeInstanceOf(Blob);
    expect(photo?.blob.size).toBe(2048);
    expect(photo?.name).toBe('pallets.jpg');
    expect(outbox.getSnapshot().entries.map((e) => e.key)).toEqual([entry.key]);
  });

  it('sends it once when the signal returns, with the key made on the phone, and forgets it after a 2xx', async () => {
    // At start the server cannot be reached; after the signal returns it answers.
    const server = fakeServer({ 'POST /api/orders/11/delivery': ['offline', { status: 200, body: { order_id: 11 } }] });
    const { outbox } = phone();
    const entry = delivery();
    await outbox.record(entry);
    const target = new EventTarget();
    const stop = startOutboxSync(outbox, target as unknown as Window);
    await vi.waitFor(() => expect(outbox.getSnapshot().lastFlush).toMatchObject({ offline: true, still_waiting: 1 }));
    expect(outbox.getSnapshot().entries).toHaveLength(1);
    online = true;
    target.dispatchEvent(new Event('online'));
    await vi.waitFor(() => expect(outbox.getSnapshot().entries).toHaveLength(0));
    // Another "online" finds nothing left to send.
    target.dispatchEvent(new Event('online'));
    await outbox.flush();
    stop();
    expect(server.deliveries().map((c) => c.headers['Idempotency-Key'])).toEqual([entry.key, entry.key]);
    const sent = server.deliveries()[1];
    const form = sent.body as FormData;
    expect(JSON.parse(String(form.get('data')))).toEqual(entry.data);
    expect((form.get('signature') as Blob).type).toBe('image/png');
    expect((form.getAll('photos') as File[]).map((f) => [f.name, f.size])).toEqual([['pallets.jpg', 2048]]);
    expect(await indexedDbStorage('ridgeload-test', 'outbox').all()).toEqual([]);
  });

  it('tries again with the same key after the connection drops mid-send', async () => {
    const server = fakeServer({ 'POST /api/orders/11/delivery': ['offline', { status: 200, body: { order_id: 11 } }] });
    const { outbox } = phone();
    online = true;
    const entry = delivery();
    expect(await outbox.record(entry)).toBe('queued');
    const [waiting] = outbox.getSnapshot().entries;
    expect(waiting.attempts).toBe(1);
    expect(waiting.state).toBe('waiting');
    const result = await outbox.flush();
    expect(result).toMatchObject({ sent: 1, still_waiting: 0 });
    expect(server.deliveries().map((c) => c.headers['Idempotency-Key'])).toEqual([entry.key, entry.key]);
    expect(outbox.getSnapshot().entries).toHaveLength(0);
  });

  it('keeps it waiting after a server error, and stops at the first dead connection', async () => {
    const server = fakeServer({ 'POST /api/orders/11/delivery': [{ status: 503, body: { error: { code: 'unavailable', message: 'Down for a moment' } } }, 'offline'] });
    const { outbox } = phone();
    await outbox.record(delivery({ queued_at: '2027-03-01T09:00:00.000Z' }));
    await outbox.record(delivery({ queued_at: '2027-03-01T10:00:00.000Z' }));
    await outbox.record(delivery({ queued_at: '2027-03-01T11:00:00.000Z' }));
    const result = await outbox.flush();
    // The first is refused for now (503), the second finds no network, the third is not tried.
    expect(result).toMatchObject({ sent: 0, still_waiting: 3, offline: true });
    expect(server.deliveries()).toHaveLength(2);
    expect(outbox.getSnapshot().entries.map((e) => [e.state, e.attempts])).toEqual([
      ['waiting', 1],
      ['waiting', 1],
      ['waiting', 0],
    ]);
  });

  it.each([...ALREADY_RECORDED_CODES].flatMap((code) => [409, 422].map((status) => [status, code] as const)))('forgets it after a %i %s: the server already has it', async (status, code) => {
    const server = fakeServer({ 'POST /api/orders/11/delivery': [{ status, body: { error: { code, message: 'Already recorded' } } }] });
    const { outbox } = phone();
    await outbox.record(delivery());
    expect(await outbox.flush()).toMatchObject({ already_recorded: 1, refused: 0 });
    expect(outbox.getSnapshot().entries).toHaveLength(0);
    expect(await indexedDbStorage('ridgeload-test', 'outbox').all()).toEqual([]);
    expect(server.deliveries()).toHaveLength(1);
  });

  it('after a 409 that names no such code, asks for the proof: forgotten when the order has one, kept and marked when not', async () => {
    const conflict = { status: 409, body: { error: { code: 'order_not_on_the_road', message: 'RL-000011 is delivered' } } };
    const server = fakeServer({
      'POST /api/orders/11/delivery': [conflict],
      'GET /api/orders/11/delivery': [{ status: 200, body: { order_id: 11 } }],
    });
    const { outbox } = phone();
    await outbox.record(delivery());
    expect(await outbox.flush()).toMatchObject({ already_recorded: 1 });
    expect(outbox.getSnapshot().entries).toHaveLength(0);
    expect(server.calls.map((c) => `${c.method} ${c.path}`)).toEqual(['POST /api/orders/11/delivery', 'GET /api/orders/11/delivery']);

    fakeServer({ 'POST /api/orders/11/delivery': [conflict], 'GET /api/orders/11/delivery': [{ status: 404, body: { error: { code: 'not_found', message: 'No proof' } } }] });
    await outbox.record(delivery());
    expect(await outbox.flush()).toMatchObject({ refused: 1, already_recorded: 0 });
    const [kept] = outbox.getSnapshot().entries;
    expect(kept.state).toBe('refused');
    expect(kept.last_error).toBe('RL-000011 is delivered');
    // A refused entry waits for the driver: a plain flush leaves it alone.
    const before = kept.attempts;
    await outbox.flush();
    expect(outbox.getSnapshot().entries[0].attempts).toBe(before);
  });

  it('sends a record without pictures as JSON, with the key as a header', async () => {
    const server = fakeServer({ 'POST /api/orders/11/delivery': [{ status: 201, body: { order_id: 11 } }] });
    const { outbox } = phone();
    online = true;
    const entry = delivery({ signature: null, photos: [] });
    expect(await outbox.record(entry)).toBe('sent');
    const [sent] = server.deliveries();
    expect(sent.headers['Idempotency-Key']).toBe(entry.key);
    expect(sent.headers['Content-Type']).toBe('application/json');
    expect(JSON.parse(String(sent.body))).toEqual(entry.data);
  });
});
