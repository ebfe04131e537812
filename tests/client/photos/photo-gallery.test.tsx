import { screen, waitFor, within } from '@testing-library/react';
import { beforeAll, describe, expect, it } from 'vitest';
import { PhotoGallery } from '../../../client/src/features/photos/components/photo-gallery';
import { ReportPhotos } from '../../../client/src/features/photos/components/photo-sections';
import { canChangePhoto, canSeePhotos } from '../../../client/src/features/photos/photo-access';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { renderWithProviders } from '../support/render';
import { ENGINEER, installDialogMethods, OPERATOR, OTHERS_PIT, OWN_PIT, SITE_VIEW } from './fixtures';

beforeAll(installDialogMethods);

const PHOTOS = [SITE_VIEW, OWN_PIT, OTHERS_PIT];
const session = (user: typeof OPERATOR) => ({ 'GET /api/auth/me': json(200, { user, csrfToken: 'session-token' }) });

describe('photo gallery', () => {
  it('shows each photo’s thumbnail, kind, caption, uploader, time and where it belongs', () => {
    stubFetch(session(ENGINEER));
    renderWithProviders(<PhotoGallery photos={PHOTOS} label="Photos of pit TP-3" showOrigin />);
    const list = screen.getByRole('list', { name: 'Photos of pit TP-3' });
    const tiles = within(list).getAllByRole('listitem');
    expect(tiles).toHaveLength(3);

    const site = within(tiles[0]);
    expect(site.getByText('Site')).toBeTruthy();
    expect(site.getByText('Looking north over the stripped platform')).toBeTruthy();
    expect(site.getByText('Pella Strand · 2026-03-04 09:15')).toBeTruthy();
    expect(site.getByText('Location')).toBeTruthy();
    expect(tiles[0].querySelector('img')?.getAttribute('src')).toBe('/api/photos/31/thumb');

    const pit = within(tiles[1]);
    expect(pit.getByText('Pit')).toBeTruthy();
    expect(pit.getByRole('link', { name: 'Run 7' }).getAttribute('href')).toBe('/runs/7');
    expect(pit.getByText('Tomás Reyes · 2026-03-04 09:15')).toBeTruthy();
  });

  it('opens the larger preview from the keyboard, with caption and the original, and closes it', async () => {
    stubFetch(session(ENGINEER));
    const { user } = renderWithProviders(<PhotoGallery photos={PHOTOS} label="Photos" />);
    expect(screen.queryByRole('dialog')).toBeNull();

    await user.tab();
    const first = screen.getByRole('button', { name: 'Open Site photo: Looking north over the stripped platform' });
    expect(document.activeElement).toBe(first);
    await user.tab();
    await user.keyboard('{Enter}');

    const dialog = screen.getByRole('dialog', { name: 'Pit photo' });
    const preview = within(dialog).getByRole('img', { name: 'Pit photo: Plate bedded on sand' });
    expect(preview.getAttribute('src')).toBe('/api/photos/32/preview');
    expect(within(dialog).getByText('Plate bedded on sand')).toBeTruthy();
    expect(within(dialog).getByText('4032 × 3024')).toBeTruthy();
    expect(within(dialog).getByRole('link', { name: 'Open the original file' }).getAttribute('href')).toBe('/api/photos/32/original');

    await user.click(within(dialog).getByRole('button', { name: 'Close' }));
    expect(screen.queryByRole('dialog')).toBeNull();
  });

  it('lets an operator change their own photo but offers no delete or edit on someone else’s', async () => {
    stubFetch(session(OPERATOR));
    const { user } = renderWithProviders(<PhotoGallery photos={PHOTOS} label="Photos" />);

    await user.click(screen.getByRole('button', { name: 'Open Pit photo: Plate bedded on sand' }));
    // The session has loaded once the operator's own photo offers its controls.
    expect(await screen.findByRole('button', { name: 'Delete photo' })).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Close' }));

    await user.click(screen.getByRole('button', { name: 'Open Pit photo: Kentledge blocks' }));
    const dialog = screen.getByRole('dialog', { name: 'Pit photo' });
    expect(within(dialog).getByText('Kentledge blocks')).toBeTruthy();
    expect(within(dialog).queryByRole('button', { name: 'Delete photo' })).toBeNull();
    expect(within(dialog).queryByRole('form', { name: 'Change the photo' })).toBeNull();
  });

  it('saves a new caption and deletes only after the second press', async () => {
    const fetchMock = stubFetch({
      ...session(ENGINEER),
      'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }),
      'PATCH /api/photos/33': json(200, { ...OTHERS_PIT, caption: 'Kentledge, 24 blocks' }),
      'DELETE /api/photos/33': new Response(null, { status: 204 }),
    });
    const { user } = renderWithProviders(<PhotoGallery photos={PHOTOS} label="Photos" />);
    await user.click(screen.getByRole('button', { name: 'Open Pit photo: Kentledge blocks' }));
    const caption = await screen.findByLabelText('Caption');
    await user.clear(caption);
    await user.type(caption, 'Kentledge, 24 blocks');
    await user.click(screen.getByRole('button', { name: 'Save caption and kind' }));
    expect(await screen.findByText('Saved.')).toBeTruthy();
    expect(requests(fetchMock).find((r) => r.key === 'PATCH /api/photos/33')?.body).toEqual({ caption: 'Kentledge, 24 blocks', kind: 'pit' });

    await user.click(screen.getByRole('button', { name: 'Delete photo' }));
    expect(requests(fetchMock).some((r) => r.key === 'DELETE /api/photos/33')).toBe(false);
    expect(screen.getByText('Delete this photo and its files for good?')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Yes, delete' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(requests(fetchMock).filter((r) => r.key === 'DELETE /api/photos/33')).toHaveLength(1);
  });

  it('shows the server’s refusal to change a photo of a signed run', async () => {
    stubFetch({
      ...session(ENGINEER),
      'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }),
      'DELETE /api/photos/31': json(409, { error: { code: 'run_locked', message: 'Run 7 is signed; reopen it to change it.' } }),
    });
    const { user } = renderWithProviders(<PhotoGallery photos={PHOTOS} label="Photos" />);
    await user.click(screen.getByRole('button', { name: /Open Site photo/ }));
    await user.click(await screen.findByRole('button', { name: 'Delete photo' }));
    await user.click(screen.getByRole('button', { name: 'Yes, delete' }));
    expect((await screen.findByRole('alert')).textContent).toContain('Run 7 is signed; reopen it to change it.');
    expect(screen.getByRole('dialog')).toBeTruthy();
  });
});

describe('photos on the report', () => {
  it('lists what the server says the report shows, read-only even for an engineer', async () => {
    stubFetch({ ...session(ENGINEER), 'GET /api/runs/7/photos': json(200, { items: [SITE_VIEW, OWN_PIT] }) });
    const { user } = renderWithProviders(<ReportPhotos runId={7} />);
    const list = await screen.findByRole('list', { name: 'Photos on the report' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(2);
    expect(within(list).getByText('This run')).toBeTruthy();
    expect(screen.getByText('2 photos will appear on the report.')).toBeTruthy();
    await user.click(within(list).getByRole('button', { name: /Plate bedded on sand/ }));
    const dialog = screen.getByRole('dialog');
    expect(within(dialog).getByRole('img', { name: 'Pit photo: Plate bedded on sand' })).toBeTruthy();
    expect(within(dialog).queryByRole('button', { name: 'Delete photo' })).toBeNull();
    expect(within(dialog).queryByLabelText('Caption')).toBeNull();
  });

  it('says so when the report will have no photos', async () => {
    stubFetch({ ...session(ENGINEER), 'GET /api/runs/7/photos': json(200, { items: [] }) });
    renderWithProviders(<ReportPhotos runId={7} />);
    expect(await screen.findByText('The report will have no photos')).toBeTruthy();
    expect(screen.queryByRole('list')).toBeNull();
  });
});

describe('who may see and change photos', () => {
  it('keeps clients out and lets operators change only what they uploaded', () => {
    const client = aUser('client', 'Dara Quill', 'dara@example.test');
    expect(['admin', 'engineer', 'operator'].every((r) => canSeePhotos(r as typeof client.role))).toBe(true);
    expect(canSeePhotos(client.role)).toBe(false);
    expect(canSeePhotos(null)).toBe(false);
    expect(canChangePhoto(OPERATOR, OWN_PIT)).toBe(true);
    expect(canChangePhoto(OPERATOR, OTHERS_PIT)).toBe(false);
    expect(canChangePhoto(OPERATOR, { uploadedBy: null })).toBe(false);
    expect(canChangePhoto(ENGINEER, OTHERS_PIT)).toBe(true);
    expect(canChangePhoto(client, OWN_PIT)).toBe(false);
  });
});
