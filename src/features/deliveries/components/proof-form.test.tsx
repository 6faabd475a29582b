import { fireEvent, screen, waitFor } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { driverDrop } from '../../../test-utils/driver-day-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { OutboxProvider } from '../lib/phone-outbox';
import { createTestOutbox } from '../lib/test-outbox';
import { ProofForm } from './proof-form';

// jsdom has no canvas: a stand-in pad that "signs" when the test says so.
const pad = vi.hoisted(() => ({ current: null as null | { sign: () => void } }));
vi.mock('signature_pad', () => ({
  default: class {
    private empty = true;
    private listeners: Array<() => void> = [];
    constructor() {
      pad.current = {
        sign: () => {
          this.empty = false;
          for (const l of this.listeners) l();
        },
      };
    }
    addEventListener(_type: string, l: () => void) {
      this.listeners.push(l);
    }
    removeEventListener() {}
    isEmpty() {
      return this.empty;
    }
    clear() {
      this.empty = true;
    }
    toData() {
      return [];
    }
    fromData() {}
    off() {}
    toDataURL() {
      return `data:image/png;base64,${btoa('\x89PNG signature')}`;
    }
  },
}));

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
const NOW = new Date('2027-03-01T09:41:00.000Z');

beforeEach(() => {
  // jsdom draws nothing; the stand-in pad needs a context to be "available".
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue({ scale: () => undefined } as unknown as CanvasRenderingContext2D);
  Object.defineProperty(navigator, 'geolocation', { configurable: true, value: undefined });
});

function renderForm(onRecorded = vi.fn()) {
  const outbox = createTestOutbox();
  renderWithProviders(
    <OutboxProvider outbox={outbox}>
      <ProofForm drop={driverDrop()} onRecorded={onRecorded} now={() => NOW} />
    </OutboxProvider>,
  );
  return { outbox, onRecorded };
}

const photo = (name: string, bytes = 1000, type = 'image/jpeg') => new File([new Uint8Array(bytes)], name, { type });

function deliveryCall(fetchMock: ReturnType<typeof stubFetch>) {
  return fetchMock.mock.calls.find(([url, init]) => String(url) === '/api/orders/11/delivery' && init?.method === 'POST');
}

