import { DELIVERY_METHOD_LABELS, orderReference } from '../../../shared/schemas/order.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../shared/schemas/project.schema';
import { createPdf, FONT_BOLD, FONT_REGULAR, PT_PER_MM, type PdfKitDocument } from '../../documents/pdf';
import { orderCautions } from '../estimates/cautions';
import { palletItems, type RunDetail } from './run-assembly';

const kg = (v: number) => `${(Math.round(v * 10) / 10).toLocaleString('en-GB')} kg`;
const mm = (v: number) => `${Math.round(v).toLocaleString('en-GB')} mm`;
const facesText = (faces: ReadonlyArray<{ building: string; face: string; tiles: number }>) => (faces.length === 0 ? 'accessories' : faces.map((f) => `${f.building} ${f.face} (${f.tiles})`).join(', '));

/** Drops told apart by number, fill and pattern: the drawing reads in black and white too. */
const DROP_FILLS = ['#f6d7c3', '#cfe3f2', '#dcedc8', '#f3e5f5', '#fff3c4', '#e0e0e0'];

type Hatch = 'none' | 'diagonal' | 'cross' | 'horizontal' | 'vertical' | 'dots';
const DROP_HATCH: Hatch[] = ['none', 'diagonal', 'horizontal', 'cross', 'vertical', 'dots'];

function hatch(doc: PdfKitDocument, x: number, y: number, w: number, h: number, kind: Hatch) {
  if (kind === 'none') return;
  doc.save();
  doc.rect(x, y, w, h).clip();
  doc.lineWidth(0.4).strokeColor('#555555');
  const step = 5;
  if (kind === 'diagonal' || kind === 'cross')
    for (let t = -h; t < w; t += step)
      doc
        .moveTo(x + t, y + h)
        .lineTo(x + t + h, y)
        .stroke();
  if (kind === 'cross')
    for (let t = 0; t < w + h; t += step)
      doc
        .moveTo(x + t, y + h)
        .lineTo(x + t - h, y)
        .stroke();
  if (kind === 'horizontal')
    for (let t = y + step / 2; t < y + h; t += step)
      doc
        .moveTo(x, t)
        .lineTo(x + w, t)
        .stroke();
  if (kind === 'vertical')
    for (let t = x + step / 2; t < x + w; t += step)
      doc
        .moveTo(t, y)
        .lineTo(t, y + h)
        .stroke();
  if (kind === 'dots') for (let i = x + 3; i < x + w; i += step) for (let j = y + 3; j < y + h; j += step) doc.circle(i, j, 0.5).fill('#555555');
  doc.restore();
}

/**
 * The deck seen from above, to scale: the front (behind the cab) on the left, each pallet at its row
 * and side with its drop, its number and its weight. Returns the height drawn, in points.
 */
function drawDeck(doc: PdfKitDocument, d: RunDetail, left: number, top: number, width: number): number {
  const { lorry } = d.run;
  const scale = width / lorry.deck_length_mm;
  const deckH = lorry.deck_width_mm * scale;
  const g = d.deck.geometry;
  doc.lineWidth(1).strokeColor('#111111').rect(left, top, width, deckH).stroke();
  doc.font(FONT_REGULAR).fontSize(7).fillColor('#555555');
  doc.text('FRONT (cab)', left, top + deckH + 2, { width: 80 });
  doc.text('REAR', left + width - 60, top + deckH + 2, { width: 60, align: 'right' });
  doc.text(`Scale 1:${Math.round(1 / (scale / PT_PER_MM))}  ·  deck ${mm(lorry.deck_length_mm)} × ${mm(lorry.deck_width_mm)}`, left + 90, top + deckH + 2, { width: width - 160, align: 'center' });
  const gap = (lorry.deck_width_mm - 2 * g.across_mm) / 3;
  d.deck.positions.forEach((p) => {
    const x = left + (p.row - 1) * g.row_depth_mm * scale + 1;
    const w = g.along_mm * scale - 2;
    const yMm = p.side === 'left' ? gap : 2 * gap + g.across_mm;
    const y = top + yMm * scale;
    const h = g.across_mm * scale;
    const fill = DROP_FILLS[(p.drop - 1) % DROP_FILLS.length];
    doc.rect(x, y, w, h).fill(fill);
    hatch(doc, x, y, w, h, DROP_HATCH[(p.drop - 1) % DROP_HATCH.length]);
    doc.lineWidth(0.8).strokeColor('#111111').rect(x, y, w, h).stroke();
    doc.rect(x + 2, y + 2, w - 4, 20).fill('#ffffff');
    doc
      .fillColor('#111111')
      .font(FONT_BOLD)
      .fontSize(8)
      .text(`D${p.drop} · P${p.pallet}`, x + 3, y + 3, { width: w - 6, lineBreak: false });
    doc
      .font(FONT_REGULAR)
      .fontSize(6.5)
      .text(kg(p.weight_kg), x + 3, y + 12, { width: w - 6, lineBreak: false });
  });
  return deckH + 14;
}

