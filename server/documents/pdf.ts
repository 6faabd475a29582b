import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import type PDFDocumentCtor from 'pdfkit';

/**
 * A small layer over pdfkit for the documents the server prints (loading sheets, pallet labels,
 * delivery notes). pdfkit is loaded on first use only, so a server that never prints never pays for it.
 * The app's own font (Work Sans) comes from @fontsource's `.woff` files: pdfkit registers a `.woff2`
 * but its subsetter crashes when the document ends.
 */

type PdfKitModule = typeof PDFDocumentCtor;
export type PdfKitDocument = PDFKit.PDFDocument;

export const FONT_REGULAR = 'WorkSans';
export const FONT_BOLD = 'WorkSans-Bold';

const require = createRequire(import.meta.url);
let loaded: Promise<{ PDFDocument: PdfKitModule; regular: Buffer; bold: Buffer }> | undefined;

function loadPdfKit() {
  loaded ??= (async () => {
    const [mod, regular, bold] = await Promise.all([
      import('pdfkit'),
      readFile(require.resolve('@fontsource/work-sans/files/work-sans-latin-400-normal.woff')),
      readFile(require.resolve('@fontsource/work-sans/files/work-sans-latin-600-normal.woff')),
    ]);
    return { PDFDocument: mod.default, regular, bold };
  })();
  loaded.catch(() => {
    loaded = undefined;
  });
  return loaded;
}

export type PageSize = 'A4' | 'A5' | 'A6';

export interface PdfOptions {
  title: string;
  /** The firm or person the document is made for, shown in the PDF's properties. */
  author?: string;
  size?: PageSize;
  layout?: 'portrait' | 'landscape';
  /** Page margin in points (1 pt = 1/72 in). */
  margin?: number;
}

export interface TableColumn {
  header: string;
  /** Width in points. */
  width: number;
  align?: 'left' | 'right' | 'center';
}

/** A document being written, with the few layout pieces every printed document shares. */
export interface PdfWriter {
  readonly doc: PdfKitDocument;
  /** Left edge and usable width of the page between the margins, in points. */
  readonly left: number;
  readonly width: number;
  heading(text: string, level?: 1 | 2 | 3): PdfWriter;
  paragraph(text: string, options?: { size?: number; bold?: boolean; color?: string }): PdfWriter;
  /** Label and value pairs, the labels in a column of their own. */
  keyValues(rows: Array<[string, string]>, options?: { labelWidth?: number }): PdfWriter;
  /** A simple ruled table; the header row is repeated on each new page. */
  table(columns: TableColumn[], rows: Array<Array<string | number>>): PdfWriter;
  /** Starts a new page when fewer than `height` points are left above the bottom margin. */
  ensureSpace(height: number): PdfWriter;
  /** Ends the document and gives its bytes. */
  finish(): Promise<Buffer>;
}

const HEADING_SIZES = { 1: 18, 2: 13, 3: 11 } as const;
const BODY_SIZE = 9.5;

