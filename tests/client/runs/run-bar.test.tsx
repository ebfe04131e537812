import './canvas-stubs';
import { act, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { holdMinutesLeft } from '../../../client/src/features/runs/components/run-bar';
import { formatCountdown, formatTilt, tiltIsLevel } from '../../../client/src/features/runs/utils/run-format';
import { json } from '../support/fetch-stub';
import { COMMANDS, renderConsole, sent, serveConsole } from './console-harness';
import { aPrompt, aRunView, SETTLING_HOLD, TRAVEL_ALARM } from './run-fixtures';

const serve = (routes: Parameters<typeof serveConsole>[0] = {}, events: unknown[] = []) => serveConsole(routes, undefined, events);
/** The figure under a label (a label may hold a phone's shorter wording beside it). */
const figure = (bar: HTMLElement, label: string) => [...bar.querySelectorAll('dt')].find((dt) => dt.textContent?.includes(label))?.nextSibling?.textContent;

afterEach(() => vi.unstubAllGlobals());

describe('the pinned run bar', () => {
  it('holds phase, stage n of N, actual against target, the pressure to pump to, the countdown and the one main action', async () => {
    serve();
    renderConsole(aRunView({ phase: 'hold-met', prompt: aPrompt(3), hold: { ...SETTLING_HOLD, verdict: 'satisfied' } }));
    const bar = screen.getByRole('region', { name: 'Run status' });
    expect(within(bar).getByText('Hold met')).toBeTruthy();
    expect(within(bar).getByText('Stage 3 of 4 · Loading 200 kPa')).toBeTruthy();
    expect(figure(bar, 'Actual kPa')).toBe('199.6');
    expect(figure(bar, 'Target kPa')).toBe('200');
    // 300 kPa on a 300 mm plate through an 80 mm ram: F = q·A = 300 × π·0.15² = 21.2 kN; p = F / (π·0.04²) = 42.2 bar (hydraulics, p = F/A).
    expect(figure(bar, 'Next: pump to bar')).toBe('42.2');
    expect(figure(bar, 'Hold: time left')).toBe('0:00');
    expect(within(bar).getByRole('button', { name: 'Apply next stage' })).toBeTruthy();
    // The main action is in the bar only, not repeated below.
    expect(screen.getAllByRole('button', { name: 'Apply next stage' })).toHaveLength(1);
  });

  it('makes zeroing the main action before the start, and the start once zeroed', async () => {
    const preparing = aRunView({ phase: 'preparing', stageIndex: 0, hold: null, prompt: aPrompt(0) });
    const zeroedLog = [{ id: 3, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 10), kind: 'gauges-zeroed', userId: 4, payload: {} }];
    const fetchMock = serve({
      [COMMANDS]: json(200, { ...preparing, version: 43 }),
      'GET /api/runs/7/events': [json(200, { items: [] }), json(200, { items: zeroedLog })],
    });
    const { user } = renderConsole(preparing);
    const bar = screen.getByRole('region', { name: 'Run status' });
    await user.click(await within(bar).findByRole('button', { name: 'Zero gauges' }));
    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'zero' } });
    // The log now holds the zeroing: Start takes the bar, and zeroing again moves to the panel.
    expect(((await within(bar).findByRole('button', { name: 'Start (seating)' })) as HTMLButtonElement).disabled).toBe(false);
    expect(screen.getByRole('button', { name: 'Zero the gauges again' })).toBeTruthy();
  });

  it('counts the hold down from what its rule judged', () => {
    // Rate rule: at least 15 min held, 12.5 min so far, rate expected to pass in 4.2 min → 4.2 min left.
    expect(holdMinutesLeft(SETTLING_HOLD)).toBeCloseTo(4.2, 9);
    expect(holdMinutesLeft({ ...SETTLING_HOLD, etaMin: 1 })).toBeCloseTo(2.5, 9);
    expect(holdMinutesLeft({ ...SETTLING_HOLD, verdict: 'satisfied' })).toBe(0);
    expect(holdMinutesLeft(null)).toBeNull();
    expect(formatCountdown(4.2)).toBe('4:12');
    expect(formatCountdown(61.5)).toBe('1:01:30');
    expect(formatCountdown(null)).toBe('—');
  });

  it('says what comes next while holding, not that no stage is planned', () => {
    serve();
    renderConsole(aRunView({ phase: 'holding', stageIndex: 1, prompt: null }));
    const step = screen.getByRole('region', { name: 'Next step' });
    expect(within(step).getByText('Then stage 3 of 4 · Loading 200 kPa, once this hold is met.')).toBeTruthy();
    expect(within(step).queryByText(/No further stage/)).toBeNull();
  });

  it('raises a banner for an unacknowledged alarm at once, sounds it, and acknowledges it by its key', async () => {
    const started: number[] = [];
    class FakeAudioContext {
      state = 'running';
      currentTime = 0;
      destination = {};
      createOscillator() {
        return { type: '', frequency: { value: 0 }, connect: (n: unknown) => n, start: (t: number) => started.push(t), stop: () => {} };
      }
      createGain() {
        return { gain: { setValueAtTime: () => {} }, connect: (n: unknown) => n };
      }
      resume() {
        return Promise.resolve();
      }
    }
    vi.stubGlobal('AudioContext', FakeAudioContext);
    const vibrate = vi.fn();
    Object.defineProperty(navigator, 'vibrate', { value: vibrate, configurable: true });
    const acknowledged = { ...TRAVEL_ALARM, state: 'acknowledged' as const };
    const fetchMock = serve({ [COMMANDS]: json(200, aRunView({ version: 43, alarms: [acknowledged] })) });
    const { store, user } = renderConsole(aRunView());
    expect(screen.queryByRole('alert')).toBeNull();
    expect(started).toHaveLength(0);

    act(() => store.setView(aRunView({ version: 42, alarms: [TRAVEL_ALARM] })));
    const banner = screen.getByTestId('alarm-banner');
    expect(banner.textContent).toContain(TRAVEL_ALARM.alarm.message);
    expect(started.length).toBeGreaterThan(0);
    expect(vibrate).toHaveBeenCalledTimes(1);

    await user.click(within(banner).getByRole('button', { name: `Acknowledge alarm: ${TRAVEL_ALARM.alarm.message}` }));
    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'acknowledge-alarm', key: 'gauge-travel:g2' } });
    await waitFor(() => expect(screen.queryByTestId('alarm-banner')).toBeNull());
  });

  it('asks before finishing the test', async () => {
    const fetchMock = serve({ [COMMANDS]: json(200, aRunView({ phase: 'completed', stageIndex: 3, version: 43 })) });
    const { user } = renderConsole(aRunView({ phase: 'hold-met', stageIndex: 3, prompt: null }));
    await user.click(screen.getByRole('button', { name: 'Finish…' }));
    expect(sent(fetchMock)).toHaveLength(0);
    await user.click(screen.getByRole('button', { name: 'Keep going' }));
    expect(sent(fetchMock)).toHaveLength(0);
    await user.click(screen.getByRole('button', { name: 'Finish…' }));
    await user.click(screen.getByRole('button', { name: 'Yes, finish' }));
    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'finish' } });
  });

  it('offers replay, interpretation and submission once the run is closed', async () => {
    serve();
    renderConsole(aRunView({ phase: 'completed', closedReason: 'all stages done', stageIndex: 3 }));
    const next = screen.getByRole('navigation', { name: 'After the run' });
    expect(within(next).getByRole('link', { name: 'Replay the run' }).getAttribute('href')).toBe('/runs/7/replay');
    expect(within(next).getByRole('link', { name: 'Interpret the results' }).getAttribute('href')).toBe('/runs/7/interpretation');
    expect(within(next).getByRole('link', { name: 'Submit for review' }).getAttribute('href')).toBe('/runs/7/signoff');
  });

  it('writes the log in words, with figures in their unit’s precision', async () => {
    serve({}, [
      { id: 1, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 15), kind: 'run-started', userId: 4, payload: { stageIndex: 0, targetKpa: 7.07355302630646 } },
      { id: 2, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 16), kind: 'alarm-acknowledge', userId: 4, payload: { key: 'signal-lost:g1' } },
    ]);
    renderConsole(aRunView());
    const log = await screen.findByRole('list', { name: 'Run log' });
    await within(log).findByText('Run started');
    expect(log.textContent).toContain('Stage 1 (seating) to 7.1 kPa');
    expect(log.textContent).toContain('Alarm acknowledged');
    expect(log.textContent).toContain('Signal lost (g1)');
    expect(log.textContent).not.toMatch(/alarm-acknowledge|run-started|7\.07/);
  });
});

describe('tilt in words', () => {
  it('keeps "level" inside a deadband rather than flipping to a huge ratio', () => {
    // Gauge noise of ±0.005 mm over 300 mm gives slopes around 1:20 000–1:60 000: level.
    expect(formatTilt(1 / 19_554)).toBe('level');
    expect(formatTilt(1 / 400)).toBe('1:400');
    expect(formatTilt(-1 / 1234)).toBe('1:1200');
    // Between the thresholds it stays where it was.
    expect(tiltIsLevel(1 / 1000, true)).toBe(true);
    expect(tiltIsLevel(1 / 1000, false)).toBe(false);
    expect(tiltIsLevel(1 / 700, true)).toBe(false);
  });
});
