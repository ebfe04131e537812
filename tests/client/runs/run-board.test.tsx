import './canvas-stubs';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import type { RunSummary } from '../../../client/src/features/runs/api/get-runs';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aProject, aUser } from '../support/fixtures';
import { renderApp } from '../support/render';
import { aPrompt, aRunView } from './run-fixtures';

// The console's live link goes to a fake socket that never connects: these tests are about REST.
vi.mock('../../../client/src/lib/socket', async () => {
  const { fakeSocket } = await import('./fake-socket');
  const fake = fakeSocket();
  return { getSocket: () => fake.socket, closeSocket: () => {} };
});

const OPERATOR = aUser('operator', 'Tomás Reyes', 'tomas.reyes@example.test');

function aSummary(fields: Partial<RunSummary> & Pick<RunSummary, 'id' | 'phase'>): RunSummary {
  return {
    planId: 31,
    planName: 'TP-4 bearing test, 300 mm plate',
    pitId: 'TP-4',
    projectCode: 'LD-22',
    rigName: 'Larkfield rig B',
    stageIndex: 2,
    stageCount: 4,
    verdict: 'settling',
    activeAlarms: 0,
    startedAt: '2026-03-04T08:00:00Z',
    finishedAt: null,
    review: { state: 'draft', interpreted: false },
    ...fields,
  };
}

const common = {
  'GET /api/auth/me': json(200, { user: OPERATOR, csrfToken: 'session' }),
  'GET /api/health': json(200, { app: 'ok', database: 'ok' }),
  'GET /api/projects': json(200, { items: [aProject({ id: 3, code: 'LD-22', name: 'Depot extension' })] }),
  'GET /api/plans/ready': json(200, { items: [{ id: 44, name: 'TP-9 bearing test', pitId: 'TP-9', projectCode: 'LD-22', createdAt: '2026-03-05T08:00:00Z' }] }),
};

describe('home board of runs', () => {
  it('lists runs in progress with stage, verdict and alarms, and the finished ones below', async () => {
    stubFetch({
      ...common,
      'GET /api/runs': json(200, {
        items: [
          aSummary({ id: 12, phase: 'holding', activeAlarms: 2, pitId: 'TP-5' }),
          aSummary({ id: 11, phase: 'hold-met', verdict: 'satisfied', stageIndex: 1 }),
          aSummary({ id: 9, phase: 'completed', stageCount: null, verdict: null, finishedAt: '2026-03-02T15:00:00Z' }),
        ],
      }),
    });
    renderApp('/');

    const active = await screen.findByRole('list', { name: 'Runs in progress' });
    const cards = within(active).getAllByRole('link');
    expect(cards).toHaveLength(2);
    expect(cards[0].getAttribute('href')).toBe('/runs/12');
    expect(cards[0].textContent).toContain('Stage 3 of 4');
    expect(cards[0].textContent).toContain('Still settling');
    expect(cards[0].textContent).toContain('2 alarms not acknowledged');
    expect(cards[1].textContent).toContain('Hold satisfied');
    expect(cards[1].textContent).toContain('No alarms waiting');
    const finished = screen.getByRole('list', { name: 'Finished runs' });
    expect(within(finished).getByText('Run 9')).toBeTruthy();
    expect(within(finished).getByText('2026-03-02')).toBeTruthy();
    // An operator's next runs: plans not yet run, each one press from its set-up.
    const next = screen.getByRole('list', { name: 'Next runs' });
    expect(within(next).getByRole('link', { name: 'Set up the run of TP-9 bearing test' }).getAttribute('href')).toBe('/runs/new?planId=44');
  });

  it('sets up a run of a given plan on the chosen rig and opens its console', async () => {
    const created = aRunView({ id: 13, phase: 'preparing', stageIndex: 0, hold: null, prompt: aPrompt(0), version: 0 });
    const fetchMock = stubFetch({
      ...common,
      'GET /api/plans/31': json(200, { plan: { id: 31, name: 'TP-4 bearing test, 300 mm plate', locationId: 5 }, checks: [] }),
      'GET /api/rigs': json(200, { items: [{ id: 2, name: 'Larkfield rig B', mode: 'serial', channels: [] }] }),
      'POST /api/runs': json(201, created),
      'GET /api/runs/13': json(200, created),
      'GET /api/runs/13/events': json(200, { items: [] }),
    });
    const { router, user } = renderApp('/runs/new?planId=31');

    await screen.findByRole('link', { name: 'TP-4 bearing test, 300 mm plate' });
    await user.selectOptions(await screen.findByLabelText('Rig'), '2');
    await user.click(screen.getByRole('button', { name: 'Set up the run' }));

    await screen.findByRole('heading', { name: 'Get ready' });
    expect(router.state.location.pathname).toBe('/runs/13');
    // Run mode: the site menu folds away behind one button while the run is live.
    await waitFor(() => expect(screen.queryByRole('navigation', { name: 'Main' })).toBeNull());
    await user.click(screen.getByRole('button', { name: 'Menu' }));
    expect(within(screen.getByRole('navigation', { name: 'Main' })).getByRole('link', { name: 'Home' })).toBeTruthy();
    expect(requests(fetchMock).find((r) => r.key === 'POST /api/runs')?.body).toEqual({ planId: 31, rigId: 2 });
  });
});
