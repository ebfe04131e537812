import './canvas-stubs';
import { screen, within } from '@testing-library/react';
import { nextStepPrompt } from '@shared/hold/next-step';
import { describe, expect, it } from 'vitest';
import { json } from '../support/fetch-stub';
import { COMMANDS, renderConsole, sent, serveConsole } from './console-harness';
import { aPrompt, aRunView } from './run-fixtures';

// The next stage needs 63.1 MPa where the jack calibration is valid to 50 MPa (invented figures).
const refusedPrompt = nextStepPrompt({
  stage: { index: 3, branch: 'loading', targetKpa: 300 },
  plate: { shape: 'circular', sizeMm: 300 },
  gaugePressureFor: () => ({ pressure: null, refusal: { reason: 'above-calibration', needed: 631.4, limit: 500, detail: null } }),
  gaugeUnit: 'bar',
});

describe('going to unloading from the console', () => {
  it('offers going to unloading instead of a next stage the jack must not reach, with that reason chosen', async () => {
    const fetchMock = serveConsole({
      'GET /api/runs/7/events': json(200, { items: [] }),
      [COMMANDS]: json(200, aRunView({ phase: 'pumping', stageIndex: 3, version: 43, prompt: null, hold: null })),
    });
    const { user } = renderConsole(aRunView({ phase: 'hold-met', prompt: refusedPrompt }));

    const step = screen.getByRole('region', { name: 'Next step' });
    expect(within(step).getByRole('alert').textContent).toContain('Go to unloading from here, or use a larger jack.');
    expect(screen.queryByRole('button', { name: /Apply next stage/ })).toBeNull();

    await user.click(within(step).getByRole('button', { name: 'Go to unloading…' }));
    const form = screen.getByRole('form', { name: 'Go to unloading' });
    expect((within(form).getByLabelText('Why') as HTMLSelectElement).value).toBe('jack-limit');
    // Nothing is sent before the confirmation.
    expect(sent(fetchMock)).toHaveLength(0);
    await user.click(within(form).getByRole('button', { name: 'Go to unloading' }));

    await screen.findByText(/Stage 4 of 4/);
    expect(sent(fetchMock).map((c) => c.body)).toEqual([{ version: 42, command: { type: 'unload', reason: 'jack-limit' } }]);
  });

  it('at a loading stage offers both, and sends the reason and note chosen', async () => {
    const fetchMock = serveConsole({
      'GET /api/runs/7/events': json(200, { items: [] }),
      [COMMANDS]: json(200, aRunView({ phase: 'pumping', stageIndex: 3, version: 43, prompt: null, hold: null })),
    });
    const { user } = renderConsole(aRunView({ phase: 'hold-met', prompt: aPrompt(3) }));

    expect(screen.getAllByRole('button', { name: /Apply next stage/ }).length).toBeGreaterThan(0);
    await user.click(screen.getByRole('button', { name: 'Go to unloading…' }));
    const form = screen.getByRole('form', { name: 'Go to unloading' });
    await user.selectOptions(within(form).getByLabelText('Why'), 'failure');
    await user.type(within(form).getByLabelText('Note (optional)'), 'Plate punching in');
    await user.click(within(form).getByRole('button', { name: 'Go to unloading' }));

    await screen.findByText(/Stage 4 of 4/);
    expect(sent(fetchMock).map((c) => c.body)).toEqual([{ version: 42, command: { type: 'unload', reason: 'failure', note: 'Plate punching in' } }]);
  });

  it('is not offered in the seating stage', () => {
    serveConsole({ 'GET /api/runs/7/events': json(200, { items: [] }) });
    renderConsole(aRunView({ phase: 'hold-met', stageIndex: 0, prompt: aPrompt(1) }));
    expect(screen.queryByRole('button', { name: 'Go to unloading…' })).toBeNull();
  });
});
