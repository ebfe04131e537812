import type { TestLocation } from '@shared/schemas/projects';
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aProject, aUser } from '../support/fixtures';
import { renderApp } from '../support/render';
import { OPERATOR, OTHERS_PIT, SITE_VIEW } from './fixtures';

const PROJECT = aProject({ id: 3, code: 'HV-07', name: 'North terrace' });
const LOCATION: TestLocation = {
  id: 5,
  projectId: 3,
  pitId: 'TP-3',
  latitude: null,
  longitude: null,
  planX: null,
  planY: null,
  testDepthM: 1.2,
  waterTableDepthM: null,
  pitWidthM: null,
  soilDescription: 'Medium dense sand',
  notes: '',
  sitePlanFile: null,
  createdAt: '2026-03-01T08:00:00Z',
  updatedAt: '2026-03-01T08:00:00Z',
};

function serveLocation(user: ReturnType<typeof aUser>, photos = [SITE_VIEW, OTHERS_PIT]) {
  return stubFetch({
    'GET /api/auth/me': json(200, { user, csrfToken: 'session' }),
    'GET /api/health': json(200, { app: 'ok', database: 'ok' }),
    'GET /api/locations/5': json(200, LOCATION),
    'GET /api/projects/3': json(200, PROJECT),
    'GET /api/locations/5/plans': json(200, { items: [] }),
    'GET /api/locations/5/photos': json(200, { items: photos }),
  });
}

describe('photos on the test location page', () => {
  it('shows staff every photo of the location, which run each came from, and the upload form', async () => {
    serveLocation(OPERATOR);
    renderApp('/locations/5');
    const section = within(await screen.findByRole('region', { name: 'Photos' }));
    const list = await section.findByRole('list', { name: 'Photos of pit TP-3' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(2);
    expect(within(list).getByText('Location')).toBeTruthy();
    expect(within(list).getByRole('link', { name: 'Run 8' })).toBeTruthy();
    expect(section.getByText(/photos this location can hold/).textContent).toBe('2 of 60 photos this location can hold');
    expect((section.getByLabelText('Kind') as HTMLSelectElement).value).toBe('site');
    expect(section.getByLabelText('Choose photos')).toBeTruthy();
  });

  it('tells staff what to do when there are no photos yet', async () => {
    serveLocation(OPERATOR, []);
    renderApp('/locations/5');
    const section = within(await screen.findByRole('region', { name: 'Photos' }));
    expect(await section.findByText('No photos yet')).toBeTruthy();
    expect(section.getByText(/with “Choose photos” below/)).toBeTruthy();
  });

  it('shows a client no photos and does not ask for them', async () => {
    const fetchMock = serveLocation(aUser('client', 'Dara Quill', 'dara@example.test'));
    renderApp('/locations/5');
    await screen.findByRole('heading', { name: 'Pit TP-3' });
    expect(screen.queryByRole('region', { name: 'Photos' })).toBeNull();
    expect(screen.queryByLabelText('Choose photos')).toBeNull();
    expect(requests(fetchMock).some((r) => r.key.includes('/photos'))).toBe(false);
  });
});
