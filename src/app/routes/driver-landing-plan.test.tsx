import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DriverDay } from '../../features/deliveries/components/driver-day';
import type { RenderFaceDrawing } from '../../features/deliveries/components/drop-parts';
import { OutboxProvider } from '../../features/deliveries/lib/phone-outbox';
import { createTestOutbox } from '../../features/deliveries/lib/test-outbox';
import { driverDay } from '../../test-utils/driver-day-fixture';
import { renderWithProviders, stubFetch } from '../../test-utils/render-with-providers';
import { LandingFaceDrawing } from './landing-face-drawing';

const renderFaceDrawing: RenderFaceDrawing = (drawing, system) => <LandingFaceDrawing drawing={drawing} system={system} />;

describe("the driver's drop view draws each landing face with the estimate's face drawing", () => {
  it('draws the stacks of six on every second batten of each Alder slope from the day alone, both slopes alike, asking the server for nothing', () => {
    const fetchMock = stubFetch({});
    const day = driverDay();
    const drop = day.runs[0]!.drops[0]!;
    renderWithProviders(
      <OutboxProvider outbox={createTestOutbox()}>
        <DriverDay day={day} renderFaceDrawing={renderFaceDrawing} />
      </OutboxProvider>,
    );
    const plan = screen.getByRole('region', { name: 'Roof landing plan' });
    const faces = within(plan).getAllByTestId('landing-face');
    expect(faces).toHaveLength(2);

    const counts = faces.map((face, i) => {
      fireEvent.click(within(face).getByText(`Show the stacks on Alder · ${['Front', 'Rear'][i]}`));
      const drawing = within(face).getByTestId('face-drawing');
      const result = drop.landing_plan[i]!.drawing!.result;
      // The default tile on a 5,091 mm rafter at 40°: 15 courses (worked by hand in face-drawing.test.tsx),
      // so floor(15 ÷ 2) = 7 loading battens, every 2nd from the top (stacks of six on every second batten:
      // common practice, the engine's default roof loading).
      expect(result.courses).toBe(15);
      expect(drawing.querySelectorAll('[data-testid="loading-batten"]')).toHaveLength(7);
      expect(drawing.querySelectorAll('[data-testid="batten"]').length + 7).toBe(15);
      // One stack of six for every six tiles the face takes, every one drawn over a rafter.
      const stacks = drawing.querySelectorAll('[data-testid="stack"]').length;
      expect(stacks).toBe(Math.ceil(result.tiles / 6));
      expect(stacks).toBe(result.stacks);
      expect(drawing.querySelectorAll('[data-testid="rafter"]').length).toBeGreaterThan(0);
      expect(within(face).getByText(`Stacks of 6 on every 2nd batten from the top, ${result.stacks} stacks on this face; load both slopes in step.`)).toBeTruthy();
      return stacks;
    });
    // Two slopes of one house: the same stacks on each, so they are loaded in step.
    expect(counts[0]).toBe(counts[1]);
    expect(counts[0]).toBeGreaterThan(0);
    // The estimate is never fetched: a driver may not read it, and the phone may have no signal.
    expect(fetchMock).not.toHaveBeenCalled();
  });
});
