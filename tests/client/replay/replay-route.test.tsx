import '../runs/canvas-stubs';
import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { RunBoard } from '../../../client/src/features/runs/components/run-board';
import { renderApp, renderWithProviders } from '../support/render';
import { stubFinishedRun } from './replay-fixtures';

afterEach(() => vi.unstubAllGlobals());

describe('replay address', () => {
  it('is linked from each finished run on the run board', () => {
    renderWithProviders(
      <RunBoard
        runs={[{ id: 7, phase: 'completed', planId: 31, planName: 'TP-4 bearing test', pitId: 'TP-4', projectCode: 'LD-22', rigName: 'Larkfield rig B', stageIndex: 3, stageCount: 4, verdict: null, activeAlarms: 0, startedAt: '2026-03-04T08:00:00Z', finishedAt: '2026-03-04T09:00:00Z', review: { state: 'draft', interpreted: true } }]}
      />,
    );
    const finished = screen.getByRole('list', { name: 'Finished runs' });
    expect(within(finished).getByRole('link', { name: 'Replay' }).getAttribute('href')).toBe('/runs/7/replay');
  });

  it('opens the replay page at /runs/:runId/replay', async () => {
    stubFinishedRun({ 'GET /api/health': new Response(JSON.stringify({ app: 'ok', database: 'ok' }), { status: 200 }) });
    renderApp('/runs/7/replay');
    expect(await screen.findByRole('heading', { name: 'Replay of run 7' })).toBeTruthy();
    expect(await screen.findByRole('slider', { name: 'Replay time' })).toBeTruthy();
  });
});
