import { describe, expect, it } from 'vitest';
import { slotChangeFormSchema } from './slot-change';

const now = { time_window: '07:30-12:00', driver_id: 9 };

describe('slotChangeFormSchema', () => {
  it('sends only the window when the driver is left as it is, with the spaces round the dash taken out', () => {
    expect(slotChangeFormSchema(now).parse({ time_window: ' 12:30 - 16:30 ', driver_id: '9' })).toEqual({ time_window: '12:30-16:30' });
  });

  it('sends driver_id null when the driver is taken off, and no window', () => {
    expect(slotChangeFormSchema(now).parse({ time_window: '07:30-12:00', driver_id: '' })).toEqual({ driver_id: null });
  });

  it('refuses a form that changes nothing, saying so', () => {
    const result = slotChangeFormSchema(now).safeParse({ time_window: '07:30-12:00', driver_id: '9' });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toMatch(/Nothing is changed yet/);
  });

  it('names the time window field when the new window ends before it starts', () => {
    const result = slotChangeFormSchema(now).safeParse({ time_window: '16:00-13:00', driver_id: '9' });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]).toMatchObject({ path: ['time_window'], message: 'must end after it starts' });
  });
});
