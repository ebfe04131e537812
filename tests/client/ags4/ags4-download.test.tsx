/** The AGS4 download button: staff get the file under the server's name; a refusal shows its message instead of being saved. */
import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { Ags4Download } from '../../../client/src/features/ags4/components/ags4-download';
import { json, stubFetch } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { renderWithProviders } from '../support/render';

const me = (role: 'engineer' | 'client') => json(200, { user: aUser(role, 'Demo', `${role}@example.test`), csrfToken: 't' });

afterEach(() => vi.unstubAllGlobals());

describe('AGS4 download', () => {
  it('saves the file under the name the server gives', async () => {
    stubFetch({
      'GET /api/auth/me': me('engineer'),
      'GET /api/projects/3/ags4': new Response('"GROUP","PROJ"\r\n', {
        status: 200,
        headers: { 'content-type': 'text/plain', 'content-disposition': 'attachment; filename="QB-07-plate-tests.ags"' },
      }),
    });
    const created = vi.fn(() => 'blob:ags4');
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: created, revokeObjectURL: vi.fn() }));
    const clicked: string[] = [];
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      clicked.push(this.download);
    });
    const { user } = renderWithProviders(<Ags4Download of="project" id={3} />);
    await user.click(await screen.findByRole('button', { name: 'AGS4 file' }));
    await vi.waitFor(() => expect(clicked).toEqual(['QB-07-plate-tests.ags']));
    expect(created).toHaveBeenCalledOnce();
    click.mockRestore();
  });

  it('shows why there is no file', async () => {
    stubFetch({
      'GET /api/auth/me': me('engineer'),
      'GET /api/locations/9/ags4': json(404, { error: { code: 'no_tests', message: 'No test at TP-12 has a record to export.' } }),
    });
    const { user } = renderWithProviders(<Ags4Download of="location" id={9} />);
    await user.click(await screen.findByRole('button', { name: 'AGS4 file' }));
    expect(await screen.findByText('No test at TP-12 has a record to export.')).toBeTruthy();
  });

  it('is not offered to a client (the API answers them 403)', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/me': me('client') });
    renderWithProviders(<Ags4Download of="project" id={3} />);
    await vi.waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(screen.queryByRole('button', { name: 'AGS4 file' })).toBeNull();
  });
});