/** Opens a new document with the app's font registered as `WorkSans` and `WorkSans-Bold`. */
export async function createPdf(options: PdfOptions): Promise<PdfWriter> {
  const { PDFDocument, regular, bold } = await loadPdfKit();
  const margin = options.margin ?? 40;
  const doc = new PDFDocument({
    size: options.size ?? 'A4',
    layout: options.layout ?? 'portrait',
    margin,
    bufferPages: false,
    info: { Title: options.title, Author: options.author ?? 'Ridgeload', Creator: 'Ridgeload' },
  });
  doc.registerFont(FONT_REGULAR, regular);
  doc.registerFont(FONT_BOLD, bold);
  doc.font(FONT_REGULAR).fontSize(BODY_SIZE).fillColor('#111111');

  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const left = doc.page.margins.left;
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom;

  const writer: PdfWriter = {
    doc,
    left,
    width,
    heading(text, level = 1) {
      const size = HEADING_SIZES[level];
      writer.ensureSpace(size * 2.2);
      if (level > 1) doc.moveDown(0.4);
      doc.font(FONT_BOLD).fontSize(size).fillColor('#111111').text(text, left, doc.y, { width });
      doc.moveDown(0.3);
      doc.font(FONT_REGULAR).fontSize(BODY_SIZE);
      return writer;
    },
    paragraph(text, opts = {}) {
      doc
        .font(opts.bold ? FONT_BOLD : FONT_REGULAR)
        .fontSize(opts.size ?? BODY_SIZE)
        .fillColor(opts.color ?? '#111111');
      const height = doc.heightOfString(text, { width });
      writer.ensureSpace(Math.min(height, 200));
      doc.text(text, left, doc.y, { width });
      doc.font(FONT_REGULAR).fontSize(BODY_SIZE).fillColor('#111111');
      return writer;
    },
    keyValues(rows, opts = {}) {
      const labelWidth = opts.labelWidth ?? Math.min(130, width * 0.35);
      for (const [label, value] of rows) {
        doc.font(FONT_REGULAR).fontSize(BODY_SIZE);
        const height = Math.max(doc.heightOfString(label, { width: labelWidth - 6 }), doc.heightOfString(value || '—', { width: width - labelWidth }));
        writer.ensureSpace(height + 2);
        const y = doc.y;
        doc.fillColor('#555555').text(label, left, y, { width: labelWidth - 6 });
        doc
          .fillColor('#111111')
          .font(FONT_BOLD)
          .text(value || '—', left + labelWidth, y, { width: width - labelWidth });
        doc.font(FONT_REGULAR);
        doc.y = y + height + 2;
      }
      doc.x = left;
      return writer;
    },
    table(columns, rows) {
      const pad = 3;
      const drawRow = (cells: Array<string | number>, header: boolean) => {
        doc.font(header ? FONT_BOLD : FONT_REGULAR).fontSize(header ? BODY_SIZE - 0.5 : BODY_SIZE);
        const texts = cells.map((c) => String(c));
        const height = Math.max(...texts.map((t, i) => doc.heightOfString(t || ' ', { width: columns[i].width - pad * 2 }))) + pad * 2;
        return { texts, height };
      };
      const paint = (cells: Array<string | number>, header: boolean) => {
        const { texts, height } = drawRow(cells, header);
        const y = doc.y;
        if (header) doc.rect(left, y, sum(columns.map((c) => c.width)), height).fill('#eeeeee');
        doc.fillColor('#111111');
        let x = left;
        texts.forEach((t, i) => {
          doc.text(t, x + pad, y + pad, { width: columns[i].width - pad * 2, align: columns[i].align ?? 'left' });
          x += columns[i].width;
        });
        doc
          .moveTo(left, y + height)
          .lineTo(left + sum(columns.map((c) => c.width)), y + height)
          .lineWidth(0.5)
          .strokeColor('#999999')
          .stroke();
        doc.y = y + height;
      };
      const headers = columns.map((c) => c.header);
      writer.ensureSpace(drawRow(headers, true).height * 2);
      paint(headers, true);
      for (const row of rows) {
        const { height } = drawRow(row, false);
        if (doc.y + height > bottom()) {
          doc.addPage();
          paint(headers, true);
        }
        paint(row, false);
      }
      doc.font(FONT_REGULAR).fontSize(BODY_SIZE);
      doc.x = left;
      doc.moveDown(0.5);
      return writer;
    },
    ensureSpace(height) {
      if (doc.y + height > bottom()) doc.addPage();
      doc.x = left;
      return writer;
    },
    finish() {
      doc.end();
      return done;
    },
  };
  return writer;
}

function sum(values: number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

/** Points per millimetre (1 pt = 1/72 in = 25.4/72 mm). */
export const PT_PER_MM = 72 / 25.4;
