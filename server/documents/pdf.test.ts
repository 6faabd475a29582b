import { describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { createPdf } from './pdf';

async function textOf(data: Buffer): Promise<{ text: string; pages: number }> {
  const parser = new PDFParse({ data: new Uint8Array(data) });
  try {
    const result = await parser.getText();
    return { text: result.text, pages: result.total };
  } finally {
    await parser.destroy();
  }
}

describe('pdf writer', () => {
  it('writes a heading, key/value rows and a table in the app font, read back as text', async () => {
    const pdf = await createPdf({ title: 'Loading sheet — test' });
    pdf
      .heading('Loading sheet')
      .keyValues([
        ['Lorry', 'RL12 ABC · Rigid with crane'],
        ['Driver', 'Nia Pollard'],
      ])
      .heading('Pallets', 2)
      .table(
        [
          { header: 'Pallet', width: 60 },
          { header: 'Weight kg', width: 80, align: 'right' },
        ],
        [
          [1, '1,034'],
          [2, '987'],
        ],
      )
      .paragraph('Lift only on level, firm ground.');
    const data = await pdf.finish();
    expect(data.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    // The font is embedded (a subset of Work Sans), not a standard PDF font.
    expect(data.toString('latin1')).toMatch(/WorkSans/);
    const { text, pages } = await textOf(data);
    expect(pages).toBe(1);
    expect(text).toContain('Loading sheet');
    expect(text).toContain('Nia Pollard');
    expect(text).toContain('RL12 ABC · Rigid with crane');
    expect(text).toMatch(/1\s+1,034/);
    expect(text).toMatch(/2\s+987/);
    expect(text).toContain('Lift only on level, firm ground.');
  });

  it('carries a long table over onto new pages, repeating the header row', async () => {
    const pdf = await createPdf({ title: 'Long table', size: 'A6' });
    const rows = Array.from({ length: 60 }, (_, i) => [`row ${i + 1}`, i * 10]);
    pdf.table(
      [
        { header: 'Name', width: 120 },
        { header: 'Value', width: 80, align: 'right' },
      ],
      rows,
    );
    const { text, pages } = await textOf(await pdf.finish());
    expect(pages).toBeGreaterThan(1);
    expect(text.match(/Name\s+Value/g)?.length).toBe(pages);
    expect(text).toContain('row 60');
  });
});