function siteNotes(drop: RunDetail['drops'][number]): Array<[string, string]> {
  const s = drop.site;
  return [
    ['Site', [drop.site_name, s.site_address, s.site_postcode].filter(Boolean).join(', ')],
    ['Delivery', DELIVERY_METHOD_LABELS[drop.delivery_method]],
    ['Set down', s.set_down_place || 'Not recorded: ask the site contact'],
    ['Access', `${VEHICLE_ACCESS_LABELS[s.vehicle_access]}. Crane lift: ${CRANE_LIFT_LABELS[s.crane_lift]}. Overhead lines: ${OVERHEAD_LINES_LABELS[s.overhead_lines]}.${s.access_notes ? ` ${s.access_notes}` : ''}`],
    ['Contact', [s.contact_name, s.contact_phone].filter(Boolean).join(', ') || '—'],
  ];
}

/** A run's loading sheet: lorry, driver, drops in order, the deck drawn to scale, the pallet list, the cautions once. */
export async function loadingSheetPdf(d: RunDetail): Promise<Buffer> {
  const { run } = d;
  const pdf = await createPdf({ title: `Loading sheet ${run.lorry.registration} ${run.date} ${run.time_window}` });
  const { doc } = pdf;
  pdf.heading(`Loading sheet — ${run.lorry.registration}, ${run.date} ${run.time_window}`);
  pdf.keyValues([
    ['Lorry', `${run.lorry.registration}${run.lorry.name ? ` · ${run.lorry.name}` : ''} · ${run.lorry.has_crane ? `crane lifts up to ${kg(run.lorry.crane_max_kg ?? 0)}` : 'no crane'}`],
    ['Driver', run.driver?.name ?? 'Not assigned'],
    ['Load', `${kg(run.weight_kg)} of ${kg(run.lorry.payload_kg)} payload · ${run.pallets} of ${run.lorry.pallet_slots} pallets`],
    ['Left / right', `${kg(run.deck.left_kg)} / ${kg(run.deck.right_kg)}`],
    ['Centre of gravity', `${mm(run.deck.cog_from_front_mm)} from the front of the deck`],
    ['Drops', String(run.drops.length)],
  ]);
  for (const w of run.deck.warnings) pdf.paragraph(`Warning: ${w.message}`, { bold: true, color: '#8a1c1c' });

  pdf.heading('Deck, seen from above', 2);
  pdf.ensureSpace(pdf.width * (run.lorry.deck_width_mm / run.lorry.deck_length_mm) + 30);
  const top = doc.y;
  const drawn = drawDeck(doc, d, pdf.left, top, pdf.width);
  doc.y = top + drawn + 6;
  doc.x = pdf.left;
  doc.font(FONT_REGULAR).fontSize(7.5).fillColor('#111111');
  pdf.paragraph(`D = drop (1 = first off), P = pallet number on its label. What comes off first is loaded last and stands where it comes off first.`, { size: 7.5 });

  pdf.heading('Drops in order', 2);
  run.drops.forEach((drop, i) => {
    pdf.heading(
      `Drop ${drop.position} of ${run.drops.length} — ${drop.reference} · ${drop.contractor.name} · ${drop.pallets} pallets, ${kg(drop.weight_kg)}${drop.short ? ' · SHORT: a face waits for back-ordered packs' : ''}`,
      3,
    );
    pdf.keyValues(siteNotes(d.drops[i]));
    if (d.drops[i].notes) pdf.keyValues([['Order notes', d.drops[i].notes]]);
  });

  pdf.heading('Pallets in loading order', 2);
  pdf.table(
    [
      { header: 'Load', width: 32, align: 'right' },
      { header: 'Row', width: 30, align: 'right' },
      { header: 'Side', width: 36 },
      { header: 'Drop', width: 32, align: 'right' },
      { header: 'Order', width: 70 },
      { header: 'Pallet', width: 38, align: 'right' },
      { header: 'Faces', width: 168 },
      { header: 'Weight', width: 60, align: 'right' },
      { header: 'Loaded', width: 49 },
    ],
    run.deck.loading_sequence.map((idx, k) => {
      const p = run.deck.positions[idx];
      return [k + 1, p.row, p.side, p.drop, orderReference(p.order_id), p.pallet, facesText(p.faces), kg(p.weight_kg), p.loaded ? 'yes' : '☐'];
    }),
  );

  pdf.heading('Cautions', 2);
  const cautions = [...new Set(d.drops.flatMap((x) => orderCautions(x.delivery_method, x.site)))];
  for (const c of cautions) pdf.paragraph(`• ${c}`, { size: 8.5 });
  return pdf.finish();
}

