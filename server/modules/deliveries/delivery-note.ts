import { DELIVERY_METHOD_LABELS, orderReference } from '../../../shared/schemas/order.schema';
import type { DeliveryProof } from '../../../shared/schemas/run.schema';
import { CRANE_LIFT_LABELS, OVERHEAD_LINES_LABELS, VEHICLE_ACCESS_LABELS } from '../../../shared/schemas/project.schema';
import { FONT_BOLD, FONT_REGULAR, createPdf } from '../../documents/pdf';
import type { OrderRow, StoredOrderLine } from '../orders/orders.repository';

export interface DeliveryNoteInput {
  order: OrderRow;
  branch: { name: string; address: string; phone: string };
  slot: { date: string; time_window: string; registration: string; driver: string | null } | null;
  lines: StoredOrderLine[];
  short_faces: { building: string; face: string; tiles_short: number; follow_up_reference: string | null; due_date: string | null }[];
  proof: DeliveryProof | null;
  signature: Buffer | null;
  photos: { content_type: string; data: Buffer }[];
}

const when = (iso: string) => iso.replace('T', ' ').slice(0, 16) + ' UTC';

/**
 * The delivery note of one drop (A4): what is sent and what follows, the site and its access, how it
 * is set down, and a box for the receiver's name and signature. Once delivered it carries what was
 * handed over, short and damaged, the receiver's name, the signature and the photos.
 */
