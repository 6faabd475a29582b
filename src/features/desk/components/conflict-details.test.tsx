import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { ConflictDetails, isDeskConflict } from './conflict-details';

describe('ConflictDetails', () => {
  it('shows an overbooked lorry with its payload and pallet slots left against what the order needs', () => {
    const error = new ApiError(409, 'slot_full', 'RL-TY02 on 2027-03-01 07:30-12:00 has 500 kg and 1 pallet slots left; this order needs 2,200 kg and 2 pallets', [
      { path: 'slot_id', message: 'the lorry would be overbooked', remaining_kg: 500, remaining_pallets: 1, weight_kg: 2200, pallets: 2 },
    ]);
    render(<ConflictDetails error={error} />);
    expect(screen.getByText('That lorry cannot take this order: it would be overbooked')).toBeTruthy();
    expect(screen.getByText(/RL-TY02 on 2027-03-01/)).toBeTruthy();
    expect(screen.getByText('500 kg (this order 2,200 kg)')).toBeTruthy();
    expect(screen.getByText('1 (this order 2)')).toBeTruthy();
  });

  it('tells a desk conflict from other errors', () => {
    expect(isDeskConflict(new ApiError(409, 'insufficient_stock', 'short'))).toBe(true);
    expect(isDeskConflict(new ApiError(409, 'project_archived', 'archived'))).toBe(false);
    expect(isDeskConflict(new ApiError(422, 'validation_failed', 'bad'))).toBe(false);
  });
});
