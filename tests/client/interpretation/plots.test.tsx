// First: uPlot needs the canvas stubs while its module loads.
import '../runs/canvas-stubs';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import type { StagePoint } from '@shared/interpretation/reduction';
import type { TestRecord } from '@shared/records/schema';
import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { LoadSettlementCharts } from '../../../client/src/features/interpretation/components/load-settlement-charts';
import { seriesColours } from '../../../client/src/features/interpretation/components/xy-chart';
import { arithmeticPlot, branchRuns } from '../../../client/src/features/interpretation/utils/plot-data';

// The invented sand test of the fixtures (tests/fixtures/records/README.md): loaded to 600 kPa, unloaded to 300 and 0.
const record = JSON.parse(readFileSync(path.join(import.meta.dirname, '../../fixtures/records/sand-bearing-450-square.json'), 'utf8')) as TestRecord;
const analysis = analyzeRecord(record);

const point = (index: number, branch: StagePoint['branch'], pressureKpa: number, settlementMm: number): StagePoint => ({ index, branch, pressureKpa, settlementMm, gaugesMm: [], tMin: 5, cutShort: false });

describe('load–settlement curve through unloading', () => {
  it('draws the unloading branch from the peak it left', () => {
    const plot = arithmeticPlot(analysis);
    const unloading = plot.series.filter((s) => s.label === 'Unloading');
    expect(unloading).toHaveLength(1);
    const drawn = plot.x.map((q, i) => [q, unloading[0].values[i]] as const).filter(([, s]) => s !== null);
    const held = analysis.reduction.points;
    const peak = held.filter((p) => p.branch === 'loading').at(-1)!;
    const after = held.filter((p) => p.branch === 'unloading');
    // Sorted by pressure: 0 and 300 kPa of the unloading, then the 600 kPa peak it started from.
    expect(drawn).toEqual([...after.map((p) => [p.pressureKpa, p.settlementMm] as const).reverse(), [peak.pressureKpa, peak.settlementMm]]);
  });

  it('starts each cycle’s unloading at its own peak and each reloading where the unloading stopped', () => {
    const runs = branchRuns([
      point(0, 'seating', 10, 0),
      point(1, 'loading', 100, 1),
      point(2, 'loading', 200, 2),
      point(3, 'unloading', 100, 1.8),
      point(4, 'unloading', 0, 1.5),
      point(5, 'reloading', 100, 1.7),
      point(6, 'reloading', 200, 2.1),
      point(7, 'loading', 300, 3.2),
      point(8, 'unloading', 0, 2.6),
    ]);
    expect(runs).toEqual([
      { branch: 'unloading', points: [{ x: 200, y: 2 }, { x: 100, y: 1.8 }, { x: 0, y: 1.5 }] },
      { branch: 'reloading', points: [{ x: 0, y: 1.5 }, { x: 100, y: 1.7 }, { x: 200, y: 2.1 }] },
      { branch: 'unloading', points: [{ x: 300, y: 3.2 }, { x: 0, y: 2.6 }] },
    ]);
  });
});

describe('our own legend', () => {
  it('names each kind of line once, fitted lines dashed, in colour-blind-safe colours shared by lines of one kind', () => {
    const data = { x: [0, 1], series: [{ label: 'First loading', values: [0, 1] }, { label: 'Unloading', values: [1, null] }, { label: 'Unloading', values: [null, 1] }, { label: 'Hyperbola fit', values: [0, 1], fitted: true }] };
    const { colours, legend } = seriesColours(data);
    expect(legend.map((l) => l.label)).toEqual(['First loading', 'Unloading', 'Hyperbola fit (fitted)']);
    expect(legend[2].dashed).toBe(true);
    expect(colours[1]).toBe(colours[2]);
    expect(new Set([colours[0], colours[1], colours[3]]).size).toBe(3);
  });

  it('is shown under each plot in words, and the charting library’s own legend is not', () => {
    const { container } = render(<LoadSettlementCharts analysis={analysis} />);
    const legends = screen.getAllByRole('list', { name: 'Legend' });
    expect(legends).toHaveLength(2);
    expect(within(legends[0]).getAllByRole('listitem').map((li) => li.textContent)).toEqual(['First loading', 'Unloading', 'Hyperbola fit (fitted)']);
    expect(within(legends[1]).getAllByRole('listitem').map((li) => li.textContent)).toEqual(['First loading', 'Log–log line 1 (fitted)', 'Log–log line 2 (fitted)']);
    expect(container.querySelector('.u-legend')).toBeNull();
  });
});
