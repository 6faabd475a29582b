import { loadExcel } from '../../documents/excel';
import { CREDIT_REASON_LABELS, PAY_BY_LABELS, type Invoice } from '../../../shared/schemas/invoice.schema';
import { safeCell } from '../exports/spreadsheet-text';
import escapeHtml from 'escape-html';
import { formatMoney } from '../../../shared/domain/money';

const rate = (bp: number) => `${(bp / 100).toLocaleString('en-GB', { maximumFractionDigits: 2 })}%`;

/** Tax per rate, as an invoice's tax summary shows it. */
export function taxSummary(lines: Invoice['lines']): { tax_rate_bp: number; net: number; tax: number }[] {
  const by = new Map<number, { tax_rate_bp: number; net: number; tax: number }>();
  for (const l of lines) {
    const s = by.get(l.tax_rate_bp) ?? { tax_rate_bp: l.tax_rate_bp, net: 0, tax: 0 };
    s.net += l.net;
    s.tax += l.tax;
    by.set(l.tax_rate_bp, s);
  }
  return [...by.values()].sort((a, b) => b.tax_rate_bp - a.tax_rate_bp);
}

/** A printable invoice: one self-contained HTML page with its own print styles and no script. */
export function invoiceHtml(inv: Invoice, merchant: { name: string; branch_address: string }): string {
  const m = (v: number) => escapeHtml(formatMoney(v, inv.currency));
  const rows = inv.lines
    .map(
      (l) =>
        `<tr><td>${escapeHtml(l.sku)}</td><td>${escapeHtml(l.description)}</td><td class="n">${l.quantity}</td><td>${escapeHtml(l.unit)}${l.pack_size > 1 ? ` × ${l.pack_size}` : ''}</td><td class="n">${m(l.unit_price)}</td><td class="n">${rate(l.tax_rate_bp)}</td><td class="n">${m(l.net)}</td><td class="n">${m(l.tax)}</td><td class="n">${m(l.total)}</td></tr>`,
    )
    .join('\n');
  const tax = taxSummary(inv.lines)
    .map((t) => `<tr><td>${rate(t.tax_rate_bp)}</td><td class="n">${m(t.net)}</td><td class="n">${m(t.tax)}</td></tr>`)
    .join('');
  const credits = inv.credit_notes
    .map((c) => `<tr><td>${escapeHtml(c.number)}</td><td>${escapeHtml(CREDIT_REASON_LABELS[c.reason])}${c.notes ? `: ${escapeHtml(c.notes)}` : ''}</td><td class="n">−${m(c.total)}</td></tr>`)
    .join('');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Invoice ${escapeHtml(inv.number)}</title>
<style>
body{font-family:'Work Sans',Arial,sans-serif;color:#1f2a33;margin:32px;font-size:14px}
h1{font-size:24px;margin:0 0 4px}table{border-collapse:collapse;width:100%;margin:16px 0}
th,td{border-bottom:1px solid #c9d1d8;padding:6px 8px;text-align:left;vertical-align:top}th{background:#eef1f4}
.n{text-align:right;white-space:nowrap}.grid{display:flex;gap:48px;flex-wrap:wrap}.totals td{border:0}
.muted{color:#5b6b78;font-size:12px}@media print{body{margin:12mm}.noprint{display:none}}
</style></head><body>
<p class="noprint muted">Print this page from your browser (Ctrl+P / ⌘P) or save it as PDF.</p>
<div class="grid"><div><h1>Invoice ${escapeHtml(inv.number)}</h1>
<div>${escapeHtml(merchant.name)} · ${escapeHtml(inv.branch.name)}</div><div class="muted">${escapeHtml(merchant.branch_address)}</div></div>
<div><div><strong>To:</strong> ${escapeHtml(inv.contractor.name)}</div><div><strong>Order:</strong> ${escapeHtml(inv.order.reference)}${inv.po_reference ? ` · your reference ${escapeHtml(inv.po_reference)}` : ''}</div>
<div><strong>Site:</strong> ${escapeHtml(inv.site_name)}</div><div><strong>Invoice date:</strong> ${escapeHtml(inv.issue_date)}</div>
<div><strong>Payment:</strong> ${escapeHtml(PAY_BY_LABELS[inv.pay_by])}${inv.due_date ? `, due ${escapeHtml(inv.due_date)}` : ''}</div>
<div class="muted">Quantities ${inv.basis === 'delivered' ? 'as delivered' : 'as confirmed'}; amounts in ${escapeHtml(inv.currency)}.</div></div></div>
<table><thead><tr><th>SKU</th><th>Description</th><th class="n">Packs</th><th>Unit</th><th class="n">Pack price</th><th class="n">Tax rate</th><th class="n">Net</th><th class="n">Tax</th><th class="n">Total</th></tr></thead>
<tbody>${rows}</tbody></table>
<div class="grid"><table style="width:auto"><thead><tr><th>Tax rate</th><th class="n">Net</th><th class="n">Tax</th></tr></thead><tbody>${tax}</tbody></table>
<table class="totals" style="width:auto;margin-left:auto"><tr><td>Net</td><td class="n">${m(inv.subtotal)}</td></tr><tr><td>Tax</td><td class="n">${m(inv.tax_total)}</td></tr>
<tr><td><strong>Total</strong></td><td class="n"><strong>${m(inv.total)}</strong></td></tr>
${inv.credited ? `<tr><td>Credited</td><td class="n">−${m(inv.credited)}</td></tr>` : ''}${inv.paid ? `<tr><td>Paid</td><td class="n">−${m(inv.paid)}</td></tr>` : ''}
<tr><td><strong>To pay</strong></td><td class="n"><strong>${m(inv.balance)}</strong></td></tr></table></div>
${credits ? `<h2 style="font-size:16px">Credit notes</h2><table><tbody>${credits}</tbody></table>` : ''}
</body></html>`;
}

/** The invoice as a workbook: the lines with money in major units, then the totals. */
export async function invoiceXlsx(inv: Invoice): Promise<Buffer> {
  const ExcelJS = await loadExcel();
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Ridgeload';
  const ws = wb.addWorksheet(`Invoice ${inv.number}`, { views: [{ state: 'frozen', ySplit: 1 }] });
  const money = `#,##0.00 "${inv.currency}"`;
  ws.columns = [
    { header: 'SKU', width: 16 },
    { header: 'Description', width: 48 },
    { header: 'Packs', width: 8 },
    { header: 'Unit', width: 8 },
    { header: 'Pack price', width: 14 },
    { header: 'Tax rate %', width: 10 },
    { header: 'Net', width: 14 },
    { header: 'Tax', width: 12 },
    { header: 'Total', width: 14 },
  ];
  ws.getRow(1).font = { bold: true };
  for (const l of inv.lines) {
    const row = ws.addRow([safeCell(l.sku), safeCell(l.description), l.quantity, safeCell(l.unit), l.unit_price / 100, l.tax_rate_bp / 100, l.net / 100, l.tax / 100, l.total / 100]);
    for (const c of [5, 7, 8, 9]) row.getCell(c).numFmt = money;
  }
  ws.addRow([]);
  const facts: [string, number | string][] = [
    ['Invoice', inv.number],
    ['Order', inv.order.reference],
    ['Contractor', inv.contractor.name],
    ['Invoice date', inv.issue_date],
    ['Due date', inv.due_date ?? 'on issue, by card'],
    ['Net', inv.subtotal / 100],
    ['Tax', inv.tax_total / 100],
    ['Total', inv.total / 100],
    ['Credited', inv.credited / 100],
    ['Paid', inv.paid / 100],
    ['To pay', inv.balance / 100],
  ];
  for (const [k, v] of facts) {
    const row = ws.addRow([k, safeCell(v)]);
    row.getCell(1).font = { bold: true };
    if (typeof v === 'number') row.getCell(2).numFmt = money;
  }
  return Buffer.from(await wb.xlsx.writeBuffer());
}
