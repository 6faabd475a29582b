import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { EXAMPLE_SCHEDULE_CSV } from '../../../../shared/engine/example-schedule';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { scheduleFixture } from '../../../test-utils/schedule-fixture';
import { ScheduleImport } from './schedule-import';

/** The example schedule with one cell changed; lines[0] is the header (spreadsheet row 1). */
function exampleWith(row: number, column: number, value: string): string {
  const lines = EXAMPLE_SCHEDULE_CSV.split('\r\n');
  const cells = lines[row - 1].split(',');
  cells[column] = value;
  lines[row - 1] = cells.join(',');
  return lines.join('\r\n');
}

function chooseFile(text: string, name = 'roof-schedule.csv') {
  const file = new File([text], name, { type: 'text/csv' });
  fireEvent.change(screen.getByLabelText('Choose a CSV file'), { target: { files: [file] } });
}

const storedSchedule = (faces: unknown[]) =>
  scheduleFixture(
    faces.map((f, i) => ({ id: i + 1, position: i + 1, ridge: null, top_assumed: false, ...(f as object) })),
    [],
    { id: 9, version: 2, created_at: '2026-12-01T10:00:00.000Z' },
  );

describe('ScheduleImport', () => {
  it('marks the one rejected cell with the reader’s message, naming its spreadsheet row and column', async () => {
    // Row 3 is Alder Back; column G (index 6) is eaves_mm. 10.2 is metres typed into a millimetre column.
    renderWithProviders(<ScheduleImport projectId={4} onImported={vi.fn()} />);
    chooseFile(exampleWith(3, 6, '10.2'));

    // The preview's code loads once the file is read; the first time, on a busy machine, that can take more than a second.
    const cell = await screen.findByLabelText('Row 3, column G (eaves_mm)', {}, { timeout: 5000 });
    await waitFor(() => expect(cell.getAttribute('aria-invalid')).toBe('true'));
    const messageId = cell.getAttribute('aria-describedby')!;
    expect(document.getElementById(messageId)?.textContent).toBe('looks like metres (10.2); give millimetres, e.g. 10200');
    // Only that cell is marked, and the summary names where it is.
    expect(screen.getAllByTestId('cell-problem')).toHaveLength(1);
    expect(screen.getByRole('button', { name: 'Row 3, column G (eaves_mm): looks like metres (10.2); give millimetres, e.g. 10200' })).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Fix the marked cells to import' }) as HTMLButtonElement).disabled).toBe(true);
  });

  it('checks an edited cell again as it is typed and clears the mark once it is right', async () => {
    renderWithProviders(<ScheduleImport projectId={4} onImported={vi.fn()} />);
    chooseFile(exampleWith(3, 6, '10.2'));
    const cell = await screen.findByLabelText('Row 3, column G (eaves_mm)');
    await waitFor(() => expect(cell.getAttribute('aria-invalid')).toBe('true'));

    // Still wrong: a comma is not a decimal point in a comma-separated file.
    fireEvent.change(cell, { target: { value: '10,2' } });
    await waitFor(() => expect(screen.getByTestId('cell-problem').textContent).toMatch(/^must be a number, not '10,2'/));
    expect(cell.getAttribute('aria-invalid')).toBe('true');

    fireEvent.change(cell, { target: { value: '10200' } });
    await waitFor(() => expect(cell.getAttribute('aria-invalid')).toBeNull());
    expect(screen.queryAllByTestId('cell-problem')).toHaveLength(0);
    expect((screen.getByRole('button', { name: 'Import 7 faces' }) as HTMLButtonElement).disabled).toBe(false);
  });

  it('uploads the checked sheet as a CSV file and puts the server’s refusal back on the cell it names', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/projects/4/schedule': {
        status: 422,
        body: {
          error: {
            code: 'invalid_schedule',
            message: 'The schedule was not stored: 1 problem to fix',
            // Spreadsheet row 6 of the example is Birch Front.
            details: [{ row: 6, column: 'pitch_deg', message: 'must be a pitch in degrees above 0 and below 90' }],
          },
        },
      },
    });
    renderWithProviders(<ScheduleImport projectId={4} onImported={vi.fn()} />);
    chooseFile(EXAMPLE_SCHEDULE_CSV);
    fireEvent.click(await screen.findByRole('button', { name: 'Import 7 faces' }));

    const cell = await screen.findByLabelText('Row 6, column D (pitch_deg)');
    await waitFor(() => expect(cell.getAttribute('aria-invalid')).toBe('true'));
    const post = fetchMock.mock.calls.find((call) => (call[1] as RequestInit).method === 'POST')!;
    const init = post[1] as RequestInit;
    expect(init.body).toBeInstanceOf(FormData);
    expect((init.headers as Record<string, string>)['Content-Type']).toBeUndefined();
    const file = (init.body as FormData).get('file') as File;
    expect(file.name).toBe('roof-schedule.csv');
    const sent = (await file.text()).split(/\r?\n/);
    expect(sent).toHaveLength(8);
    expect(sent[1]).toBe(EXAMPLE_SCHEDULE_CSV.split(/\r?\n/)[1]);
  });

  it('stores the faces and hands the new version on', async () => {
    const onImported = vi.fn();
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf' } },
      'POST /api/projects/4/schedule': {
        status: 201,
        body: storedSchedule([{ building: 'Birch', face: 'Porch', quantity: 8, pitch_deg: 25, rafter_mm: 1800, run_mm: 1631.4, eaves_mm: 2400, top_mm: 2400, left: 'verge', right: 'verge', top: 'abutment' }]),
      },
    });
    renderWithProviders(<ScheduleImport projectId={4} onImported={onImported} />);
    chooseFile(['building,face,quantity,pitch_deg,rafter_mm,eaves_mm,top', 'Birch,Porch,8,25,1800,2400,abutment'].join('\n'));
    fireEvent.click(await screen.findByRole('button', { name: 'Import 1 face' }));
    await waitFor(() => expect(onImported).toHaveBeenCalledOnce());
    expect(onImported.mock.calls[0][0].version).toBe(2);
  });

  it('refuses a file over the size limit before reading it', async () => {
    renderWithProviders(<ScheduleImport projectId={4} onImported={vi.fn()} />);
    const big = new File(['x'], 'huge.csv', { type: 'text/csv' });
    Object.defineProperty(big, 'size', { value: 6 * 1024 * 1024 });
    fireEvent.change(screen.getByLabelText('Choose a CSV file'), { target: { files: [big] } });
    const alert = await screen.findByRole('alert');
    expect(within(alert).getByText(/huge\.csv is 6\.0 MB; the largest schedule accepted is 5\.0 MB/)).toBeTruthy();
  });
});
