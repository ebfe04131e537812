import { DEFAULT_DEVICE_PROFILES, polledMmIndicator } from '@shared/devices/default-profiles';
import { describeDeviceProblem } from '@shared/devices/problems';
import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { DeviceProfileForm } from '../../../client/src/features/rigs/components/device-profile-form';
import { checkDraft, decodeEscapes, encodeEscapes, profileDraft } from '../../../client/src/features/rigs/utils/profile-draft';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { describedText, renderWithProviders } from '../support/render';

function renderForm(props: Partial<Parameters<typeof DeviceProfileForm>[0]> = {}) {
  const onSaved = vi.fn();
  return { onSaved, ...renderWithProviders(<DeviceProfileForm onSaved={onSaved} {...props} />) };
}

/** Tests that type into many boxes: slow on a loaded machine. */
const TYPING_MS = 30_000;

async function retype(user: ReturnType<typeof renderForm>['user'], label: string, text: string) {
  const box = screen.getByLabelText(label);
  await user.clear(box);
  await user.type(box, text);
}

describe('device profile form', () => {
  it('defines a float32 transducer sending its high word first, the default word order', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/device-profiles': (init) => json(201, { ...JSON.parse(String(init.body)), source: 'lab', updatedAt: '2026-01-01T00:00:00.000Z' }),
    });
    const { user, onSaved } = renderForm();
    expect((screen.getByLabelText('Word order') as HTMLSelectElement).value).toBe('high-first');
    await user.type(screen.getByLabelText('Profile id'), 'lab-float-hw');
    await user.type(screen.getByLabelText('Name'), 'Lab transducer, float32 MPa');
    await retype(user, 'Baud rate', '19200');
    await user.selectOptions(screen.getByLabelText('Parity'), 'even');
    await retype(user, 'Slave id', '5');
    await user.selectOptions(screen.getByLabelText('Function'), '4');
    await retype(user, 'Register', '10');
    await retype(user, 'Poll interval', '250');
    await user.click(screen.getByRole('button', { name: 'Define profile' }));

    await vi.waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/device-profiles')?.body).toEqual({
      protocol: 'modbus-rtu',
      id: 'lab-float-hw',
      name: 'Lab transducer, float32 MPa',
      serial: { baudRate: 19200, dataBits: 8, parity: 'even', stopBits: 1 },
      unitId: 5,
      functionCode: 4,
      register: 10,
      format: 'float32',
      wordOrder: 'high-first',
      byteOrder: 'big',
      scale: 1,
      offset: 0,
      unit: 'MPa',
      pollIntervalMs: 250,
      timeoutMs: 500,
    });
  }, TYPING_MS);

  it('names the boxes the shared schema refuses and sends nothing', async () => {
    const fetchMock = stubFetch({});
    const { user } = renderForm();
    await user.type(screen.getByLabelText('Profile id'), 'Bad Id');
    await retype(user, 'Slave id', '300');
    await user.clear(screen.getByLabelText('Register'));
    await user.click(screen.getByRole('button', { name: 'Define profile' }));
    expect(describedText(screen.getByLabelText('Profile id'))).toContain('lower-case letters');
    expect(describedText(screen.getByLabelText('Name'))).toContain('at least 1 character');
    expect(describedText(screen.getByLabelText('Slave id'))).toContain('at most 247');
    expect(describedText(screen.getByLabelText('Register'))).toContain('required');
    expect(fetchMock).not.toHaveBeenCalled();
  }, TYPING_MS);

  it("puts the server's refusal beside the box it names", async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/device-profiles': json(409, { error: { code: 'conflict', message: 'id: a profile "lab-x" exists already', field: 'id' } }),
    });
    const { user, onSaved } = renderForm();
    await user.type(screen.getByLabelText('Profile id'), 'lab-x');
    await user.type(screen.getByLabelText('Name'), 'X');
    await user.click(screen.getByRole('button', { name: 'Define profile' }));
    await vi.waitFor(() => expect(describedText(screen.getByLabelText('Profile id'))).toContain('a profile "lab-x" exists already'));
    expect(onSaved).not.toHaveBeenCalled();
  });

  it('edits an ASCII profile with its control characters shown as escapes; the id stays fixed', () => {
    renderForm({ profile: { ...polledMmIndicator, source: 'lab', updatedAt: null } });
    expect((screen.getByLabelText('Request') as HTMLInputElement).value).toBe('?\\r');
    expect((screen.getByLabelText('Profile id') as HTMLInputElement).disabled).toBe(true);
  });
});

describe('trying a profile on a port', () => {
  it('sends the profile as the boxes hold it and lists each sample, an exception by its meaning', async () => {
    const exception = describeDeviceProblem({ kind: 'exception', code: 2 });
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/device-profiles/preview': json(200, {
        port: '/dev/ttyUSB3',
        opened: true,
        problem: null,
        samples: [
          { seq: 1, status: 'ok', raw: '05 04 04 41 48 00 00 9E 6B', value: 12.5, problem: null },
          { seq: 2, status: 'rejected', raw: '05 84 02 C2 C1', value: null, problem: exception },
        ],
      }),
    });
    const { user, onSaved } = renderForm();
    await user.type(screen.getByLabelText('Name'), 'Trial');
    await retype(user, 'Register', '10');
    await user.type(screen.getByLabelText('Port to try'), '/dev/ttyUSB3');
    await user.click(screen.getByRole('button', { name: 'Try it' }));

    await vi.waitFor(() => expect(screen.getByRole('status').textContent).toBe('1 of 2 samples good on /dev/ttyUSB3'));
    expect(screen.getByText(exception)).toBeTruthy();
    expect(screen.getByText('12.5')).toBeTruthy();
    const sent = requests(fetchMock).find((r) => r.key === 'POST /api/device-profiles/preview')?.body as { profile: { id: string; register: number; wordOrder: string }; port: string };
    expect(sent).toMatchObject({ port: '/dev/ttyUSB3', profile: { id: 'preview', register: 10, wordOrder: 'high-first' } });
    expect(onSaved).not.toHaveBeenCalled(); // trying saves nothing
  }, TYPING_MS);

  it('says so when the port never opened', async () => {
    stubFetch({
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'POST /api/device-profiles/preview': json(200, { port: '/dev/ttyUSB9', opened: false, problem: 'Port never opened: No such file or directory', samples: [] }),
    });
    const { user } = renderForm();
    await user.type(screen.getByLabelText('Name'), 'Trial');
    await user.type(screen.getByLabelText('Port to try'), '/dev/ttyUSB9');
    await user.click(screen.getByRole('button', { name: 'Try it' }));
    await vi.waitFor(() => expect(screen.getByRole('alert').textContent).toBe('Port never opened: No such file or directory'));
  });
});

describe('profile drafts', () => {
  it('give back every built-in profile unchanged through the form boxes', () => {
    for (const profile of DEFAULT_DEVICE_PROFILES) expect(checkDraft(profileDraft(profile))).toEqual({ ok: true, input: profile });
  });

  it('decode and encode escapes both ways', () => {
    expect(decodeEscapes('?\\r\\n')).toBe('?\r\n');
    expect(decodeEscapes('a\\\\r')).toBe('a\\r'); // an escaped backslash stays one backslash
    for (const sent of ['?\r', 'R\r\n', 'a\\b\t']) expect(decodeEscapes(encodeEscapes(sent))).toBe(sent);
  });
});