const A6_W = 105 * PT_PER_MM;
const A6_H = 148 * PT_PER_MM;

/** Pallet labels, A6, four to an A4 sheet, each with a QR code that opens the pallet's page. */
export async function labelsPdf(d: RunDetail, appUrl: string): Promise<Buffer> {
  const { default: QRCode } = await import('qrcode');
  const pdf = await createPdf({ title: `Pallet labels ${d.run.lorry.registration} ${d.run.date}`, margin: 0 });
  const { doc } = pdf;
  const labels = d.run.drops.flatMap((drop, i) => d.drops[i].plan.pallets.map((p) => ({ drop, row: d.drops[i], p })));
  let k = 0;
  for (const { drop, row, p } of labels) {
    if (k > 0 && k % 4 === 0) doc.addPage();
    const x = (k % 2) * A6_W;
    const y = (Math.floor(k / 2) % 2) * A6_H;
    const pad = 14;
    const w = A6_W - pad * 2;
    doc
      .lineWidth(0.5)
      .strokeColor('#999999')
      .dash(3, { space: 3 })
      .rect(x + 2, y + 2, A6_W - 4, A6_H - 4)
      .stroke()
      .undash();
    doc
      .fillColor('#111111')
      .font(FONT_BOLD)
      .fontSize(20)
      .text(drop.reference, x + pad, y + pad, { width: w, lineBreak: false });
    doc
      .font(FONT_BOLD)
      .fontSize(13)
      .text(`Drop ${drop.position} of ${d.run.drops.length}`, x + pad, y + pad + 28, { width: w });
    doc.text(`Pallet ${p.n} of ${row.plan.pallets.length}`, x + pad, y + pad + 46, { width: w });
    doc
      .font(FONT_REGULAR)
      .fontSize(9)
      .text([drop.site_name, row.site.site_address, row.site.site_postcode].filter(Boolean).join(', '), x + pad, y + pad + 68, { width: w, height: 36 });
    doc
      .font(FONT_BOLD)
      .fontSize(11)
      .text(`Weight ${kg(p.weight_kg)}`, x + pad, y + pad + 106, { width: w });
    doc.font(FONT_REGULAR).fontSize(8.5);
    const body =
      p.faces.length > 0
        ? `Roof faces: ${facesText(p.faces)}`
        : `Contents: ${palletItems(p, d.names.get(drop.order_id))
            .map((it) => `${it.description}: ${it.quantity} ${it.unit}`)
            .join('; ')}`;
    doc.text(body, x + pad, y + pad + 124, { width: w, height: 80 });
    doc.fontSize(8).text(`${DELIVERY_METHOD_LABELS[drop.delivery_method]} · ${d.run.lorry.registration} · ${d.run.date} ${d.run.time_window}`, x + pad, y + pad + 210, { width: w });
    const url = `${appUrl}/yard/pallets/${drop.order_id}/${p.n}`;
    const png = await QRCode.toBuffer(url, { type: 'png', margin: 1, width: 240, errorCorrectionLevel: 'M' });
    const qr = 120;
    doc.image(png, x + (A6_W - qr) / 2, y + A6_H - qr - pad - 10, { width: qr, height: qr });
    doc
      .font(FONT_REGULAR)
      .fontSize(6)
      .fillColor('#555555')
      .text(url, x + pad, y + A6_H - pad - 8, { width: w, align: 'center', lineBreak: false });
    k++;
  }
  if (labels.length === 0) doc.font(FONT_REGULAR).fontSize(12).text('This run has no pallets booked yet.', 40, 40);
  return pdf.finish();
}
