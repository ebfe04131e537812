import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allows } from '../../server/auth/permissions';
import type { RunningServer } from '../../server/main';
import { ROLES } from '../../shared/schemas/users';
import { demoEmail } from '../support/api';
import { connectSocket, httpSignIn, startLiveServer } from '../support/live-server';

let server: RunningServer;
beforeAll(async () => {
  server = await startLiveServer();
});
afterAll(() => server.close());

describe('sockets share the session (QUALITY S1, S4)', () => {
  it('refuses a socket without a signed-in session', async () => {
    await expect(connectSocket(server.url)).rejects.toThrow('authentication_required');
  });

  it.each(ROLES)('answers every socket event for role %s exactly as its access rule says', async (role) => {
    const { cookie } = await httpSignIn(server.url, demoEmail(role));
    const socket = await connectSocket(server.url, cookie);
    try {
      for (const spec of server.socketEvents) {
        // Rig 999999 does not exist: an allowed caller gets "not found", a refused one "forbidden".
        const reply = await socket.timeout(5000).emitWithAck(spec.event, { rigId: 999999 });
        const forbidden = !reply.ok && reply.error.startsWith('forbidden');
        expect({ event: spec.event, forbidden }).toEqual({ event: spec.event, forbidden: !allows(spec.access, role) });
      }
      const bad = await socket.timeout(5000).emitWithAck('rig:watch', { rigId: 'x' as unknown as number });
      expect(bad).toEqual(role === 'client' ? { ok: false, error: expect.stringMatching(/^forbidden/) } : { ok: false, error: expect.stringMatching(/^invalid_input: rigId/) });
    } finally {
      socket.close();
    }
  });

  it('disconnects a session’s sockets at sign-out', async () => {
    const { cookie, csrfToken } = await httpSignIn(server.url, demoEmail('engineer'));
    const socket = await connectSocket(server.url, cookie);
    const gone = new Promise<string>((resolve) => socket.once('disconnect', resolve));
    const res = await fetch(`${server.url}/api/auth/logout`, { method: 'POST', headers: { cookie, 'x-csrf-token': csrfToken } });
    expect(res.status).toBe(204);
    expect(await gone).toBe('io server disconnect');
    await expect(connectSocket(server.url, cookie)).rejects.toThrow('authentication_required');
  });
});
