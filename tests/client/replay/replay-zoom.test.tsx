import { fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, requests } from '../support/fetch-stub';
import { renderWithProviders } from '../support/render';
import { stubFinishedRun, SUMMARY } from './replay-fixtures';

/** A stand-in for uPlot that keeps what the page gives it, so the tests can drive its hooks like a user's drag. */
const charts = vi.hoisted(() => [] as { opts: import('uplot').Options; data: unknown[][] }[]);
vi.mock('uplot', () => ({
  default: class {
    constructor(opts: import('uplot').Options, data: unknown[][]) {
      charts.push({ opts, data });
    }
    setData(data: unknown[][]) {
      charts[charts.length - 1].data = data;
    }
    setSize() {}
    destroy() {}
  },
}));

const { ReplayPage } = await import('../../../client/src/features/replay/components/replay-page');

afterEach(() => {
  vi.unstubAllGlobals();
  charts.length = 0;
});

type Hook = (u: unknown) => void;

describe('replay plot', () => {
  it('fetches a dragged span at full plot width, and goes back to the whole run', async () => {
    const zoomed = { ...SUMMARY, fromMs: 1_000_000, toMs: 3_000_000, bucketMs: 2_500 };
    const fetchMock = stubFinishedRun({ 'GET /api/runs/7/samples/summary?buckets=800&fromMs=1000000&toMs=3000000': json(200, zoomed) });
    renderWithProviders(<ReplayPage runId={7} />);
    await screen.findByRole('img', { name: /Mean settlement and oil pressure/ });
    const { opts } = charts[0];
    // A drag from pixel 100 to 300 on an x axis of 10 s per pixel.
    const u = { select: { left: 100, width: 200 }, posToVal: (px: number) => px * 10, setSelect: vi.fn() };
    (opts.hooks!.setSelect![0] as Hook)(u);
    await waitFor(() => expect(requests(fetchMock).map((r) => r.key)).toContain('GET /api/runs/7/samples/summary?buckets=800&fromMs=1000000&toMs=3000000'));
    // Redrawn over the zoomed span (2,000,000 ms in 2,500 ms buckets): only buckets holding data become points.
    await waitFor(() => {
      const xs = charts[0].data[0] as number[];
      expect(xs.length).toBeGreaterThan(0);
      expect(xs.every((t) => t >= 1000 && t < 3000)).toBe(true);
    });
    fireEvent.click(await screen.findByRole('button', { name: 'Whole run' }));
    await waitFor(() => expect(charts[0].data[0]).toHaveLength(2));
  });

  it('draws the cursor at the scrubbed time', async () => {
    stubFinishedRun({ 'GET /api/runs/7/readings-at?tMs=900000': json(200, { tMs: 900_000, items: [] }) });
    renderWithProviders(<ReplayPage runId={7} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Note: Kentledge settled at 0:15:00' }));
    await screen.findByRole('img', { name: /Mean settlement and oil pressure/ });
    const moveTo = vi.fn();
    const ctx = { save() {}, restore() {}, beginPath() {}, lineTo() {}, stroke() {}, moveTo };
    const u = { ctx, bbox: { left: 0, top: 0, width: 2000, height: 100 }, valToPos: (s: number) => s };
    (charts[0].opts.hooks!.draw![0] as Hook)(u);
    expect(moveTo).toHaveBeenCalledWith(900, 0); // 900 s on an axis of seconds
  });
});
