/**
 * One clock for the run core: silence on a channel is measured on monotonic time, run time follows
 * monotonic time, and wall time only anchors it. A wall clock set an hour either way or a machine
 * asleep for ten minutes raises no false signal-lost and hides no real one (virtual clock, real engine).
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { VirtualClock, virtualRig, virtualRun } from './support/virtual-run';

const HOUR = 3_600_000;

function rigRunning() {
  const clock = new VirtualClock();
  const { snapshot, rig } = virtualRig([
    { direction: 1, xMm: -100, yMm: 0 },
    { direction: 1, xMm: 100, yMm: 0 },
  ]);
  const run = virtualRun(snapshot, rig, clock);
  const channels = snapshot.channels.length;
  /** `ms` of time in 100 ms steps, every channel answering except `silent` ones. */
  const pass = async (ms: number, silent: number[] = []) => {
    for (let t = 0; t < ms; t += 100) {
      clock.advance(100);
      for (let c = 0; c < channels; c++) if (!silent.includes(c)) run.read(c, c === channels - 1 ? 2 : 1);
      await vi.advanceTimersByTimeAsync(100);
    }
  };
  const lost = () =>
    run.engine
      .view()
      .alarms.filter((a) => a.code === 'signal-lost')
      .map((a) => a.subject)
      .sort();
  return { clock, run, pass, lost };
}

describe('one clock', () => {
  beforeEach(() => vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval', 'setTimeout', 'clearTimeout'] }));
  afterEach(() => vi.useRealTimers());

  it.each([
    ['set an hour ahead', HOUR],
    ['set an hour back', -HOUR],
  ])('raises no signal-lost and keeps run time going when the wall clock is %s', async (_, stepMs) => {
    const { clock, run, pass, lost } = rigRunning();
    run.engine.start();
    await pass(1000);
    await run.command({ type: 'zero' });
    await run.command({ type: 'start' });
    await pass(3000);
    expect(lost()).toEqual([]);
    const before = run.engine.nowMs();
    clock.wallMs += stepMs; // someone sets the clock (or NTP steps it)
    await pass(5000);
    expect(lost()).toEqual([]);
    expect(run.engine.nowMs() - before).toBe(5000); // run time moved by the 5 s that passed, not by the step
    const times = run.rows.map((r) => r.tMs);
    expect(times).toEqual([...times].sort((a, b) => a - b));
  });

  it('raises no signal-lost after the machine sleeps ten minutes with the devices answering again at once', async () => {
    const { clock, run, pass, lost } = rigRunning();
    run.engine.start();
    await pass(1000);
    await run.command({ type: 'zero' });
    await run.command({ type: 'start' });
    await pass(3000);
    clock.wallMs += 10 * 60_000; // asleep: the wall clock ran on, the monotonic clock did not
    await pass(3000);
    expect(lost()).toEqual([]);
  });

  it('still raises a real one within its 2 s after a clock step or a sleep, and clears it when the device answers', async () => {
    const { clock, run, pass, lost } = rigRunning();
    run.engine.start();
    await pass(1000);
    await run.command({ type: 'zero' });
    await run.command({ type: 'start' });
    await pass(2000);
    clock.wallMs -= HOUR;
    await pass(1500, [0]); // g1 silent 1.5 s: not yet
    expect(lost()).toEqual([]);
    await pass(1500, [0]); // 3 s: lost (2 s rule; the check runs every 500 ms)
    expect(lost()).toEqual(['g1']);
    await pass(1000);
    expect(lost()).toEqual([]);
    clock.wallMs += 10 * 60_000; // a sleep, and the pressure transducer does not come back
    await pass(3000, [2]);
    expect(lost()).toEqual(['p']);
  });
});