describe('ProofForm', () => {
  it('asks for the receiver and a signature (or the typed name) before anything is sent', async () => {
    const fetchMock = stubFetch({});
    renderForm();
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    expect(await screen.findByText('name the person who took the delivery')).toBeTruthy();
    expect(screen.getByText("have the receiver sign in the box, or type the receiver's name here to confirm")).toBeTruthy();
    expect(screen.getByLabelText('Taken by (name)').getAttribute('aria-invalid')).toBe('true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('names the receiver as required on its field, linked by aria-describedby, and records nothing', async () => {
    const { onRecorded } = renderForm();
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    const receiver = screen.getByLabelText('Taken by (name)');
    await waitFor(() => expect(receiver.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(receiver.getAttribute('aria-describedby')!)?.textContent).toContain('name the person who took the delivery');
    const typed = screen.getByLabelText(/type the receiver.s name again to confirm/);
    expect(document.getElementById(typed.getAttribute('aria-describedby')!)?.textContent).toContain('have the receiver sign in the box');
    // A signature after the try answers the typed name's error.
    pad.current!.sign();
    await waitFor(() => expect(typed.getAttribute('aria-invalid')).toBeNull());
    expect(onRecorded).not.toHaveBeenCalled();
  });

  it('refuses a typed confirmation that is not the receiver’s name', async () => {
    stubFetch({});
    renderForm();
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    fireEvent.change(screen.getByLabelText(/type the receiver.s name again to confirm/), { target: { value: 'G M' } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    expect(await screen.findByText("type the receiver's name as given above")).toBeTruthy();
  });

  it('checks that handed over, short and damaged add up to the packs that went out', async () => {
    stubFetch({});
    renderForm();
    fireEvent.change(screen.getByLabelText('Short: Interlocking tile, slate grey'), { target: { value: '2' } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    expect(await screen.findByText('10 handed over + 2 short + 0 damaged makes 12, but 10 went out')).toBeTruthy();
  });

  it('takes at most six photos, and none over 8 MB, before anything is uploaded', async () => {
    const fetchMock = stubFetch({});
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: () => 'blob:thumb', revokeObjectURL: () => undefined }));
    renderForm();
    const input = screen.getByLabelText('Take a photo', { selector: 'input' });
    expect(input.getAttribute('accept')).toBe('image/*');
    expect(input.getAttribute('capture')).toBe('environment');
    fireEvent.change(input, { target: { files: [1, 2, 3, 4, 5, 6, 7].map((n) => photo(`site-${n}.jpg`)) } });
    expect(await screen.findByText('at most 6 photos: remove 1')).toBeTruthy();
    expect(screen.getAllByRole('img', { name: /^Taken on site, \d of 7$/ })).toHaveLength(7);
    fireEvent.click(screen.getByRole('button', { name: 'Remove photo 7' }));
    await waitFor(() => expect(screen.queryByText('at most 6 photos: remove 1')).toBeNull());
    expect(screen.getByText('Photos (6 of 6)')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Remove photo 6' }));
    fireEvent.change(input, { target: { files: [photo('big.jpg', 9 * 1024 * 1024)] } });
    expect(await screen.findByText('photo 6 is 9.0 MB: at most 8 MB each')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends the record as JSON with an Idempotency-Key made on the phone when the receiver typed their name', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/11/delivery': { status: 200, body: {} } });
    const { onRecorded } = renderForm();
    fireEvent.change(screen.getByLabelText('Handed over: Interlocking tile, slate grey'), { target: { value: '8' } });
    fireEvent.change(screen.getByLabelText('Short: Interlocking tile, slate grey'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('Damaged: Interlocking tile, slate grey'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    fireEvent.change(screen.getByLabelText(/type the receiver.s name again to confirm/), { target: { value: 'gethin  marlow' } });
    fireEvent.change(screen.getByLabelText(/^Note/), { target: { value: 'Left on the hardstanding' } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    await waitFor(() => expect(onRecorded).toHaveBeenCalledWith('sent'));
    const [, init] = deliveryCall(fetchMock)!;
    expect((init!.headers as Record<string, string>)['Idempotency-Key']).toMatch(UUID);
    expect(JSON.parse(String(init!.body))).toEqual({
      receiver_name: 'Gethin Marlow',
      note: 'Left on the hardstanding',
      delivered_at: '2027-03-01T09:41:00.000Z',
      lines: [
        { line_id: 101, handed_over: 8, short: 1, damaged: 1 },
        { line_id: 102, handed_over: 2, short: 0, damaged: 0 },
      ],
    });
  });

  it('sends a signed record with photos as multipart: the fields as JSON in `data`, the signature PNG and each photo', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/11/delivery': { status: 200, body: {} } });
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: () => 'blob:thumb', revokeObjectURL: () => undefined }));
    const { onRecorded } = renderForm();
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    pad.current!.sign();
    expect(await screen.findByText('Signed. Clear it to sign again.')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Take a photo', { selector: 'input' }), { target: { files: [photo('pallets.jpg'), photo('gate.png', 500, 'image/png')] } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    await waitFor(() => expect(onRecorded).toHaveBeenCalledWith('sent'));
    const [, init] = deliveryCall(fetchMock)!;
    expect((init!.headers as Record<string, string>)['Idempotency-Key']).toMatch(UUID);
    const form = init!.body as FormData;
    expect(form).toBeInstanceOf(FormData);
    expect(JSON.parse(String(form.get('data')))).toMatchObject({ receiver_name: 'Gethin Marlow', delivered_at: '2027-03-01T09:41:00.000Z' });
    const signature = form.get('signature') as File;
    expect(signature.type).toBe('image/png');
    expect(signature.name).toBe('signature.png');
    expect((form.getAll('photos') as File[]).map((f) => [f.name, f.type])).toEqual([
      ['pallets.jpg', 'image/jpeg'],
      ['gate.png', 'image/png'],
    ]);
  });

  it('keeps the record on the phone as waiting when there is no signal', async () => {
    stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } } });
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    const { onRecorded } = renderForm();
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    fireEvent.change(screen.getByLabelText(/type the receiver.s name again to confirm/), { target: { value: 'Gethin Marlow' } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    await waitFor(() => expect(onRecorded).toHaveBeenCalledWith('queued'));
  });

  it('shows the server’s refusal on the form and keeps what was entered', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/orders/11/delivery': { status: 422, body: { error: { code: 'validation_failed', message: 'Some fields are not valid', details: [{ path: 'lines.0.short', message: 'more than went out' }] } } },
    });
    const { onRecorded } = renderForm();
    fireEvent.change(screen.getByLabelText('Taken by (name)'), { target: { value: 'Gethin Marlow' } });
    fireEvent.change(screen.getByLabelText(/type the receiver.s name again to confirm/), { target: { value: 'Gethin Marlow' } });
    fireEvent.click(screen.getByRole('button', { name: 'Delivered' }));
    // The server's field error lands on the field its path names, linked to it.
    const short = screen.getByLabelText('Short: Interlocking tile, slate grey');
    await waitFor(() => expect(short.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(short.getAttribute('aria-describedby')!)?.textContent).toContain('more than went out');
    expect(screen.getByText('Check the fields marked below.')).toBeTruthy();
    expect((screen.getByLabelText('Taken by (name)') as HTMLInputElement).value).toBe('Gethin Marlow');
    expect(onRecorded).not.toHaveBeenCalled();
  });
});
