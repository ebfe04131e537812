/**
 * Sessions and sockets follow the account: a role change, deactivation or password change ends the
 * user's other sessions and closes their sockets at once (measured from the answer to the change), and
 * a socket handshake from another site's page is refused.
 */
import { io } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/main';
import { demoEmail } from '../support/api';
import { connectSocket, httpSignIn, startLiveServer, type TestSocket } from '../support/live-server';

let server: RunningServer;
let admin: { cookie: string; csrfToken: string };
const PASSWORD = 'granite-ledger-93';

beforeAll(async () => {
  server = await startLiveServer();
  admin = await httpSignIn(server.url, demoEmail('admin'));
});
afterAll(() => server?.close());

const send = (who: { cookie: string; csrfToken: string }, method: string, url: string, body?: object) =>
  fetch(`${server.url}${url}`, {
    method,
    headers: { cookie: who.cookie, 'x-csrf-token': who.csrfToken, 'content-type': 'application/json' },
    body: body ? JSON.stringify(body) : undefined,
  });
const signedInStill = async (who: { cookie: string }) => (await fetch(`${server.url}/api/auth/me`, { headers: { cookie: who.cookie } })).status === 200;

let n = 0;
/** A fresh engineer account signed in twice, with a socket open on each session. */
async function twoSessions() {
  const email = `session-${++n}@example.test`;
  const created = await send(admin, 'POST', '/api/users', { email, name: `Session test ${n}`, role: 'engineer', password: PASSWORD });
  expect(created.status).toBe(201);
  const [a, b] = [await httpSignIn(server.url, email, PASSWORD), await httpSignIn(server.url, email, PASSWORD)];
  const [socketA, socketB] = [await connectSocket(server.url, a.cookie), await connectSocket(server.url, b.cookie)];
  return { id: (await created.json()).id as number, a, b, socketA, socketB };
}

/** Resolves with the ms from `since` to the socket's disconnect by the server. */
const disconnected = (socket: TestSocket) =>
  new Promise<number>((resolve) => socket.once('disconnect', (reason) => reason === 'io server disconnect' && resolve(performance.now())));

describe('an account change ends the sessions opened with the old rights', () => {
  it.each([
    ['demoted', { role: 'operator' }],
    ['deactivated', { active: false }],
    ['given a new password by an admin', { password: 'basalt-harbour-47' }],
  ])('%s: both sessions and both sockets end within a second', async (_what, change) => {
    const u = await twoSessions();
    const goneA = disconnected(u.socketA);
    const goneB = disconnected(u.socketB);
    const res = await send(admin, 'PATCH', `/api/users/${u.id}`, change);
    const answered = performance.now();
    expect(res.status).toBe(200);
    const [atA, atB] = await Promise.all([goneA, goneB]);
    expect(Math.max(atA, atB) - answered).toBeLessThan(1000);
    expect(await signedInStill(u.a)).toBe(false);
    expect(await signedInStill(u.b)).toBe(false);
    expect(await signedInStill(admin)).toBe(true);
  });

  it('own password change: the other session and its socket end, this one stays', async () => {
    const u = await twoSessions();
    const goneB = disconnected(u.socketB);
    let aDropped = false;
    u.socketA.once('disconnect', () => {
      aDropped = true;
    });
    const res = await send(u.a, 'POST', '/api/auth/password', { currentPassword: PASSWORD, newPassword: 'quartz-meadow-58' });
    const answered = performance.now();
    expect(res.status).toBe(204);
    expect((await goneB) - answered).toBeLessThan(1000);
    expect(await signedInStill(u.b)).toBe(false);
    expect(await signedInStill(u.a)).toBe(true);
    expect(aDropped).toBe(false);
    u.socketA.close();
  });
});

describe('socket handshake origin', () => {
  const attempt = (cookie: string, origin: string) =>
    new Promise<string>((resolve) => {
      const socket = io(server.url, { transports: ['websocket'], extraHeaders: { cookie, origin }, reconnection: false, forceNew: true });
      socket.once('connect', () => {
        socket.close();
        resolve('connected');
      });
      socket.once('connect_error', (err) => {
        socket.close();
        resolve(`refused: ${err.message}`);
      });
    });

  it('refuses a page of another site and accepts this site', async () => {
    const { cookie } = await httpSignIn(server.url, demoEmail('engineer'));
    expect(await attempt(cookie, 'http://evil.example')).toMatch(/^refused/);
    expect(await attempt(cookie, server.url)).toBe('connected');
  });
});
