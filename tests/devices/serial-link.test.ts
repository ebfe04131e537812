import { SerialPortMock } from 'serialport';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { nextBackoffMs } from '../../devices/port/backoff';
import { type LinkStatus, SerialLink } from '../../devices/port/serial-link';
import { ManualClock } from './support/manual-clock';
import { MockDevice } from './support/mock-device';

describe('nextBackoffMs', () => {
  it('grows ×1.5 from 250 ms up to the 5 s cap by default', () => {
    const delays: number[] = [];
    let delay: number | undefined;
    for (let i = 0; i < 12; i++) {
      delay = nextBackoffMs(delay);
      delays.push(delay);
    }
    expect(delays.slice(0, 4)).toEqual([250, 375, 562.5, 843.75]);
    expect(delays.at(-1)).toBe(5000);
    expect(delays.every((d, i) => i === 0 || d >= delays[i - 1])).toBe(true);
  });

  it('refuses nonsense options, naming "backoff"', () => {
    expect(() => nextBackoffMs(undefined, { initialMs: 0 })).toThrow(/"backoff"/);
    expect(() => nextBackoffMs(undefined, { factor: 0.5 })).toThrow(/"backoff"/);
    expect(() => nextBackoffMs(undefined, { initialMs: 100, maxMs: 50 })).toThrow(/"backoff"/);
  });
});

describe('SerialLink over the serialport mock binding', () => {
  let link: SerialLink | undefined;
  afterEach(async () => {
    await link?.stop();
    SerialPortMock.binding.reset();
  });

  const serial = { baudRate: 4800, dataBits: 7, parity: 'even', stopBits: 1 } as const;

  function makeLink(device: MockDevice, clock?: ManualClock) {
    const statuses: LinkStatus[] = [];
    const data: string[] = [];
    link = new SerialLink({
      path: device.path,
      serial,
      clock,
      backoff: clock ? undefined : { initialMs: 10, maxMs: 40 },
      createPort: device.createPort,
      onData: (chunk) => data.push(chunk.toString('latin1')),
      onStatus: (status) => statuses.push(status),
    });
    return { link, statuses, data };
  }

  it('opens with the given serial settings and passes data through', async () => {
    const device = new MockDevice('/dev/link-settings');
    const { link, statuses, data } = makeLink(device);
    await expect(link.write('x')).rejects.toThrow(/not open/);
    link.start();
    await vi.waitFor(() => expect(link.status).toBe('open'));
    expect(device.binding.openOptions).toMatchObject({ path: '/dev/link-settings', ...serial });
    device.emit('hello');
    await vi.waitFor(() => expect(data.join('')).toBe('hello'));
    await link.write('?\r');
    expect(device.writes.map(String)).toEqual(['?\r']);
    await link.stop();
    expect(statuses).toEqual(['connecting', 'open', 'closed']);
  });

  it('retries a missing port with growing delays on the injected clock, then opens it', async () => {
    const clock = new ManualClock();
    const device = new MockDevice('/dev/link-missing');
    SerialPortMock.binding.reset(); // the port is not there yet
    const { link, statuses } = makeLink(device, clock);
    link.start();
    await vi.waitFor(() => expect(link.status).toBe('error'));
    expect(link.lastError).toMatch(/does not exist/);
    for (const delay of [250, 375, 562.5]) {
      expect(clock.requested.at(-1)).toBe(delay);
      clock.advance(delay);
      expect(link.status).toBe('connecting');
      await vi.waitFor(() => expect(link.status).toBe('error'));
    }
    device.reappear();
    clock.advance(843.75);
    await vi.waitFor(() => expect(link.status).toBe('open'));
    expect(link.reconnects).toBe(0); // a first open is not a reconnection
    expect(statuses.slice(0, 4)).toEqual(['connecting', 'error', 'connecting', 'error']);
  });

  it('notices a vanished port (disconnected close), retries from the first delay and counts the reconnection', async () => {
    const clock = new ManualClock();
    const device = new MockDevice('/dev/link-vanish');
    const { link } = makeLink(device, clock);
    link.start();
    await vi.waitFor(() => expect(link.status).toBe('open'));
    device.vanish();
    await vi.waitFor(() => expect(link.status).toBe('error'));
    expect(link.lastError).toMatch(/unplugged/);
    expect(clock.requested).toEqual([250]);
    clock.advance(250);
    await vi.waitFor(() => expect(link.status).toBe('error'));
    expect(clock.requested).toEqual([250, 375]);
    device.reappear();
    clock.advance(375);
    await vi.waitFor(() => expect(link.status).toBe('open'));
    expect(link.reconnects).toBe(1);
  });

  it('stops retrying once stopped', async () => {
    const clock = new ManualClock();
    const device = new MockDevice('/dev/link-stop');
    SerialPortMock.binding.reset();
    const { link } = makeLink(device, clock);
    link.start();
    await vi.waitFor(() => expect(link.status).toBe('error'));
    await link.stop();
    device.reappear();
    clock.advance(10_000);
    expect(link.status).toBe('closed');
    expect(device.ports).toHaveLength(1);
  });
});
