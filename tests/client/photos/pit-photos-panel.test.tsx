import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { PitPhotosPanel } from '../../../client/src/features/photos/components/photo-sections';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';
import { anImage, aPhoto, OPERATOR, OWN_PIT, SITE_VIEW } from './fixtures';

const serve = (extra = {}) =>
  stubFetch({
    'GET /api/auth/me': json(200, { user: OPERATOR, csrfToken: 'session' }),
    'GET /api/runs/7/photos': json(200, { items: [SITE_VIEW, OWN_PIT] }),
    ...extra,
  });

describe('pit photos on the run console', () => {
  it('stays folded, counts the run’s photos, and adds pit photos to this run', async () => {
    const fetchMock = serve({ 'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }), 'POST /api/locations/5/photos': json(201, aPhoto({ id: 70 })) });
    renderWithProviders(<PitPhotosPanel runId={7} locationId={5} locked={false} />);
    const details = screen.getByRole('region', { name: 'Pit photos' }).querySelector('details');
    expect(details?.open).toBe(false);
    expect((await screen.findByText('(2)')).closest('summary')?.textContent).toBe('Pit photos (2)');

    const user = userEvent.setup();
    await user.click(screen.getByText('Pit photos'));
    expect(details?.open).toBe(true);
    expect((screen.getByLabelText('Kind') as HTMLSelectElement).value).toBe('pit');
    await user.upload(screen.getByLabelText('Choose photos'), anImage('plate.jpg', 'image/jpeg'));
    await user.click(screen.getByRole('button', { name: 'Upload 1 photo' }));
    await screen.findByText('1 photo added.');
    const body = requests(fetchMock).find((r) => r.key === 'POST /api/locations/5/photos')?.body as FormData;
    expect(body.get('runId')).toBe('7');
    expect(body.get('kind')).toBe('pit');
    expect(screen.getByText('This run')).toBeTruthy();
  });

  it('offers no upload once the run is signed', async () => {
    serve();
    renderWithProviders(<PitPhotosPanel runId={7} locationId={5} locked />);
    expect(await screen.findByText(/The run is signed, so its photos are locked/)).toBeTruthy();
    expect(screen.queryByLabelText('Choose photos')).toBeNull();
  });
});
