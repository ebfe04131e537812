// First: uPlot reads canvas, Path2D and matchMedia while its module loads, which jsdom lacks (see canvas-stubs).
import '../runs/canvas-stubs';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import type { TestRecord } from '@shared/records/schema';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { InterpretationPage } from '../../../client/src/features/interpretation/components/interpretation-page';
import { arithmeticPlot, logLogPlot } from '../../../client/src/features/interpretation/utils/plot-data';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { renderWithProviders } from '../support/render';

// The invented sand test of the fixtures (tests/fixtures/records/README.md).
const record = JSON.parse(readFileSync(path.join(import.meta.dirname, '../../fixtures/records/sand-bearing-450-square.json'), 'utf8')) as TestRecord;
const analysis = JSON.parse(JSON.stringify(analyzeRecord(record)));
const modulusRecord = JSON.parse(readFileSync(path.join(import.meta.dirname, '../../fixtures/records/modulus-two-cycle-300.json'), 'utf8')) as TestRecord;
const ENGINEER = aUser('engineer', 'Mira Castellane', 'mira@example.test');
const OPERATOR = aUser('operator', 'Tobin Reyes', 'tobin@example.test');

function stubRun(user = ENGINEER, versions: unknown[][] = [[]], answer: unknown = analysis) {
  return stubFetch({
    'GET /api/auth/me': json(200, { user, csrfToken: 'token-1' }),
    'GET /api/runs/7/interpretation': json(200, answer),
    'GET /api/runs/7/interpretations': versions.map((items) => json(200, { items })),
    'POST /api/runs/7/interpretations': json(201, { id: 31, runId: 7, version: 1 }),
  });
}

describe('interpretation page', () => {
  it('shows every ultimate method side by side with its value, fit, formula and source', async () => {
    stubRun();
    renderWithProviders(<InterpretationPage runId={7} record={record} />);
    const table = await screen.findByRole('table', { name: 'Ultimate-pressure methods' });
    const methods = analysis.ultimate.result as { label: string; qUltKpa: number | null; formula: string; source: string }[];
    expect(methods.length).toBeGreaterThanOrEqual(4);
    for (const m of methods) {
      const row = within(table).getByText(m.label).closest('tr') as HTMLElement;
      expect(within(row).getAllByRole('cell')[1].textContent).toBe(m.qUltKpa === null ? '—' : `${m.qUltKpa.toFixed(1)} kPa`);
      expect(within(row).getByText(m.formula)).toBeTruthy();
      expect(within(row).getByText(m.source)).toBeTruthy();
    }
    // Each method's standing against the test, and its ratio to the largest pressure tested.
    const hyperbolic = methods.find((m) => m.label.startsWith('Hyperbolic')) as unknown as { label: string; qOverQmax: number };
    const row = within(table).getByText(hyperbolic.label).closest('tr') as HTMLElement;
    expect(within(row).getByText('extrapolated')).toBeTruthy();
    expect(within(row).getByText(hyperbolic.qOverQmax.toFixed(2))).toBeTruthy();
    // The test did not fail: the lower bound is carried, and the page says so in the analysis's own words.
    expect(screen.getByText(analysis.chosenUltimate.result.statement)).toBeTruthy();
    expect(analysis.chosenUltimate.result.statement).toMatch(/^Failure not reached: q_ult ≥ 600\.0 kPa/);
  });

  it('states the origin of the curve, the procedure, why k and Ev are not shown, and what the allowable pressure rests on', async () => {
    stubRun();
    renderWithProviders(<InterpretationPage runId={7} record={record} />);
    expect(await screen.findByText(analysis.zeroCorrection.statement)).toBeTruthy();
    expect(screen.getByText('Bearing test — maintained load, granular soil')).toBeTruthy();
    for (const s of Object.values(analysis.procedure.methods) as { shown: boolean; why?: string }[]) if (!s.shown) expect(screen.getByText(s.why as string)).toBeTruthy();
    expect(screen.getByText(analysis.footing.result.basis.statement)).toBeTruthy();
  });

  it('on a modulus test shows Ev with its plate and convention, and no bearing methods', async () => {
    const modulus = JSON.parse(JSON.stringify(analyzeRecord(modulusRecord)));
    stubRun(ENGINEER, [[]], modulus);
    renderWithProviders(<InterpretationPage runId={7} record={modulusRecord} />);
    expect(await screen.findByText(modulus.deformationModuli.result.statement)).toBeTruthy();
    expect(modulus.deformationModuli.result.statement).toMatch(/^300 mm circular plate; σ0max of the first loading/);
    expect(screen.queryByRole('table', { name: 'Ultimate-pressure methods' })).toBeNull();
    expect(screen.getByText(/^No ultimate pressure: not shown for this procedure/)).toBeTruthy();
    // k of the 300 mm plate, and the 750 mm value only as the named conversion with its caution.
    expect(screen.getByRole('heading', { name: 'k, 300 mm plate, fixed settlement' })).toBeTruthy();
    expect(screen.getByText(/^k, 750 mm plate by the IRC:58 conversion/)).toBeTruthy();
    expect(screen.getByText(/^A conversion, not a measurement/)).toBeTruthy();
  });

  it('shows the cautions of the analysis prominently, before the figures', async () => {
    stubRun();
    renderWithProviders(<InterpretationPage runId={7} record={record} />);
    const cautions = await screen.findByRole('region', { name: /Read these before using any figure/ });
    for (const c of analysis.cautions) expect(within(cautions).getByText(c.message)).toBeTruthy();
    const table = screen.getByRole('table', { name: 'Ultimate-pressure methods' });
    expect(cautions.compareDocumentPosition(table) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('draws the load–settlement plots and the time–settlement plots of a stage', async () => {
    stubRun();
    renderWithProviders(<InterpretationPage runId={7} record={record} />);
    expect(await screen.findByRole('img', { name: 'Load–settlement curve, arithmetic axes' })).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Load–settlement curve, log–log axes' })).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Settlement against root time, stage 1' })).toBeTruthy();
  });

  it('saves the chosen method and the reason, and asks for a reason first', async () => {
    const fetchMock = stubRun(ENGINEER, [
      [],
      [
        {
          id: 31,
          runId: 7,
          version: 1,
          options: {},
          chosenMethod: 'hyperbolic',
          reason: 'Smooth curve.',
          createdBy: 4,
          createdByName: 'Mira Castellane',
          createdAt: '2026-03-02T10:00:00Z',
          qUltKpa: 812.4,
          allowableKpa: 190,
        },
      ],
    ]);
    const { user } = renderWithProviders(<InterpretationPage runId={7} record={record} />);
    const form = await screen.findByRole('form', { name: 'Save interpretation' });
    await user.selectOptions(within(form).getByLabelText('Chosen ultimate method'), 'hyperbolic');
    await user.click(within(form).getByRole('button', { name: 'Save interpretation' }));
    expect(within(form).getByText('Say why you chose it.')).toBeTruthy();
    expect(requests(fetchMock).some((r) => r.key === 'POST /api/runs/7/interpretations')).toBe(false);

    await user.type(within(form).getByLabelText('Reason'), 'Smooth curve, no clear break.');
    await user.click(within(form).getByRole('button', { name: 'Save interpretation' }));
    await within(form).findByText('Saved as version 1.');
    const post = requests(fetchMock).find((r) => r.key === 'POST /api/runs/7/interpretations');
    expect(post?.body).toEqual({ options: {}, chosenMethod: 'hyperbolic', reason: 'Smooth curve, no clear break.' });
    expect(post?.headers['x-csrf-token']).toBe('token-1');
    // The list of versions is fetched again and shows the new one.
    const versions = await screen.findByRole('table', { name: 'Saved interpretations' });
    await waitFor(() => expect(within(versions).getByText('Smooth curve.')).toBeTruthy());
  });

  it('offers no save form to an operator', async () => {
    stubRun(OPERATOR);
    renderWithProviders(<InterpretationPage runId={7} record={record} />);
    await screen.findByRole('table', { name: 'Ultimate-pressure methods' });
    await waitFor(() => expect(screen.queryByRole('form', { name: 'Save interpretation' })).toBeNull());
  });

  it('asks the server again with the engineer’s settings', async () => {
    const stub = stubFetch({
      'GET /api/auth/me': json(200, { user: ENGINEER, csrfToken: 'token-1' }),
      'GET /api/runs/7/interpretation': json(200, analysis),
      'GET /api/runs/7/interpretation?factorOfSafety=2.5&footingWidthM=3': json(200, analysis),
      'GET /api/runs/7/interpretations': json(200, { items: [] }),
    });
    const { user } = renderWithProviders(<InterpretationPage runId={7} record={record} />);
    const form = await screen.findByRole('form', { name: 'Interpretation settings' });
    await user.type(within(form).getByLabelText('Footing width'), '3');
    await user.type(within(form).getByLabelText('Factor of safety'), '0.5');
    expect(within(form).getByText('Enter a number from 1 to 10.')).toBeTruthy();
    await user.clear(within(form).getByLabelText('Factor of safety'));
    await user.type(within(form).getByLabelText('Factor of safety'), '2.5');
    await user.click(within(form).getByRole('button', { name: 'Apply settings' }));
    await waitFor(() => expect(requests(stub).map((r) => r.key)).toContain('GET /api/runs/7/interpretation?factorOfSafety=2.5&footingWidthM=3'));
  });
});

