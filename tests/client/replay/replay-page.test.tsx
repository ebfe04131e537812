// First: uPlot needs the canvas stubs while its module loads.
import '../runs/canvas-stubs';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ReplayPage } from '../../../client/src/features/replay/components/replay-page';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';
import { FINISHED_VIEW, stubFinishedRun } from './replay-fixtures';

afterEach(() => vi.unstubAllGlobals());

const scrubTo = async (ms: number) => fireEvent.change(await screen.findByRole('slider', { name: 'Replay time' }), { target: { value: String(ms) } });

describe('replay page', () => {
  it('marks the stages, events and alarms on the timeline', async () => {
    stubFinishedRun();
    renderWithProviders(<ReplayPage runId={7} />);
    const stages = await screen.findByRole('list', { name: 'Stages' });
    expect(within(stages).getAllByRole('listitem').map((li) => li.getAttribute('aria-label'))).toEqual([
      'Stage 1, target 7 kPa, from 0:00:00',
      'Stage 2, target 100 kPa, from 0:10:00',
      'Stage 3, target 200 kPa, from 0:33:20',
    ]);
    const marks = screen.getByRole('list', { name: 'Events' });
    expect(within(marks).getByRole('button', { name: 'Note: Kentledge settled at 0:15:00' })).toBeTruthy();
    expect(within(marks).queryByRole('button', { name: /Alarm/ })).toBeNull(); // alarms are episodes, not marks
    // The alarm raised at 20 min never cleared: its band runs from its raise to the end of the run (1 h).
    const band = within(screen.getByRole('list', { name: 'Alarm episodes' })).getByRole('button', { name: 'Alarm: Gauge travel low from 0:20:00 still standing' });
    expect(band.className).toContain('bg-alarm-700');
    const item = band.closest('li') as HTMLElement;
    expect(Number.parseFloat(item.style.left)).toBeCloseTo(33.333, 2); // 20 min of the run's 1 h
    expect(Number.parseFloat(item.style.width.replace('calc(', ''))).toBeCloseTo(66.667, 2);
    expect(screen.getByRole('img', { name: /Mean settlement and oil pressure over the run/ })).toBeTruthy();
  });

  it('shows the stage, readings and events as they stood at the scrubbed time', async () => {
    stubFinishedRun();
    renderWithProviders(<ReplayPage runId={7} />);
    await scrubTo(1_500_000);
    const state = screen.getByRole('region', { name: 'State at the replay time' });
    expect(within(state).getByText('Target (holding)').nextSibling?.textContent).toBe('100kPa');
    // g1: +1 × 12.00 − 10.00 = 2.00 mm; g2: −1 × 24.45 + 26.45 = 2.00 mm.
    await waitFor(() => expect(within(state).getByText('Mean settlement').nextSibling?.textContent).toBe('2.00mm'));
    expect(within(state).getByText('Oil pressure').nextSibling?.textContent).toBe('14.50bar');
    const log = within(state).getByRole('list', { name: 'Events so far' });
    expect(within(log).getByText('Note: Kentledge settled')).toBeTruthy();
    expect(within(log).getByText('Alarm raised: Gauge travel low')).toBeTruthy();
    expect(within(log).queryByText('Run completed')).toBeNull();
  });

  it('jumps to an event from its mark', async () => {
    stubFinishedRun({ 'GET /api/runs/7/readings-at?tMs=900000': json(200, { tMs: 900_000, items: [] }) });
    renderWithProviders(<ReplayPage runId={7} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Note: Kentledge settled at 0:15:00' }));
    expect((screen.getByRole('slider', { name: 'Replay time' }) as HTMLInputElement).value).toBe('900000');
  });

  it('posts a correction with its reason and lists it', async () => {
    const correction = { id: 1, seq: 451, channel: 1, tMs: 1_499_000, action: 'mark-faulty', originalValue: 24_450, newValue: null, reason: 'Gauge knocked by the crew', userName: 'Ines Okafor', at: '2026-03-02T10:15:00.000Z' };
    const fetchMock = stubFinishedRun({
      'GET /api/runs/7/corrections': [json(200, { items: [] }), json(200, { items: [correction] })],
      'POST /api/runs/7/corrections': json(201, correction),
    });
    const { user } = renderWithProviders(<ReplayPage runId={7} />);
    await scrubTo(1_500_000);
    const form = await screen.findByRole('form', { name: 'Correct a reading' });
    await user.selectOptions(within(form).getByLabelText(/Reading at the replay time/), '451');
    // An automatic (not typed) run: a reading can only be marked faulty.
    expect((within(form).getByLabelText('Correct a typed gauge reading') as HTMLInputElement).disabled).toBe(true);
    await user.type(within(form).getByLabelText(/Reason/), 'Gauge knocked by the crew');
    await user.click(within(form).getByRole('button', { name: 'Record correction' }));
    await waitFor(() => expect(requests(fetchMock).find((r) => r.key === 'POST /api/runs/7/corrections')?.body).toEqual({ seq: 451, action: 'mark-faulty', reason: 'Gauge knocked by the crew' }));
    const table = await screen.findByRole('table', { name: 'Corrections' });
    expect(within(table).getByText('Gauge knocked by the crew')).toBeTruthy();
    expect(within(table).getByText('faulty (left out)')).toBeTruthy();
  });

  it('corrects the value of a typed gauge reading', async () => {
    const fetchMock = stubFinishedRun({ 'POST /api/runs/7/corrections': json(201, {}) }, { ...FINISHED_VIEW, manual: true });
    const { user } = renderWithProviders(<ReplayPage runId={7} />);
    await scrubTo(1_500_000);
    const form = await screen.findByRole('form', { name: 'Correct a reading' });
    await user.selectOptions(within(form).getByLabelText(/Reading at the replay time/), '450');
    await user.click(within(form).getByLabelText('Correct a typed gauge reading'));
    await user.type(within(form).getByLabelText(/Reading it should have been/), '12.35');
    await user.type(within(form).getByLabelText(/Reason/), 'Typed 12.00 for 12.35 (field sheet)');
    await user.click(within(form).getByRole('button', { name: 'Record correction' }));
    await waitFor(() =>
      expect(requests(fetchMock).find((r) => r.key === 'POST /api/runs/7/corrections')?.body).toEqual({ seq: 450, action: 'correct-value', valueMm: 12.35, reason: 'Typed 12.00 for 12.35 (field sheet)' }),
    );
  });

  it('says so when a run has no recorded samples, and links to its interpretation', async () => {
    stubFetch({
      'GET /api/auth/me': json(200, { user: null, csrfToken: 'token-1' }),
      'GET /api/runs/8': json(404, { error: { code: 'not_found', message: 'Run not found.' } }),
      'GET /api/runs/8/events': json(200, { items: [] }),
      'GET /api/runs/8/samples/summary?buckets=1': json(200, { runId: 8, fromMs: 0, toMs: 1, bucketMs: 1, channels: [] }),
      'GET /api/runs/8/samples/summary?buckets=800': json(200, { runId: 8, fromMs: 0, toMs: 1, bucketMs: 1, channels: [] }),
    });
    renderWithProviders(<ReplayPage runId={8} />);
    expect(await screen.findByText('No recorded samples')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Open its interpretation' }).getAttribute('href')).toBe('/runs/8/interpretation');
  });
});
