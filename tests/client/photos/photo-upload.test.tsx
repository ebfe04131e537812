import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { PhotoUpload } from '../../../client/src/features/photos/components/photo-upload';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';
import { anImage, aPhoto } from './fixtures';

const UPLOAD = 'POST /api/locations/5/photos';
const CSRF = { 'GET /api/auth/csrf': json(200, { csrfToken: 't-1' }) };
const posts = (fetchMock: ReturnType<typeof stubFetch>) => requests(fetchMock).filter((r) => r.key === UPLOAD);
const chosen = () => screen.getByRole('list', { name: 'Chosen photos' });

/** The file input; the browser's own accept filter is off so the component's check is what is tested. */
function renderUpload(props: { runId?: number; defaultKind?: 'site' | 'pit' } = {}) {
  const view = renderWithProviders(<PhotoUpload locationId={5} defaultKind={props.defaultKind ?? 'site'} runId={props.runId} />);
  const user = userEvent.setup({ applyAccept: false });
  return { ...view, user, input: screen.getByLabelText('Choose photos') as HTMLInputElement };
}

describe('photo upload', () => {
  it('offers several files of the accepted types, without forcing the camera', () => {
    stubFetch({});
    const { input } = renderUpload();
    expect(input.multiple).toBe(true);
    expect(input.accept).toBe('image/jpeg,image/png,image/webp');
    expect(input.hasAttribute('capture')).toBe(false);
  });

  it('refuses a wrong type and an oversize image before sending anything', async () => {
    const fetchMock = stubFetch(CSRF);
    const { user, input } = renderUpload();
    await user.upload(input, [anImage('borehole-log.pdf', 'application/pdf', 80_000), anImage('pit-raw.jpg', 'image/jpeg', 16 * 1024 * 1024)]);

    const rows = within(chosen()).getAllByRole('listitem');
    expect(rows[0].textContent).toContain('borehole-log.pdf');
    expect(rows[0].textContent).toContain('Choose a JPEG, PNG or WebP image.');
    expect(rows[1].textContent).toContain('pit-raw.jpg');
    expect(rows[1].textContent).toContain('The image is larger than 15 MB.');
    expect(screen.queryByRole('button', { name: /^Upload/ })).toBeNull();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends the image with kind, caption and run as multipart fields, and clears the list', async () => {
    const fetchMock = stubFetch({ ...CSRF, [UPLOAD]: json(201, aPhoto({ id: 40, kind: 'pit', runId: 7 })) });
    const { user, input } = renderUpload({ runId: 7, defaultKind: 'pit' });
    expect((screen.getByLabelText('Kind') as HTMLSelectElement).value).toBe('pit');
    await user.type(screen.getByLabelText('Caption (optional)'), '  Plate seated, gauges zeroed ');
    const photo = anImage('pit-north.jpg', 'image/jpeg');
    await user.upload(input, [anImage('notes.txt', 'text/plain', 300), photo]);
    await user.click(screen.getByRole('button', { name: 'Upload 1 photo' }));

    expect(await screen.findByText('1 photo added.')).toBeTruthy();
    const sent = posts(fetchMock);
    expect(sent).toHaveLength(1);
    expect(sent[0].headers['x-csrf-token']).toBe('t-1');
    const body = sent[0].body as FormData;
    expect(body.get('file')).toBe(photo);
    expect(body.get('kind')).toBe('pit');
    expect(body.get('caption')).toBe('Plate seated, gauges zeroed');
    expect(body.get('runId')).toBe('7');
    // The refused text file is still listed; the sent photo is not.
    const rows = within(chosen()).getAllByRole('listitem');
    expect(rows.map((r) => r.textContent)).toEqual([expect.stringContaining('notes.txt')]);
  });

  it('sends a site photo of the location with no run and no empty caption', async () => {
    const fetchMock = stubFetch({ ...CSRF, [UPLOAD]: json(201, aPhoto({ id: 41 })) });
    const { user, input } = renderUpload();
    await user.upload(input, anImage('overview.webp', 'image/webp'));
    await user.click(screen.getByRole('button', { name: 'Upload 1 photo' }));
    await screen.findByText('1 photo added.');
    const body = posts(fetchMock)[0].body as FormData;
    expect([...body.keys()]).toEqual(['file', 'kind']);
    expect(body.get('kind')).toBe('site');
  });

  it('uploads several files one after the other and says how far it is', async () => {
    let release: (r: Response) => void = () => {};
    const held = new Promise<Response>((resolve) => {
      release = resolve;
    });
    let n = 0;
    const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      const key = `${init.method ?? 'GET'} ${String(input)}`;
      if (key === 'GET /api/auth/csrf') return json(200, { csrfToken: 't-1' });
      if (key !== UPLOAD) throw new Error(`unexpected request: ${key}`);
      n++;
      return n === 2 ? held : json(201, aPhoto({ id: 50 + n }));
    });
    vi.stubGlobal('fetch', fetchMock);
    const { user, input } = renderUpload();
    await user.upload(input, [anImage('a.jpg', 'image/jpeg'), anImage('b.png', 'image/png'), anImage('c.jpg', 'image/jpeg')]);
    await user.click(screen.getByRole('button', { name: 'Upload 3 photos' }));

    expect((await screen.findByRole('status')).textContent).toBe('Uploading 2 of 3');
    // The third has not started while the second is on its way.
    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST')).toHaveLength(2);
    release(json(201, aPhoto({ id: 52 })));
    expect(await screen.findByText('3 photos added.')).toBeTruthy();
    const bodies = fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST').map(([, init]) => init?.body as FormData);
    expect(bodies.map((b) => (b.get('file') as File).name)).toEqual(['a.jpg', 'b.png', 'c.jpg']);
    expect(screen.queryByRole('list', { name: 'Chosen photos' })).toBeNull();
  });

  it('keeps a file the server refused listed with the server’s reason, and sends it again on request', async () => {
    const fetchMock = stubFetch({
      ...CSRF,
      [UPLOAD]: [
        json(201, aPhoto({ id: 60 })),
        json(415, { error: { code: 'unsupported_media_type', message: 'file: the content is not a JPEG, PNG or WebP image', field: 'file' } }),
        json(201, aPhoto({ id: 61 })),
      ],
    });
    const { user, input } = renderUpload();
    await user.upload(input, [anImage('good.jpg', 'image/jpeg'), anImage('renamed.jpg', 'image/jpeg')]);
    await user.click(screen.getByRole('button', { name: 'Upload 2 photos' }));

    expect((await screen.findByRole('alert')).textContent).toContain('1 photo not uploaded');
    expect(screen.getByText('1 photo added.')).toBeTruthy();
    const rows = within(chosen()).getAllByRole('listitem');
    expect(rows).toHaveLength(1);
    expect(rows[0].textContent).toContain('renamed.jpg');
    expect(rows[0].textContent).toContain('Not uploaded: the content is not a JPEG, PNG or WebP image');

    await user.click(screen.getByRole('button', { name: 'Upload 1 photo' }));
    await waitFor(() => expect(screen.queryByRole('list', { name: 'Chosen photos' })).toBeNull());
    expect(posts(fetchMock).map((r) => ((r.body as FormData).get('file') as File).name)).toEqual(['good.jpg', 'renamed.jpg', 'renamed.jpg']);
  });

  it('words a size refusal that arrives without our error body, and the location’s photo limit', async () => {
    stubFetch({
      ...CSRF,
      [UPLOAD]: [
        new Response('<html>413 Request Entity Too Large</html>', { status: 413, statusText: 'Payload Too Large' }),
        json(400, { error: { code: 'bad_request', message: 'file: pit TP-3 already holds 60 photos; delete some first', field: 'file' } }),
      ],
    });
    const { user, input } = renderUpload();
    fireEvent.change(input, { target: { files: [anImage('huge.jpg', 'image/jpeg', 14 * 1024 * 1024), anImage('one-more.jpg', 'image/jpeg')] } });
    await user.click(screen.getByRole('button', { name: 'Upload 2 photos' }));
    await screen.findByRole('alert');
    const rows = within(chosen()).getAllByRole('listitem');
    expect(rows[0].textContent).toContain('The server refused the file as too large.');
    expect(rows[1].textContent).toContain('pit TP-3 already holds 60 photos; delete some first');
  });
});
