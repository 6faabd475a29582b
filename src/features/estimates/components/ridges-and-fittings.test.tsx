import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { runEstimateFromCsv } from '../../../../shared/engine/estimate';
import { EXAMPLE_OPENINGS_CSV } from '../../../../shared/engine/example-openings';
import { EXAMPLE_SCHEDULE_CSV } from '../../../../shared/engine/example-schedule';
import { RidgeLoads, TakeOffExtras, extraLines } from './ridges-and-fittings';

function example() {
  const out = runEstimateFromCsv(EXAMPLE_SCHEDULE_CSV, { verge: { kind: 'dry' } }, EXAMPLE_OPENINGS_CSV);
  if (!out.ok) throw new Error('example rejected');
  return out.result;
}

describe('the estimate page’s ridges and extra lines', () => {
  it('groups the faces by the ridge the schedule names, with each ridge’s load difference', () => {
    const result = example();
    render(<RidgeLoads result={result} />);
    const rows = screen.getAllByTestId('ridge-row');
    expect(rows).toHaveLength(2);
    expect(rows[0].textContent).toMatch(/Alder.*Main.*Front .* kg · Back .* kg · East hip end/);
    // The roof windows in Alder's back slope make it lighter than the front.
    const alder = result.ridges.find((r) => r.building === 'Alder')!;
    expect(alder.difference_kg).toBeGreaterThan(0);
  });

  it('lists the new quantities as their own lines, with the flashings', () => {
    const result = example();
    render(<TakeOffExtras totals={result.totals} />);
    expect(screen.getByRole('rowheader', { name: 'Dry verge units' })).toBeTruthy();
    expect(screen.getByRole('rowheader', { name: 'Hip irons' })).toBeTruthy();
    expect(screen.getByRole('rowheader', { name: 'Back gutter' })).toBeTruthy();
    expect(screen.getByRole('rowheader', { name: 'Roof windows' })).toBeTruthy();
    // An estimate from the earlier engine has none of these figures: nothing to list.
    expect(extraLines({ tiles: 10 })).toEqual([]);
  });
});
