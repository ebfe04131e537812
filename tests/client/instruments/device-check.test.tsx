import { describeDeviceProblem } from '@shared/devices/problems';
import type { RigLive } from '@shared/realtime/events';
import { act, renderHook, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { type RigLiveSocket, useRigLive } from '../../../client/src/features/rigs/api/use-rig-live';
import { DeviceCheck } from '../../../client/src/features/rigs/components/device-check';
import { renderWithProviders } from '../support/render';
import { aRigLive } from './fixtures';

const card = (label: string) => screen.getByRole('article', { name: label });
const feedOf = (live: RigLive | null, connected = true) => ({ live, connected, refused: null });

describe('device check', () => {
  it('shows each channel: converted value and unit, raw, states in words, counters, calibration and age', () => {
    renderWithProviders(<DeviceCheck feed={feedOf(aRigLive(Date.now(), 12.3456))} />);
    const north = within(card('North gauge'));
    expect(screen.getByTestId('reading-g1').textContent).toBe('12.346mm');
    expect(north.getByText('24690')).toBeTruthy();
    expect(north.getByText('Good')).toBeTruthy();
    expect(north.getByText('Open')).toBeTruthy();
    expect(north.getByText('Overdue')).toBeTruthy();
    expect(north.getByText('/dev/ttyUSB0')).toBeTruthy();
    expect(within(north.getByText('Rejected').parentElement as HTMLElement).getByText('3')).toBeTruthy();
    expect(north.getByText(/^0\.\d s$/)).toBeTruthy();

    const south = within(card('South gauge'));
    expect(screen.getByTestId('reading-g2').textContent).toBe('—mm');
    expect(south.getByText('No answer (timeout)')).toBeTruthy();
    expect(south.getByText('Error')).toBeTruthy();
    expect(south.getByText(/^9\.\d s ago: stale$/)).toBeTruthy();

    const pressure = within(card('Jack oil pressure'));
    expect(screen.getByTestId('reading-p1').textContent).toBe('123.40bar');
    expect(pressure.getByText('Due soon')).toBeTruthy();
    expect(pressure.queryByRole('button', { name: 'Set display zero' })).toBeNull(); // zero is for gauges only
  });

  it('says why a channel has no good reading: the exception by code and meaning, a port that never opened, the last rejection', () => {
    const live = aRigLive(Date.now(), 1);
    const exception = describeDeviceProblem({ kind: 'exception', code: 2 });
    live.channels[2] = { ...live.channels[2], status: 'rejected', value: null, raw: null, problem: exception, lastRejection: exception };
    live.channels[1] = { ...live.channels[1], reconnects: 0, problem: describeDeviceProblem({ kind: 'port-never-opened', detail: 'No such file or directory' }) };
    renderWithProviders(<DeviceCheck feed={feedOf(live)} />);
    const pressure = within(card('Jack oil pressure'));
    expect(pressure.getByText('Frame rejected')).toBeTruthy();
    expect(screen.getByTestId('problem-p1').textContent).toMatch(/^Modbus exception 02 \(illegal data address\)/);
    expect(screen.queryByTestId('last-rejection-p1')).toBeNull(); // the same cause is said once
    expect(screen.getByTestId('problem-g2').textContent).toBe('Port never opened: No such file or directory');
    // Good readings again, the earlier CRC rejection still named; nothing called "garbled".
    expect(screen.queryByTestId('problem-g1')).toBeNull();
    expect(screen.getByTestId('last-rejection-g1').textContent).toMatch(/^CRC error/);
    expect(screen.queryByText(/garbled/i)).toBeNull();
  });

  it('shows the rig problem prominently', () => {
    renderWithProviders(<DeviceCheck feed={feedOf(aRigLive(Date.now(), 1, 'In use by run 14 at pit TP-3'))} />);
    expect(screen.getByRole('alert').textContent).toContain('In use by run 14 at pit TP-3');
  });

  it('display zero shows the movement since it was set, locally, until cleared', async () => {
    const fake = fakeSocket();
    const { user } = renderWithProviders(<LiveDeviceCheck socket={fake.socket} />);
    fake.deliver('rig:live', aRigLive(Date.now(), 12.5));
    await user.click(within(card('North gauge')).getByRole('button', { name: 'Set display zero' }));
    expect(screen.getByTestId('reading-g1').textContent).toBe('0.000mm');

    // The next picture from the server: the stem moved 0.734 mm.
    fake.deliver('rig:live', aRigLive(Date.now(), 13.234));
    const north = within(card('North gauge'));
    expect(north.getByText('Movement since display zero')).toBeTruthy();
    expect(screen.getByTestId('reading-g1').textContent).toBe('0.734mm');
    expect(north.getByText(/Reading 13\.234 mm − zero 12\.500 mm/)).toBeTruthy();
    expect(fake.sent.map((s) => s.event)).toEqual(['rig:watch']); // the zero is not sent anywhere

    await user.click(north.getByRole('button', { name: 'Clear display zero' }));
    expect(screen.getByTestId('reading-g1').textContent).toBe('13.234mm');
  });

  it('says so when the connection to the server is lost', () => {
    renderWithProviders(<DeviceCheck feed={feedOf(null, false)} />);
    expect(screen.getByText(/Not connected to the server/)).toBeTruthy();
    expect(screen.getByText('Waiting for the first readings…')).toBeTruthy();
  });
});

/** The page's composition: the live feed of rig 7 from a socket, into the device check. */
function LiveDeviceCheck({ socket }: { socket: RigLiveSocket }) {
  return <DeviceCheck feed={useRigLive(7, socket)} />;
}

/** A stand-in socket: records what the page sends and lets the test deliver server events. */
function fakeSocket(connected = true) {
  const handlers = new Map<string, Set<(...args: unknown[]) => void>>();
  const sent: { event: string; payload: unknown }[] = [];
  const socket = {
    connected,
    on(event: string, handler: (...args: unknown[]) => void) {
      if (!handlers.has(event)) handlers.set(event, new Set());
      handlers.get(event)?.add(handler);
      return socket;
    },
    off(event: string, handler: (...args: unknown[]) => void) {
      handlers.get(event)?.delete(handler);
      return socket;
    },
    emit(event: string, payload: unknown, ack?: (result: unknown) => void) {
      sent.push({ event, payload });
      ack?.({ ok: true });
      return true;
    },
  };
  const deliver = (event: string, ...args: unknown[]) =>
    act(() => {
      for (const handler of handlers.get(event) ?? []) handler(...args);
    });
  return { socket: socket as unknown as RigLiveSocket, sent, deliver, listeners: () => [...handlers.values()].reduce((n, s) => n + s.size, 0) };
}

describe('useRigLive', () => {
  it('watches the rig, keeps the latest picture of that rig only, and unwatches on leaving', () => {
    const fake = fakeSocket();
    const { result, unmount } = renderHook(() => useRigLive(7, fake.socket));
    expect(fake.sent).toEqual([{ event: 'rig:watch', payload: { rigId: 7 } }]);

    fake.deliver('rig:live', aRigLive(1000, 4.2));
    expect(result.current.live?.channels[0].value).toBe(4.2);
    fake.deliver('rig:live', { ...aRigLive(1000, 9.9), rigId: 8 }); // another page's rig
    expect(result.current.live?.channels[0].value).toBe(4.2);

    unmount();
    expect(fake.sent.at(-1)).toEqual({ event: 'rig:unwatch', payload: { rigId: 7 } });
    expect(fake.listeners()).toBe(0);
  });

  it('asks again after a reconnect and reports the gap', () => {
    const fake = fakeSocket(false);
    const { result } = renderHook(() => useRigLive(7, fake.socket));
    expect(result.current.connected).toBe(false);
    expect(fake.sent).toEqual([]);

    fake.deliver('connect');
    expect(result.current.connected).toBe(true);
    fake.deliver('disconnect');
    expect(result.current.connected).toBe(false);
    fake.deliver('connect');
    expect(fake.sent.filter((s) => s.event === 'rig:watch')).toHaveLength(2);
  });
});
