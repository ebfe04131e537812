import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { RunSummary } from '../../../client/src/features/runs/api/get-runs';
import { queueOf, ReviewQueues } from '../../../client/src/features/runs/components/review-queues';
import { renderWithProviders } from '../support/render';

function aRun(id: number, phase: RunSummary['phase'], state: RunSummary['review']['state'], interpreted: boolean): RunSummary {
  return {
    id,
    phase,
    planId: 31,
    planName: `Plan of run ${id}`,
    pitId: 'TP-4',
    projectCode: 'LD-22',
    rigName: 'Larkfield rig B',
    stageIndex: 3,
    stageCount: null,
    verdict: null,
    activeAlarms: 0,
    startedAt: '2026-03-04T08:00:00Z',
    finishedAt: '2026-03-04T12:00:00Z',
    review: { state, interpreted },
  };
}

const RUNS = [
  aRun(1, 'completed', 'draft', false),
  aRun(2, 'stopped', 'draft', true),
  aRun(3, 'completed', 'in-review', true),
  aRun(4, 'completed', 'signed', true),
  aRun(5, 'holding', 'draft', false),
];

describe('the engineer’s queues', () => {
  it('puts each finished run in the one queue that waits for it', () => {
    expect(RUNS.map(queueOf)).toEqual(['interpret', 'review', 'sign', null, null]);
  });

  it('links each waiting run to the page where its next step is done', () => {
    renderWithProviders(<ReviewQueues runs={RUNS} />);
    const interpret = screen.getByRole('region', { name: /To interpret/ });
    expect(within(interpret).getByRole('link', { name: 'Interpret: run 1' }).getAttribute('href')).toBe('/runs/1/interpretation');
    const review = screen.getByRole('region', { name: /To review/ });
    expect(within(review).getByRole('link', { name: 'Review and submit: run 2' }).getAttribute('href')).toBe('/runs/2/signoff');
    const sign = screen.getByRole('region', { name: /To sign/ });
    expect(within(sign).getByRole('link', { name: 'Sign: run 3' }).getAttribute('href')).toBe('/runs/3/signoff');
    expect(screen.queryByText(/run 4|run 5/)).toBeNull();
  });
});
