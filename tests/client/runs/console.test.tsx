import './canvas-stubs';
import { act, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, requests } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { COMMANDS, OPERATOR, renderConsole, sent, serveConsole } from './console-harness';
import { aBatch, aPrompt, aRunView, TRAVEL_ALARM } from './run-fixtures';

const ENGINEER = aUser('engineer', 'Ines Okafor', 'ines.okafor@example.test');
const KENTLEDGE_NOTE = { id: 1, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 15), kind: 'note', userId: 4, payload: { text: 'Kentledge checked' } };
const serve = (routes: Parameters<typeof serveConsole>[0] = {}, user = OPERATOR) =>
  serveConsole({ 'GET /api/runs/7/events': json(200, { items: [KENTLEDGE_NOTE] }), ...routes }, user);

describe('run console', () => {
  it('shows the numbers, the verdict with its evidence and criterion, and the prompt in the operator’s terms', async () => {
    serve();
    const prompt = aPrompt(3);
    renderConsole(aRunView({ phase: 'hold-met', hold: { ...aRunView().hold!, verdict: 'satisfied', etaMin: 0 }, prompt }));

    const readings = screen.getByRole('region', { name: 'Readings' });
    expect(within(readings).getByText('Target pressure').nextSibling?.textContent).toBe('200kPa');
    expect(within(readings).getByText('Actual pressure').nextSibling?.textContent).toBe('199.6kPa');
    expect(within(readings).getByText('Mean settlement').nextSibling?.textContent).toBe('3.42mm');
    // Tilt slope 0.0025 = 1 in 400.
    expect(within(readings).getByText('Tilt').nextSibling?.textContent).toBe('1:400');
    expect(within(readings).getByText('East gauge settlement').nextSibling?.textContent).toBe('3.04mm');
    expect(within(readings).getByText(/The test stops at a mean settlement of/).textContent).toContain('25 mm');

    const hold = screen.getByRole('region', { name: 'Hold' });
    expect(within(hold).getByRole('status').textContent).toContain('Hold satisfied');
    expect(within(hold).getByText('0.034 mm/min (limit 0.020 mm/min)')).toBeTruthy();
    expect(within(hold).getByText('12.5 min of at least 15.0 min')).toBeTruthy();
    expect(within(hold).getByText(/0.02 mm\/min is common practice for non-cohesive soil/)).toBeTruthy();

    // Prompt for 300 kPa on a 300 mm plate: F = q·πd²/4 = 300 × π × 0.15² = 21.2 kN (handbook formula);
    // the gauge figure is whatever the jack calibration gave the server, shown with its unit.
    const step = screen.getByRole('region', { name: 'Next step' });
    expect(within(step).getByText('Plate force').nextSibling?.textContent).toBe('21.2 kN');
    expect(within(step).getByText('Pump the jack gauge to').nextSibling?.textContent).toBe(`${prompt.gaugePressure?.toFixed(1)} bar`);
    expect(within(step).getByText(/Hydraulic pressure and the reaction load are hazards/)).toBeTruthy();
    expect(await screen.findByText('Kentledge checked')).toBeTruthy();
  });

  it('applies the next stage quoting the version it was decided on, and takes the answer', async () => {
    const fetchMock = serve({
      [COMMANDS]: json(200, aRunView({ phase: 'pumping', stageIndex: 3, version: 43, prompt: aPrompt(3), hold: null })),
    });
    const { user } = renderConsole(aRunView({ phase: 'hold-met', prompt: aPrompt(3) }));

    await user.click(screen.getByRole('button', { name: 'Apply next stage' }));

    await screen.findByText('Stage 4 of 4 · Loading 300 kPa');
    const [command] = sent(fetchMock);
    expect(command.body).toEqual({ version: 42, command: { type: 'advance' } });
    // The CSRF token handed out with the session check.
    expect(command.headers['x-csrf-token']).toBe('session-token');
  });

  it('shows the server’s reason for refusing a stale command and refreshes the view', async () => {
    const fetchMock = serve({
      [COMMANDS]: json(409, { error: { code: 'command_conflict', message: 'The run is at version 44; you acted on 42' } }),
      'GET /api/runs/7': json(200, aRunView({ version: 44, controller: { id: 99, name: 'Ines Okafor' } })),
    });
    const { user } = renderConsole(aRunView());

    await user.click(screen.getByRole('button', { name: 'Top up recorded' }));

    expect((await screen.findByRole('alert')).textContent).toContain('The run is at version 44; you acted on 42');
    // The fresh view arrived: someone else now commands, so this station is offered control.
    expect(await screen.findByRole('button', { name: 'Take control' })).toBeTruthy();
    expect(requests(fetchMock).some((r) => r.key === 'GET /api/runs/7')).toBe(true);
  });

  it('offers no control of a closed run, only its record', async () => {
    serve();
    renderConsole(aRunView({ phase: 'completed', controller: { id: 99, name: 'Ines Okafor' }, alarms: [TRAVEL_ALARM] }));
    expect(await screen.findByText('Ines Okafor')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Take control' })).toBeNull();
    expect(screen.queryByRole('form', { name: 'Add a note' })).toBeNull();
    // An alarm that stood at the close is shown as it was, with nothing left to do about it.
    const alarms = screen.getByRole('region', { name: /Alarms/ });
    expect(within(alarms).getByText(/1 standing when the run closed/)).toBeTruthy();
    expect(within(alarms).queryByRole('button')).toBeNull();
  });

  it('asks for a reason before applying the next stage while the hold is not met', async () => {
    const fetchMock = serve({ [COMMANDS]: json(200, aRunView({ version: 43, phase: 'pumping', stageIndex: 3 })) });
    const { user } = renderConsole(aRunView());
    expect(screen.queryByRole('button', { name: 'Apply next stage' })).toBeNull();

    await user.keyboard('a'); // the shortcut opens the reason form
    await user.type(screen.getByLabelText(/Why apply the next stage now/), 'Pump seal weeping; engineer agreed');
    await user.click(screen.getByRole('button', { name: 'Apply next stage now' }));

    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'advance', reason: 'Pump seal weeping; engineer agreed' } });
  });

  it('answers the T shortcut, but not while the operator types a note', async () => {
    const fetchMock = serve({ [COMMANDS]: json(200, aRunView({ version: 43 })) });
    const { user } = renderConsole(aRunView());

    await user.type(screen.getByLabelText('Note (N)'), 'tt');
    expect(sent(fetchMock)).toHaveLength(0);
    await user.click(screen.getByRole('heading', { name: 'Readings' }));
    await user.keyboard('t');
    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'top-up' } });
  });

  it('sends a note about the weather marked as such, and shows it so in the log', async () => {
    const fetchMock = serve({
      [COMMANDS]: json(200, aRunView({ version: 43 })),
      'GET /api/runs/7/events': json(200, {
        items: [{ id: 2, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 20), kind: 'note', userId: 4, payload: { text: 'Light rain', topic: 'weather' } }],
      }),
    });
    const { user } = renderConsole(aRunView());
    await user.type(screen.getByLabelText('Note (N)'), 'Light rain');
    await user.click(screen.getByLabelText(/About the weather/));
    await user.click(screen.getByRole('button', { name: 'Add note' }));
    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'note', text: 'Light rain', topic: 'weather' } });
    const log = await screen.findByRole('list', { name: 'Run log' });
    await waitFor(() => expect(within(log).getByText('Weather')).toBeTruthy());
  });

  it('acknowledges and shelves an alarm by its key', async () => {
    const acknowledged = { ...TRAVEL_ALARM, state: 'acknowledged' as const };
    const fetchMock = serve({
      [COMMANDS]: [
        json(200, aRunView({ version: 43, alarms: [acknowledged] })),
        json(200, aRunView({ version: 44, alarms: [{ ...acknowledged, state: 'shelved', shelvedUntilMs: Date.now() + 1_800_000 }] })),
      ],
    });
    const { user } = renderConsole(aRunView({ alarms: [TRAVEL_ALARM] }));
    const alarms = screen.getByRole('region', { name: /Alarms/ });
    expect(within(alarms).getByText(/1 not acknowledged/)).toBeTruthy();

    await user.click(within(alarms).getByRole('button', { name: `Acknowledge: ${TRAVEL_ALARM.alarm.message}` }));
    await within(alarms).findByText(/0 not acknowledged/);
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'acknowledge-alarm', key: 'gauge-travel:g2' } });

    await user.click(within(alarms).getByRole('button', { name: `Shelve: ${TRAVEL_ALARM.alarm.message}` }));
    const minutes = within(alarms).getByLabelText('Shelve for');
    await user.clear(minutes);
    await user.type(minutes, '45');
    await user.type(within(alarms).getByLabelText('Reason for shelving'), 'Reset planned after this reading');
    await user.click(within(alarms).getByRole('button', { name: 'Shelve alarm' }));
    await within(alarms).findByText(/^Shelved until/);
    expect(sent(fetchMock)[1].body).toEqual({
      version: 43,
      command: { type: 'shelve-alarm', key: 'gauge-travel:g2', minutes: 45, reason: 'Reset planned after this reading' },
    });
  });

  it('guides a gauge reset: the live reading before, the re-seated reading after', async () => {
    const fetchMock = serve({ [COMMANDS]: json(200, aRunView({ version: 44 })) });
    const { user, store } = renderConsole(aRunView());

    await user.click(screen.getByRole('button', { name: 'Reset a gauge…' }));
    const dialog = screen.getByRole('dialog', { name: 'Reset a gauge' });
    await user.selectOptions(within(dialog).getByLabelText('Gauge to reset'), 'g2');
    expect(within(dialog).getByLabelText('Before reading').textContent).toBe('23.410');
    await user.click(within(dialog).getByRole('button', { name: 'Keep as before, I will re-seat it' }));

    // The operator re-seats the stem: the next view carries the new reading.
    const view = aRunView({ version: 43 });
    act(() => store.setView({ ...view, live: { ...view.live, gauges: [view.live.gauges[0], { ...view.live.gauges[1], readingMm: 2.05 }] } }));
    expect(within(dialog).getByLabelText('After reading').textContent).toBe('2.050');
    await user.click(within(dialog).getByRole('button', { name: 'Confirm after reading' }));

    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 43, command: { type: 'gauge-reset', channel: 'g2', beforeMm: 23.41, afterMm: 2.05 } });
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
  });

  it('holds the start until an engineer accepts an overdue calibration with a reason', async () => {
    const preparing = aRunView({ phase: 'preparing', stageIndex: 0, hold: null, prompt: aPrompt(0), overdueInstruments: ['Jack J-2 (due 2026-01-10)'] });
    serve();
    renderConsole(preparing);
    expect((screen.getByRole('button', { name: 'Start (seating)' }) as HTMLButtonElement).disabled).toBe(true);
    expect(screen.getByText('An engineer must accept this, with a reason, before the run can start.')).toBeTruthy();
  });

  it('lets an engineer accept an overdue calibration', async () => {
    const preparing = aRunView({ phase: 'preparing', stageIndex: 0, hold: null, prompt: aPrompt(0), overdueInstruments: ['Jack J-2'] });
    const fetchMock = serve(
      {
        [COMMANDS]: json(200, {
          ...preparing,
          version: 43,
          calibrationOverride: { by: 'Ines Okafor', reason: 'Spare jack verified against the load cell', atMs: 1 },
        }),
        // The gauges are zeroed: the calibration is all Start waits for.
        'GET /api/runs/7/events': json(200, { items: [{ id: 2, runId: 7, atMs: Date.UTC(2026, 2, 4, 9, 10), kind: 'gauges-zeroed', userId: 4, payload: {} }] }),
      },
      ENGINEER,
    );
    const { user } = renderConsole(preparing);

    await user.click(await screen.findByRole('button', { name: 'Accept with a reason…' }));
    await user.type(screen.getByLabelText(/Why may this run use an instrument/), 'Spare jack verified against the load cell');
    await user.click(screen.getByRole('button', { name: 'Accept with this reason' }));

    await screen.findByText(/Accepted by Ines Okafor/);
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'accept-overdue', reason: 'Spare jack verified against the load cell' } });
    expect((screen.getByRole('button', { name: 'Start (seating)' }) as HTMLButtonElement).disabled).toBe(false);
  });

  it('takes manual readings for every gauge, with the schedule in view', async () => {
    const manual = aRunView({
      manual: true,
      nextReading: { atMin: 16, inMin: 3.5 },
      readingFlags: [{ dueAtMin: 9, status: 'missing', takenAtMin: null, lateByMin: 3.5 }],
    });
    const fetchMock = serve({ [COMMANDS]: json(200, { ...manual, version: 43 }) });
    const { user } = renderConsole(manual);
    const panel = screen.getByRole('region', { name: 'Readings by hand' });
    expect(within(panel).getByRole('status').textContent).toContain('16.0 min');
    expect(within(panel).getByRole('status').textContent).toContain('in 3.5 min');
    expect(within(panel).getByRole('list', { name: 'Late and missing readings' }).textContent).toContain('Reading due at 9.0 min is missing');

    await user.type(within(panel).getByLabelText('West gauge reading'), '13.81');
    await user.type(within(panel).getByLabelText('East gauge reading'), '23.40');
    await user.type(within(panel).getByLabelText('Pressure (optional)'), '200');
    await user.click(within(panel).getByRole('button', { name: 'Record readings' }));

    await waitFor(() => expect(sent(fetchMock)).toHaveLength(1));
    expect(sent(fetchMock)[0].body).toEqual({ version: 42, command: { type: 'manual-reading', pressureKpa: 200, gauges: { g1: 13.81, g2: 23.4 } } });
  });

  it('draws the plots from the live feed without re-rendering the page per sample', async () => {
    serve();
    const { store } = renderConsole(aRunView({ lastSeq: 1500 })); // a view that covers the samples: they are measured as they come
    await screen.findByRole('img', { name: 'Mean settlement against time in the current stage' });
    const views = store.getSnapshot();
    act(() =>
      store.ingest(aBatch(Array.from({ length: 500 }, (_, i) => [1001 + i, 3_600_000 + i * 100, i % 2, 13_800 + i] as [number, number, number, number]))),
    );
    // Samples changed the columns, not the snapshot React reads.
    expect(store.getSnapshot()).toBe(views);
    expect(store.series.length).toBe(500);
  });
});
