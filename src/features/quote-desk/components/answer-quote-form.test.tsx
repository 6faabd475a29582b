import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { setAppCurrency } from '../../../lib/format';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { quoteRequestFixture, quoteStockFixture } from '../../../test-utils/quote-fixture';
import { AnswerQuoteForm } from './answer-quote-form';

const stock = [quoteStockFixture(11, 'TRS-FL420-SG', 'tile', 30_720), quoteStockFixture(12, 'TRS-RHR-SG', 'ridge', 1_850)];

describe('AnswerQuoteForm', () => {
  it('sends a priced line in whole pence and leaves packs to the server when not typed', async () => {
    const request = quoteRequestFixture();
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/quotes/31/answer': { status: 200, body: request } });
    renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Product for Interlocking tile'), { target: { value: '11' } });
    // £295.50 is 29 550 pence: a pound is 100 pence (Decimal Currency Act 1969).
    fireEvent.change(screen.getByLabelText('Pack price of Interlocking tile'), { target: { value: '295.50' } });
    fireEvent.change(screen.getByLabelText('Product for Half-round ridge'), { target: { value: '12' } });
    fireEvent.change(screen.getByLabelText('Packs of Half-round ridge'), { target: { value: '3' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
    await waitFor(() => {
      const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/quotes/31/answer'));
      expect(call && JSON.parse(String(call[1]?.body))).toEqual({
        lines: [
          { request_line_id: 201, product_id: 11, unit_price: 29_550 },
          { request_line_id: 202, product_id: 12, packs: 3 },
        ],
      });
    });
  });

  it('refuses a price with more decimals than pence, naming the line, and sends nothing', async () => {
    const fetchMock = stubFetch({});
    const request = quoteRequestFixture();
    renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Product for Interlocking tile'), { target: { value: '11' } });
    fireEvent.change(screen.getByLabelText('Pack price of Interlocking tile'), { target: { value: '295.505' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
    expect(await screen.findByText('the pack price of line 1 must be an amount in £ with at most 2 decimals, e.g. 12.80')).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  // The euro has two decimals, the yen none (ISO 4217 minor units).
  it('reads prices in the configured currency: euro with its sign, yen only in whole units', async () => {
    setAppCurrency('EUR');
    try {
      const request = quoteRequestFixture();
      const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/quotes/31/answer': { status: 200, body: request } });
      const { unmount } = renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
      fireEvent.change(screen.getByLabelText('Product for Interlocking tile'), { target: { value: '11' } });
      fireEvent.change(screen.getByLabelText('Pack price of Interlocking tile'), { target: { value: '€1,295.5' } });
      fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
      await waitFor(() => {
        const call = fetchMock.mock.calls.find(([url]) => String(url).endsWith('/api/quotes/31/answer'));
        expect(call && JSON.parse(String(call[1]?.body))).toEqual({ lines: [{ request_line_id: 201, product_id: 11, unit_price: 129_550 }] });
      });
      unmount();

      setAppCurrency('JPY');
      const refused = stubFetch({});
      renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
      fireEvent.change(screen.getByLabelText('Product for Interlocking tile'), { target: { value: '11' } });
      fireEvent.change(screen.getByLabelText('Pack price of Interlocking tile'), { target: { value: '295.50' } });
      fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
      expect(await screen.findByText('the pack price of line 1 must be an amount in JP¥ with no decimals, e.g. 1280')).toBeTruthy();
      expect(refused).not.toHaveBeenCalled();
    } finally {
      setAppCurrency('GBP');
    }
  });

  it('asks for at least one priced line rather than sending an empty answer', async () => {
    const fetchMock = stubFetch({});
    const request = quoteRequestFixture();
    renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
    fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
    expect(await screen.findByText(/price at least one line, or decline the request/)).toBeTruthy();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('puts a price the server refuses on the row it belongs to, though earlier lines were not offered', async () => {
    const request = quoteRequestFixture();
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/quotes/31/answer': { status: 422, body: { error: { code: 'validation_failed', message: 'Check the lines', details: [{ path: 'lines.0.product_id', message: 'is not sold at this branch' }] } } },
    });
    renderWithProviders(<AnswerQuoteForm request={request} quote={request.quotes[0]} stock={stock} />);
    fireEvent.change(screen.getByLabelText('Product for Half-round ridge'), { target: { value: '12' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send the quote' }));
    expect(await screen.findByText('is not sold at this branch')).toBeTruthy();
    expect(screen.getByLabelText('Product for Half-round ridge').getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByLabelText('Product for Interlocking tile').getAttribute('aria-invalid')).toBeNull();
  });
});