describe('plot data', () => {
  it('draws the hyperbola of the hyperbolic method: every fitted point satisfies s/q = a + b·s (Kondner 1963)', () => {
    const { a, b } = analysis.ultimate.result.find((r: { method: string }) => r.method === 'hyperbolic').details;
    const plot = arithmeticPlot(analysis);
    const fit = plot.series.find((s) => s.label === 'Hyperbola fit');
    expect(fit).toBeDefined();
    const pairs = plot.x.map((q, i) => [q, fit!.values[i]] as const).filter(([q, s]) => s !== null && q > 0);
    expect(pairs.length).toBeGreaterThan(10);
    for (const [q, s] of pairs) expect((s as number) / q).toBeCloseTo(a + b * (s as number), 9);
  });

  it('puts the measured first loading in kPa and mm beside the two fitted lines of the log–log method', () => {
    const plot = logLogPlot(analysis);
    expect(plot.series.map((s) => s.label)).toEqual(['First loading', 'Log–log line 1', 'Log–log line 2']);
    const measured = analysis.firstLoading.filter((p: { pressureKpa: number; settlementMm: number }) => p.pressureKpa > 0 && p.settlementMm > 0);
    const pairs = plot.x.map((q, i) => [q, plot.series[0].values[i]]).filter(([, s]) => s !== null);
    expect(pairs).toEqual(measured.map((p: { pressureKpa: number; settlementMm: number }) => [p.pressureKpa, p.settlementMm]));
    // Each fitted point lies on its line: log10 s = intercept + slope·log10 q (the log–log method's straight lines).
    const { firstLine } = analysis.ultimate.result.find((r: { method: string }) => r.method === 'logLogIntersection').details;
    const fitted = plot.x.map((q, i) => [q, plot.series[1].values[i]] as const).filter(([, s]) => s !== null);
    expect(fitted.length).toBe(12);
    for (const [q, s] of fitted) expect(Math.log10(s as number)).toBeCloseTo(firstLine.intercept + firstLine.slope * Math.log10(q), 9);
  });
});
