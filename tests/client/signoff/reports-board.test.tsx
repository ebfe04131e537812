import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { type ReportRow, ReportsBoard } from '../../../client/src/features/reports/components/reports-board';
import { renderWithProviders } from '../support/render';

// Invented projects and runs.
const row = (runId: number, projectCode: string, state: ReportRow['state'], interpreted = true): ReportRow => ({
  runId,
  projectCode,
  pitId: `TP-${runId}`,
  planName: `Plan ${runId}`,
  finishedAt: '2026-03-04T12:00:00Z',
  state,
  interpreted,
});
const ROWS = [row(1, 'LD-22', 'draft', false), row(2, 'LD-22', 'in-review'), row(3, 'HV-07', 'signed'), row(4, 'HV-07', 'draft')];

const runIds = () =>
  within(screen.getByRole('table'))
    .getAllByRole('row')
    .slice(1)
    .map((r) => Number(within(r).getAllByRole('cell')[0].textContent));

describe('staff reports', () => {
  it('lists drafts, reports in review and signed ones, each with its next step', () => {
    renderWithProviders(<ReportsBoard rows={ROWS} />);
    expect(runIds()).toEqual([1, 2, 3, 4]);
    expect(screen.getByText('Not interpreted yet')).toBeTruthy();
    expect(screen.getByText('Waiting for a signature')).toBeTruthy();
    // Only a signed report offers its files.
    expect(screen.getAllByRole('link', { name: 'Report (PDF)' }).map((a) => a.getAttribute('href'))).toEqual(['/api/runs/3/report.pdf']);
  });

  it('filters by state and by project', async () => {
    const { user } = renderWithProviders(<ReportsBoard rows={ROWS} />);
    await user.selectOptions(screen.getByLabelText('State'), 'draft');
    expect(runIds()).toEqual([1, 4]);
    await user.selectOptions(screen.getByLabelText('Project'), 'HV-07');
    expect(runIds()).toEqual([4]);
    await user.selectOptions(screen.getByLabelText('State'), 'in-review');
    expect(screen.getByText('No report matches')).toBeTruthy();
    // Each state's count stands in its option.
    expect(screen.getByRole('option', { name: 'Signed (1)' })).toBeTruthy();
  });
});
