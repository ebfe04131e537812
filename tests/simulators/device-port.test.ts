import { existsSync, mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SerialPort } from 'serialport';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { DevicePort } from '../../simulators/devices/device-port';
import { FaultBoard } from '../../simulators/devices/faults';
import { PtyPair } from '../../simulators/pty';

const serial = { baudRate: 9600, dataBits: 8, parity: 'none', stopBits: 1 } as const;
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

describe('pty pairs', () => {
  const dir = mkdtempSync(join(tmpdir(), 'settlescope-pty-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('start socat, expose both links, and leave nothing behind on stop', async () => {
    const pair = new PtyPair({ name: 'probe', dir });
    await pair.start();
    const pid = pair.pid;
    expect(pid).toBeTypeOf('number');
    expect(isAlive(pid ?? -1)).toBe(true);
    expect(existsSync(pair.devicePath) && existsSync(pair.appPath)).toBe(true);

    await pair.stop();
    expect(isAlive(pid ?? -1)).toBe(false);
    expect(existsSync(pair.devicePath) || existsSync(pair.appPath)).toBe(false);

    await pair.start(); // again, on the same paths
    expect(existsSync(pair.appPath)).toBe(true);
    await pair.stop();
  });

  it('refuses links that are in use, and clears stale ones', async () => {
    const first = new PtyPair({ name: 'busy', dir });
    await first.start();
    try {
      await expect(new PtyPair({ name: 'busy', dir }).start()).rejects.toThrow(/in use/);
    } finally {
      await first.stop();
    }
    symlinkSync('/dev/pts/no-such-pty', join(dir, 'stale-dev'));
    const stale = new PtyPair({ name: 'stale', dir });
    await stale.start();
    expect(existsSync(stale.devicePath)).toBe(true);
    await stale.stop();
  });

  it('rejects a link name that is not a plain file name, naming "name"', () => {
    expect(() => new PtyPair({ name: '../escape', dir })).toThrow(/"name"/);
  });
});

describe('device port faults', () => {
  const dir = mkdtempSync(join(tmpdir(), 'settlescope-port-'));
  const pair = new PtyPair({ name: 'faults', dir });
  const faults = new FaultBoard();
  const device = new DevicePort({ path: pair.devicePath, serial, faults, onData: () => {}, splitGapMs: 30 }); // a gap a busy machine still sees
  let app: SerialPort;
  const chunks: Buffer[] = [];

  beforeAll(async () => {
    await pair.start();
    await device.open();
    app = new SerialPort({ path: pair.appPath, ...serial, autoOpen: false });
    await new Promise<void>((resolve, reject) => app.open((error) => (error ? reject(error) : resolve())));
    app.on('data', (chunk: Buffer) => chunks.push(chunk));
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => app.close(() => resolve()));
    await device.close();
    await pair.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  /**
   * What the application received for one send, chunk by chunk: once the bytes end with `until`, or,
   * when nothing should arrive, whatever came within 60 ms.
   */
  async function received(send: () => void, until?: string): Promise<Buffer[]> {
    chunks.length = 0;
    send();
    if (until === undefined) await sleep(60);
    else await vi.waitFor(() => expect(Buffer.concat(chunks).toString('latin1').endsWith(until)).toBe(true), { timeout: 5000, interval: 5 });
    return [...chunks];
  }

  it('passes a write through unchanged without faults', async () => {
    expect(Buffer.concat(await received(() => device.send('+001.234 mm\r\n'), '\r\n')).toString()).toBe('+001.234 mm\r\n');
  });

  it('splits a write into pieces that arrive apart', async () => {
    faults.set('split', 1);
    const got = await received(() => device.send('+001.234 mm\r\n'), '\r\n');
    faults.clear();
    expect(got.length).toBeGreaterThanOrEqual(2);
    expect(Buffer.concat(got).toString()).toBe('+001.234 mm\r\n');
  });

  it('holds a write back and sends it merged with the next one', async () => {
    faults.set('merge', 1);
    expect(await received(() => device.send('A\r\n'))).toEqual([]);
    faults.clear();
    const got = await received(() => device.send('B\r\n'), 'B\r\n');
    expect(got).toHaveLength(1);
    expect(got[0].toString()).toBe('A\r\nB\r\n');
  });

  it('prefixes garbage, and drops writes', async () => {
    faults.set('garbage', 1);
    const noisy = Buffer.concat(await received(() => device.send('C\r\n'), 'C\r\n'));
    faults.clear();
    expect(noisy.length).toBeGreaterThan(3);
    expect(noisy.subarray(-3).toString()).toBe('C\r\n');

    faults.set('drop', 1);
    const dropped = device.counts.dropped;
    expect(await received(() => device.send('D\r\n'))).toEqual([]);
    expect(device.counts.dropped).toBe(dropped + 1);
    faults.clear();
  });
});
