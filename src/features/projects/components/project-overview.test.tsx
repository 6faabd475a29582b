import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Project } from '../../../../shared/schemas/project.schema';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { ProjectContactCard, siteBuildings } from './project-overview';

/** An invented site; only the fields the contact card reads are filled in. */
const site = (buildings: Project['buildings'] = []) =>
  ({ id: 4, name: 'Hollin Brow', reference: 'HB', site_address: 'Hollin Brow, Tollerbeck', site_postcode: '', contact_name: 'Gethin Marlow', contact_phone: '', buildings }) as unknown as Project;

const buildingsRow = () => screen.getByText('Buildings').nextElementSibling?.textContent;

describe('the site card', () => {
  it('lists the buildings an imported schedule names, not "Not given"', () => {
    stubFetch({});
    renderWithProviders(<ProjectContactCard project={site()} scheduleBuildings={['Birch', 'Birch', 'Rowan', 'Birch']} />);
    expect(buildingsRow()).toBe('Birch, Rowan');
  });

  it('keeps the buildings entered on the site first and adds only the schedule’s others', () => {
    expect(siteBuildings({ buildings: [{ name: 'Plot 1', kind: 'plot' }] as Project['buildings'] }, ['plot 1', 'Garage'])).toEqual(['Plot 1 (plot)', 'Garage']);
  });

  it('says "Not given" only when neither the site nor a schedule names one', () => {
    stubFetch({});
    renderWithProviders(<ProjectContactCard project={site()} />);
    expect(buildingsRow()).toBe('Not given');
  });
});
