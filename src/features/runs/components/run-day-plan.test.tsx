import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { runFixture, runWeekFixture } from '../../../test-utils/run-fixture';
import { RunDayPlan } from './run-day-plan';
import { RunWeekView } from './run-week-view';

const branches = [
  { id: 3, name: 'Tollerbeck Yard', town: 'Tollerbeck' },
  { id: 4, name: 'Harrowgill Depot', town: 'Harrowgill' },
];

// The firm's today: Monday 1 March 2027, 09:00 in London.
beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2027-03-01T09:00:00Z'));
});
afterEach(() => vi.useRealTimers());

const asked = (fetchMock: ReturnType<typeof stubFetch>) => fetchMock.mock.calls.map(([url]) => String(url));

describe('RunWeekView', () => {
  it('lists each day of the week with its runs, marks today and the chosen day, and opens a run in one click', async () => {
    stubFetch({ 'GET /api/branches/3/run-week?from=2027-03-01': { status: 200, body: runWeekFixture() } });
    const onPickDay = vi.fn();
    renderWithProviders(<RunWeekView branchId={3} from="2027-03-01" selectedDate="2027-03-03" today="2027-03-01" onPickDay={onPickDay} onShiftWeek={vi.fn()} />);
    const days = await screen.findAllByTestId('week-day');
    expect(days.map((d) => d.getAttribute('aria-label'))).toEqual(['Mon 1 Mar 2027', 'Tue 2 Mar 2027', 'Wed 3 Mar 2027', 'Thu 4 Mar 2027', 'Fri 5 Mar 2027']);
    const monday = within(days[0]!);
    expect(monday.getByText('today')).toBeTruthy();
    expect(monday.getByText('2 runs')).toBeTruthy();
    expect(monday.getByRole('link', { name: '07:30-12:00 · TY61 KRB' }).getAttribute('href')).toBe('/yard/runs/7');
    expect(days[0]!.textContent).toContain('3 drops · 5,380 kg · 6 of 6 pallets loaded');
    expect(days[0]!.textContent).toContain('Loaded, ready to go');
    expect(days[0]!.textContent).toContain('no driver yet');
    expect(within(days[1]!).getByText('no runs')).toBeTruthy();
    expect(within(days[2]!).getByRole('button', { name: 'Show the day plan of Wed 3 Mar 2027' }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(within(days[1]!).getByRole('button', { name: 'Show the day plan of Tue 2 Mar 2027' }));
    expect(onPickDay).toHaveBeenCalledWith('2027-03-02');
  });
});

describe('RunDayPlan', () => {
  it('opens on today’s runs of the first branch, beside the week, and follows a day picked in the week', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/3/runs?date=2027-03-01': { status: 200, body: [runFixture()] },
      'GET /api/branches/3/runs?date=2027-03-03': { status: 200, body: [] },
      'GET /api/branches/3/run-week?from=2027-03-01': { status: 200, body: runWeekFixture() },
    });
    const { router } = renderWithProviders(<RunDayPlan branches={branches} />, { path: '/yard' });
    const runs = await screen.findByRole('list', { name: 'Runs on Mon 1 Mar 2027' });
    const card = within(runs).getByRole('listitem', { name: '07:30-12:00 · TY61 KRB' });
    expect(within(card).getByText('Driver: Dee Fenwick')).toBeTruthy();
    expect(within(card).getByRole('meter', { name: 'Payload' }).getAttribute('aria-valuetext')).toBe('5,380 kg of 12,000 kg');
    expect(within(card).getByRole('meter', { name: 'Pallet slots' }).getAttribute('aria-valuetext')).toBe('6 of 12');
    expect(within(card).getAllByTestId('deck-pallet')).toHaveLength(6);
    const drops = within(card).getByRole('list', { name: 'Drops of 07:30-12:00 · TY61 KRB, the first off first' });
    expect(
      within(drops)
        .getAllByRole('listitem')
        .map((li) => li.textContent?.slice(0, 12)),
    ).toEqual(['1. RL-000015', '2. RL-000016', '3. RL-000017']);
    expect(within(card).getByText('Plain tile, red')).toBeTruthy();
    expect(within(card).getByRole('link', { name: 'Open the run 07:30-12:00 · TY61 KRB' }).getAttribute('href')).toBe('/yard/runs/7');

    const week = await screen.findByRole('region', { name: 'Week of runs' });
    fireEvent.click(await within(week).findByRole('button', { name: 'Show the day plan of Wed 3 Mar 2027' }));
    expect(await screen.findByText('No runs on Wed 3 Mar 2027')).toBeTruthy();
    expect(router.state.location.search).toBe('?date=2027-03-03');
    expect(asked(fetchMock)).toContain('/api/branches/3/runs?date=2027-03-03');
  });

  it('keeps the branch and day in the address and asks for that branch', async () => {
    const fetchMock = stubFetch({
      'GET /api/branches/4/runs?date=2027-03-02': { status: 200, body: [] },
      'GET /api/branches/4/run-week?from=2027-03-01': { status: 200, body: { from: '2027-03-01', days: [] } },
      'GET /api/branches/3/runs?date=2027-03-02': { status: 200, body: [] },
      'GET /api/branches/3/run-week?from=2027-03-01': { status: 200, body: { from: '2027-03-01', days: [] } },
    });
    const { router } = renderWithProviders(<RunDayPlan branches={branches} />, { path: '/yard?branch=4&date=2027-03-02&view=week' });
    expect(await screen.findByText('No runs on Tue 2 Mar 2027')).toBeTruthy();
    expect((screen.getByLabelText('Branch') as HTMLSelectElement).value).toBe('4');
    expect(screen.getByRole('button', { name: 'The week' }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.change(screen.getByLabelText('Branch'), { target: { value: '3' } });
    await waitFor(() => expect(asked(fetchMock)).toContain('/api/branches/3/runs?date=2027-03-02'));
    expect(new URLSearchParams(router.state.location.search).get('branch')).toBe('3');
    fireEvent.click(screen.getByRole('button', { name: 'The day' }));
    expect(new URLSearchParams(router.state.location.search).get('view')).toBeNull();
  });
});
