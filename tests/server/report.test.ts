/**
 * The PDF report of a run: generated from an imported record, read back with unpdf (an independent PDF
 * parser), and checked for the key figures, the plots' vector paths, the cautions and the sign-off hash.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import type { TestRecord } from '../../shared/records/schema';
import { DEMO_PASSWORD } from '../../server/seed/demo';
import { axisRange, niceStep } from '../../server/services/pdf-plot';
import { toWinAnsi } from '../../server/services/pdf-text';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { binaryBody, pdfText } from '../support/pdf';

const sandJson = readFileSync(path.join(import.meta.dirname, '../fixtures/records/sand-bearing-450-square.json'), 'utf8');
const sand = JSON.parse(sandJson) as TestRecord;

let t: TestApp;
let engineer: Client;
let runId: number;

const binary = (res: { body: unknown }) => res.body as Buffer;
beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  const res = await engineer.post('/api/imports', { locationId: 1, format: 'json', content: sandJson });
  expect(res.status).toBe(201);
  runId = res.body.runId;
}, 120_000);
afterAll(() => t?.stop());

describe('plot axes', () => {
  it('steps ticks by 1, 2 or 5 × 10ⁿ and covers the data', () => {
    expect(niceStep(600)).toBe(200);
    expect(niceStep(23)).toBe(5);
    expect(niceStep(0.7)).toBe(0.2);
    expect(axisRange([12, 587])).toEqual({ min: 0, max: 600, step: 200 });
  });
});

describe('report text', () => {
  it('spells out what the PDF standard fonts cannot show (Windows-1252 only) and keeps what they can', () => {
    expect(toWinAnsi('k = p(δ)/δ, ν = 0.3, σ ≤ 1 → ok')).toBe('k = p(delta)/delta, nu = 0.3, sigma <= 1 -> ok');
    expect(toWinAnsi('Géotechnique · 20 °C – “q” — 5 m² ’')).toBe('Géotechnique · 20 °C – “q” — 5 m² ’');
    expect(toWinAnsi('漢')).toBe('?');
  });
});

describe('PDF report', () => {
  it('holds the site, plate, stage readings, interpretation and cautions of an unsigned run, marked as a draft', async () => {
    const saved = await engineer.post(`/api/runs/${runId}/interpretations`, {
      chosenMethod: 'hyperbolic',
      reason: 'The curve bends smoothly towards an asymptote.',
    });
    expect(saved.status).toBe(201);
    const res = await binaryBody(engineer.get(`/api/runs/${runId}/report.pdf`));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const bytes = binary(res);
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-');
    // The mono face is embedded (a subset of JetBrains Mono), not substituted.
    expect(bytes.toString('latin1')).toMatch(/JetBrainsMono/);
    const { text } = await pdfText(bytes);

    const analysis = analyzeRecord({ ...sand }, { ultimateMethod: 'hyperbolic' });
    expect(analysis.chosenUltimate.applies).toBe(true);
    const qUlt = analysis.chosenUltimate.applies ? analysis.chosenUltimate.result.qUltKpa : Number.NaN;
    // The fixture's stage ends lie on q = s/(a + b·s) with asymptote 1/b = 800 kPa, loaded to 600 kPa
    // (tests/fixtures/records/README.md): the ultimate lies between the largest pressure and the asymptote.
    expect(qUlt).toBeGreaterThan(600);
    expect(qUlt).toBeLessThan(800);
    // The same statement the page and the command line print (PDF text is Windows-1252: ≥ and the like spelt out).
    const statement = analysis.chosenUltimate.applies ? analysis.chosenUltimate.result.statement : '';
    expect(text.replace(/\s+/g, ' ')).toContain(toWinAnsi(statement).slice(0, 60));
    expect(text).toContain('Hyperbolic asymptote');
    expect(text).toContain('square, 450 mm');
    expect(text).toContain('Plate load test report');
    expect(text).toContain('The curve bends smoothly towards an asymptote.');
    // Stage-end table: the last loading stage's pressure as the reduction gives it.
    const top = analysis.reduction.points.reduce((a, b) => (b.pressureKpa > a.pressureKpa ? b : a));
    expect(text).toContain(top.pressureKpa.toFixed(1));
    expect(text).toContain(top.settlementMm.toFixed(3));
    for (const phrase of ['one spot and one depth', 'two footing widths', 'long-term consolidation settlement', 'licensed geotechnical engineer'])
      expect(text).toContain(phrase);
    expect(text).toContain('Not signed');
    // What the allowable pressure rests on, and the zero correction, as the analysis states them.
    expect(text.replace(/\s+/g, ' ')).toContain('Net pressure at founding level');
    expect(text.replace(/\s+/g, ' ')).toContain('Origin of the curve: the end of the seating stage');
  });

  it('carries the signature, its UTC time and the data hash once signed', async () => {
    await engineer.post(`/api/runs/${runId}/signoff/submit`);
    const admin = await signedIn(t.app, 'admin'); // someone other than the submitter signs
    const signed = await admin.post(`/api/runs/${runId}/signoff/sign`, { password: DEMO_PASSWORD, meaning: 'approved' });
    expect(signed.status).toBe(200);
    const sig = signed.body.signatures[0];
    const { text } = await pdfText(binary(await binaryBody(engineer.get(`/api/runs/${runId}/report.pdf`))));
    expect(text.replace(/ /g, '')).toContain(sig.dataHash);
    expect(text).toContain('Revision 1, approved');
    expect(text).toContain(sig.signedAt.slice(0, 10));
    expect(text).not.toContain('Not signed');
  });

  it('answers 404 for an unknown run', async () => {
    expect((await engineer.get('/api/runs/999999/report.pdf')).status).toBe(404);
  });
});