export async function deliveryNotePdf(n: DeliveryNoteInput): Promise<Buffer> {
  const { order, proof } = n;
  const ref = orderReference(order.id);
  const w = await createPdf({ title: `Delivery note ${ref}`, author: order.merchant_name });
  const { doc } = w;
  w.heading(`Delivery note ${ref}`);
  w.paragraph(`${order.merchant_name} — ${n.branch.name}${n.branch.address ? `, ${n.branch.address}` : ''}${n.branch.phone ? ` · ${n.branch.phone}` : ''}`);
  w.heading('Delivery', 2);
  const site = order.site;
  w.keyValues([
    ['Customer', order.contractor_name],
    ['Their reference', order.po_reference || '—'],
    ['Site', `${site.name}\n${site.site_address}${site.site_postcode ? `, ${site.site_postcode}` : ''}`],
    ['Site contact', [site.contact_name, site.contact_phone].filter(Boolean).join(', ') || '—'],
    ['Delivery method', DELIVERY_METHOD_LABELS[order.delivery_method]],
    ['Run', n.slot ? `${n.slot.date}, ${n.slot.time_window}, lorry ${n.slot.registration}${n.slot.driver ? `, driver ${n.slot.driver}` : ''}` : 'Not booked'],
    ['Set down', site.set_down_place || 'Ask the site contact'],
    ['Access', `Vehicle access: ${VEHICLE_ACCESS_LABELS[site.vehicle_access]}. Crane lift: ${CRANE_LIFT_LABELS[site.crane_lift]}. Overhead lines: ${OVERHEAD_LINES_LABELS[site.overhead_lines]}.`],
    ...(site.access_notes ? ([['Access notes', site.access_notes]] as Array<[string, string]>) : []),
    ...(order.notes ? ([['Order notes', order.notes]] as Array<[string, string]>) : []),
  ]);

  const proofBy = new Map((proof?.lines ?? []).map((l) => [l.line_id, l]));
  const sent = n.lines.filter((l) => l.reserved_quantity > 0 || proofBy.has(l.id));
  w.heading(proof ? 'Handed over' : 'Sent on this delivery', 2);
  if (proof) {
    w.table(
      [
        { header: 'Product', width: 80 },
        { header: 'Description', width: 205 },
        { header: 'Packs sent', width: 58, align: 'right' },
        { header: 'Handed over', width: 64, align: 'right' },
        { header: 'Short', width: 54, align: 'right' },
        { header: 'Damaged', width: 54, align: 'right' },
      ],
      sent.map((l) => {
        const p = proofBy.get(l.id);
        return [l.sku, l.description, p?.sent ?? l.reserved_quantity, p?.handed_over ?? 0, p?.short ?? 0, p?.damaged ?? 0];
      }),
    );
  } else {
    w.table(
      [
        { header: 'Product', width: 90 },
        { header: 'Description', width: 245 },
        { header: 'Packs', width: 60, align: 'right' },
        { header: 'Units', width: 120, align: 'right' },
      ],
      sent.map((l) => [l.sku, l.description, l.reserved_quantity, `${l.reserved_quantity * l.pack_size} ${l.unit}`]),
    );
  }
  const toFollow = n.lines.filter((l) => l.back_order_quantity > 0);
  if (toFollow.length > 0 || n.short_faces.length > 0) {
    w.heading('To follow', 2);
    if (toFollow.length > 0) {
      w.table(
        [
          { header: 'Product', width: 90 },
          { header: 'Description', width: 305 },
          { header: 'Packs to follow', width: 120, align: 'right' },
        ],
        toFollow.map((l) => [l.sku, l.description, l.back_order_quantity]),
      );
    }
    for (const f of n.short_faces) {
      const due = f.follow_up_reference ? ` — the rest follows on ${f.follow_up_reference}${f.due_date ? `, due ${f.due_date}` : ''}` : ' — the rest follows when the desk books it';
      w.paragraph(`${f.building} ${f.face}: short of ${f.tiles_short} tiles${due}.`);
    }
  }

  w.heading('Received', 2);
  if (proof) {
    w.keyValues([
      ['Received by', proof.receiver_name],
      ['Delivered at', when(proof.delivered_at)],
      ['Recorded by', proof.recorded_by.name],
      ...(proof.position
        ? ([['Position', `${proof.position.lat.toFixed(5)}, ${proof.position.lng.toFixed(5)}${proof.position.accuracy_m !== undefined ? ` (within ${Math.round(proof.position.accuracy_m)} m)` : ''}`]] as Array<
            [string, string]
          >)
        : []),
      ...(proof.note ? ([['Note', proof.note]] as Array<[string, string]>) : []),
    ]);
    if (n.signature) {
      w.ensureSpace(90);
      doc.font(FONT_REGULAR).fontSize(9).fillColor('#555555').text('Signature', w.left, doc.y);
      const y = doc.y + 2;
      doc.rect(w.left, y, 240, 80).lineWidth(0.75).strokeColor('#999999').stroke();
      doc.image(n.signature, w.left + 4, y + 4, { fit: [232, 72] });
      doc.y = y + 86;
      doc.x = w.left;
    }
  } else {
    // The box the receiver fills in by hand when the note is printed before the drop.
    w.ensureSpace(120);
    const y = doc.y + 4;
    doc.rect(w.left, y, w.width, 100).lineWidth(0.75).strokeColor('#555555').stroke();
    doc
      .font(FONT_BOLD)
      .fontSize(9.5)
      .fillColor('#111111')
      .text('Received in good order by', w.left + 8, y + 8);
    doc.font(FONT_REGULAR).text('Name (capitals)', w.left + 8, y + 34);
    doc
      .moveTo(w.left + 100, y + 44)
      .lineTo(w.left + w.width - 8, y + 44)
      .stroke();
    doc.text('Signature', w.left + 8, y + 58);
    doc
      .moveTo(w.left + 100, y + 68)
      .lineTo(w.left + w.width / 2, y + 68)
      .stroke();
    doc.text('Date and time', w.left + w.width / 2 + 8, y + 58);
    doc
      .moveTo(w.left + w.width / 2 + 80, y + 68)
      .lineTo(w.left + w.width - 8, y + 68)
      .stroke();
    doc.text('Note anything short or damaged on this note before signing.', w.left + 8, y + 80);
    doc.y = y + 108;
    doc.x = w.left;
  }

  if (n.photos.length > 0) {
    const { default: sharp } = await import('sharp');
    w.heading('Photos at the drop', 2);
    const size = (w.width - 12) / 2;
    for (const [i, photo] of n.photos.entries()) {
      // pdfkit takes JPEG and PNG only: every photo goes in as a JPEG at print size.
      const jpeg = await sharp(photo.data).rotate().resize(900, 900, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 80 }).toBuffer();
      if (i % 2 === 0) w.ensureSpace(size + 16);
      const x = w.left + (i % 2) * (size + 12);
      const y = doc.y;
      doc.image(jpeg, x, y, { fit: [size, size] });
      doc
        .font(FONT_REGULAR)
        .fontSize(8)
        .fillColor('#555555')
        .text(`Photo ${i + 1}`, x, y + size + 2);
      if (i % 2 === 1 || i === n.photos.length - 1) doc.y = y + size + 14;
      else doc.y = y;
    }
    doc.x = w.left;
  }
  w.paragraph("Lifting and handling: follow the site's lift plan, keep people clear while the lorry unloads, and defer to the tile maker's fixing specification and local codes.", { size: 8, color: '#555555' });
  return w.finish();
}
