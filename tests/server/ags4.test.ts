/**
 * AGS4 exchange (edition 4.1.1, groups PLTG and PLTT) through the API: the demo project's tests exported
 * per run, location and project pass every AGS4 check; an export imported into another project gives back
 * the same readings and test settings to the precision the file states (time 0.001 min, pressure 0.1 kPa,
 * settlement 0.01 mm, seating load 0.1 kN); bad AGS4 is refused with every problem named by line, group and
 * heading (rules 1 printable ASCII, 8 TYPE, 10a unique keys, 10c parents, 17 TYPE defined) and nothing stored.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAgs4 } from '../../shared/ags4/check';
import { plateResults } from '../../shared/ags4/plate-export';
import { timeSlot } from '../../shared/ags4/plate-map';
import { formatDecimals } from '../../shared/ags4/values';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import { plateForceKn } from '../../shared/domain/plate';
import type { TestRecord } from '../../shared/records/schema';
import { type Client, signedIn, startTestApp, type TestApp } from '../support/api';
import { recordedRun } from '../support/stored-run';
import { tableCounts } from '../support/table-counts';

const FIXTURES = path.join(import.meta.dirname, '../fixtures/records');
const fixtures = ['modulus-two-cycle-300', 'sand-bearing-450-square'].map((name) => readFileSync(path.join(FIXTURES, `${name}.json`), 'utf8'));

let t: TestApp;
let engineer: Client;
let runIds: number[] = [];
let projectId: number;
let locationIds: number[];
let otherProjectId: number;
let thirdProjectId: number;

beforeAll(async () => {
  t = await startTestApp({ loginAttempts: 10_000 });
  engineer = await signedIn(t.app, 'engineer');
  const projects = (await engineer.get('/api/projects')).body.items as { id: number; code: string }[];
  // KQ-DC2 has three demo locations (PLT-01, PLT-02, PLT-03).
  projectId = projects.find((p) => p.code === 'KQ-DC2')!.id;
  [otherProjectId, thirdProjectId] = projects.filter((p) => p.code !== 'KQ-DC2').map((p) => p.id);
  locationIds = ((await engineer.get(`/api/projects/${projectId}/locations`)).body.items as { id: number }[]).map((l) => l.id);
  // The demo's tests: the two example records imported at the first two demo locations.
  runIds = [];
  for (const [i, content] of fixtures.entries()) {
    const res = await engineer.post('/api/imports', { locationId: locationIds[i], format: 'json', content });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    runIds.push(res.body.runId);
  }
}, 120_000);
afterAll(() => t?.stop());

const TABLES = ['test_locations', 'test_plans', 'runs', 'run_events', 'run_records', 'audit_log'];
const counts = () => tableCounts(t.sequelize, TABLES);

const uploadAgs = (text: string, project = otherProjectId) =>
  engineer.upload('/api/imports/ags4', { data: Buffer.from(text, 'utf8'), name: 'tests.ags' }, { projectId: project });

describe('exporting the demo tests', () => {
  it('per run, per location and per project: a .ags download that passes every AGS4 check', async () => {
    for (const url of [
      `/api/runs/${runIds[0]}/ags4`,
      `/api/locations/${locationIds[1]}/ags4`,
      `/api/projects/${projectId}/ags4?issue=3&status=Final&contractor=Demo%20Testing%20Ltd`,
    ]) {
      const res = await engineer.get(url);
      expect(res.status, url).toBe(200);
      expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?[A-Za-z0-9_-]+\.ags"?$/);
      const checked = checkAgs4(res.text);
      expect(checked.problems, url).toEqual([]);
    }
    const project = await engineer.get(`/api/projects/${projectId}/ags4?issue=3&status=Final&contractor=Demo%20Testing%20Ltd`);
    expect(project.text).toMatch(/"DATA","3","\d{4}-\d{2}-\d{2}","Settlescope","Final","Plate loading tests","4\.1\.1"/);
    for (const id of runIds) expect(project.text).toContain(`"R${id}","1"`);
  });

  it('refuses options that are not printable ASCII or out of range, and a location without tests', async () => {
    expect((await engineer.get(`/api/projects/${projectId}/ags4?issue=0`)).status).toBe(400);
    expect((await engineer.get(`/api/projects/${projectId}/ags4?status=${encodeURIComponent('Prélim')}`)).body.error.field).toBe('status');
    const empty = await engineer.get(`/api/locations/${locationIds[2]}/ags4`);
    expect(empty.status).toBe(404);
    expect(empty.body.error.code).toBe('no_tests');
  });

  it('takes PLTG results from the saved interpretation, not a fresh default one', async () => {
    // Ev2 with σ0max of each branch (DIN 18134's other convention) differs from the default for this test.
    const record = JSON.parse(fixtures[0]) as TestRecord;
    const byDefault = plateResults(analyzeRecord(record)).ev2Mpa!;
    const saved = plateResults(analyzeRecord(record, { evConvention: 'branchMax' })).ev2Mpa!;
    expect(formatDecimals(saved, 1)).not.toBe(formatDecimals(byDefault, 1));
    const res = await engineer.post(`/api/runs/${runIds[0]}/interpretations`, {
      options: { evConvention: 'branchMax' },
      chosenMethod: 'hyperbolic',
      reason: 'Ev2 read with each branch’s own σ0max',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const text = (await engineer.get(`/api/runs/${runIds[0]}/ags4`)).text;
    // The PLTG row of cycle 2: keys, then PLTG_PDIA 300 mm.
    const cycle2 = text.split('\r\n').find((l) => l.includes(`"R${runIds[0]}","2","300",`));
    expect(cycle2).toContain(`"${formatDecimals(saved, 1)}","${formatDecimals(saved, 1)}"`); // PLTG_SMOD, PLTG_EV2
  });

  it('is for staff: a client answers 403', async () => {
    const client = await signedIn(t.app, 'client');
    expect((await client.get(`/api/projects/${projectId}/ags4`)).status).toBe(403);
  });
});

describe('export → import round trip', () => {
  it('gives back the same readings and test settings in another project, adding its locations, in one go', async () => {
    const before = await counts();
    const exported = (await engineer.get(`/api/projects/${projectId}/ags4`)).text;
    const res = await uploadAgs(exported);
    expect(res.status).toBe(201);
    expect(res.body.tests).toHaveLength(2);
    expect(res.body.ignoredGroups).toEqual([]);
    const after = await counts();
    expect(res.body.addedLocations).toEqual(['PLT-01', 'PLT-02']);
    expect(after.test_locations - before.test_locations).toBe(2);
    expect(after.runs - before.runs).toBe(2);
    expect(after.run_records - before.run_records).toBe(2);
    for (const [i, test] of (res.body.tests as { runId: number; reference: string }[]).entries()) {
      expect(test.reference).toBe(`R${runIds[i]}`);
      const back = (await engineer.get(`/api/runs/${test.runId}/record`)).body as TestRecord;
      const original = JSON.parse(fixtures[i]) as TestRecord;
      expect(back.plate).toEqual(original.plate);
      expect(back.gauges.map((g) => g.key)).toEqual(original.gauges.map((g) => g.key));
      expect(back.plan?.procedureId).toBe(original.plan?.procedureId);
      expect(plateForceKn(back.plate, back.plan!.seatingPressureKpa!)).toBeCloseTo(plateForceKn(original.plate, original.plan!.seatingPressureKpa!), 1);
      expect(back.metadata?.testDate).toBe(original.metadata?.testDate);
      expect(back.stages.map((s) => [s.index, s.branch, s.targetKpa])).toEqual(original.stages.map((s) => [s.index, s.branch, s.targetKpa]));
      const flat = (r: TestRecord) => r.stages.flatMap((s) => s.readings);
      const readings = flat(back);
      expect(readings).toHaveLength(flat(original).length);
      flat(original).forEach((r, k) => {
        expect(Math.abs(readings[k].tMin - r.tMin)).toBeLessThanOrEqual(0.0005);
        expect(Math.abs(readings[k].pressureKpa - r.pressureKpa)).toBeLessThanOrEqual(0.05);
        for (const key of Object.keys(r.gauges)) expect(Math.abs(readings[k].gauges[key] - r.gauges[key])).toBeLessThanOrEqual(0.005);
      });
    }
  });
});

describe('refusing bad AGS4, every problem named and nothing stored', () => {
  it('missing TYPE group, wrong decimal places, an orphan PLTT row, a duplicate key and a non-ASCII character in one file', async () => {
    const good = (await engineer.get(`/api/runs/${runIds[0]}/ags4`)).text;
    const lines = good.split('\r\n');
    const first = lines.findIndex((l) => l.startsWith(`"DATA","PLT-`) && l.includes('"seating"'));
    lines[first + 2] = lines[first + 2].replace(/"(\d+\.\d)(\d)"(,"","","","")/, '"$1$20"$3'); // 0.18 → 0.180 (PLTT_SET1, 2DP)
    lines[first + 3] = lines[first + 3].replace(`"R${runIds[0]}"`, '"R999"');
    lines[first + 4] = lines[first + 4].replace('"loading"', '"loading °"');
    lines.splice(first + 5, 0, lines[first + 5]);
    const typeStart = lines.indexOf('"GROUP","TYPE"');
    lines.splice(typeStart, lines.indexOf('', typeStart) - typeStart + 1);
    const text = lines.join('\r\n');
    const before = await counts();
    const res = await uploadAgs(text);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_record');
    const named = (res.body.issues as { line?: number; group?: string; heading?: string; rule: string }[]).map((p) =>
      `${p.rule} ${p.group ?? ''} ${p.heading ?? ''}`.trim(),
    );
    expect(named).toEqual(expect.arrayContaining(['17 TYPE', '17 PLTT PLTT_TIME', '8 PLTT PLTT_SET1', '10c PLTT PLTG_CYC', '1 PLTT', '10a PLTT PLTT_TIME']));
    for (const issue of res.body.issues as { line?: number; rule: string }[])
      if (issue.rule !== '17' || issue.line !== undefined) expect(issue.line).toBeGreaterThan(0);
    expect(await counts()).toEqual(before);
  });

  it('a valid AGS4 file with one unusable test stores none of its tests and adds no location', async () => {
    const good = (await engineer.get(`/api/projects/${projectId}/ags4`)).text;
    // The second test's first stage gets a branch Settlescope does not know.
    const bad = good.replace(/("DATA","PLT-02"[^\r\n]*?)"seating"/, '$1"sideways"');
    expect(bad).not.toBe(good);
    expect(checkAgs4(bad).problems).toEqual([]);
    const before = await counts();
    // A project without PLT-01 and PLT-02: a stored import would add them.
    const res = await uploadAgs(bad, thirdProjectId);
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([
      expect.objectContaining({ group: 'PLTT', heading: 'PLTT_BRCH', message: expect.stringMatching(/"sideways" is not a branch/) }),
    ]);
    expect(await counts()).toEqual(before);
  });
});

describe('the command line', () => {
  const ROOT = path.join(import.meta.dirname, '../..');
  const scratch = mkdtempSync(path.join(tmpdir(), 'settlescope-ags4-'));
  afterAll(() => rmSync(scratch, { recursive: true, force: true }));
  const tsx = (script: string, args: string[]) =>
    new Promise<{ code: number; stdout: string; stderr: string }>((resolve) => {
      const db = t.config.db;
      const env = {
        ...process.env,
        SSCOPE_DB_HOST: db.host,
        SSCOPE_DB_PORT: String(db.port),
        SSCOPE_DB_NAME: db.database,
        SSCOPE_DB_USER: db.user,
        SSCOPE_DB_PASSWORD: db.password,
      };
      execFile(path.join(ROOT, 'node_modules/.bin/tsx'), [script, ...args], { cwd: ROOT, env, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) =>
        resolve({ code: error ? Number(error.code) : 0, stdout, stderr }),
      );
    });

  it('npm run ags4 writes a checked file; npm run analyze reads a file of one test and refuses one of several', async () => {
    const one = path.join(scratch, 'one.ags');
    const written = await tsx('server/cli/ags4.ts', ['--run', String(runIds[0]), '--out', one, '--status', 'Final']);
    expect(written.code, written.stderr).toBe(0);
    const text = readFileSync(one, 'utf8');
    expect(checkAgs4(text).problems).toEqual([]);
    expect(text).toContain('"Final"');
    const analysed = await tsx('server/cli/analyze.ts', [one, '--json']);
    expect(analysed.code, analysed.stderr).toBe(0);
    expect(JSON.parse(analysed.stdout).summary.stages).toBe(JSON.parse(fixtures[0]).stages.length);

    const both = await tsx('server/cli/ags4.ts', ['--project', String(projectId), '--out', '-']);
    expect(both.code, both.stderr).toBe(0);
    const several = path.join(scratch, 'several.ags');
    await import('node:fs/promises').then((fs) => fs.writeFile(several, both.stdout));
    const refused = await tsx('server/cli/analyze.ts', [several]);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toMatch(/holds 2 plate loading tests/);
    expect((await tsx('server/cli/ags4.ts', ['--location', '99999'])).code).toBe(2);
  }, 120_000);
});

describe('a recorded run', () => {
  it('exports a checked file; the import gives back every reading PLTT_TIME can key, and the file counts the others', async () => {
    const id = await recordedRun(t.sequelize, engineer, 'Recorded run for AGS4');
    const record = (await engineer.get(`/api/runs/${id}/record`)).body as TestRecord;
    const res = await engineer.get(`/api/runs/${id}/ags4`);
    expect(res.status).toBe(200);
    expect(checkAgs4(res.text).problems).toEqual([]);
    // Of each stage's readings in the same 0.1 min (PLTT_TIME, 1DP) the last is kept.
    const kept = record.stages.map((s) => [...new Map(s.readings.map((r) => [timeSlot(r.tMin), r])).values()]);
    const dropped = record.stages.reduce((n, s, i) => n + s.readings.length - kept[i].length, 0);
    if (dropped > 0) expect(res.text).toMatch(new RegExp(`R${id} cycle 1: ${dropped} readings? left out`));
    const imported = await uploadAgs(res.text, thirdProjectId);
    expect(imported.status, JSON.stringify(imported.body)).toBe(201);
    const back = (await engineer.get(`/api/runs/${imported.body.tests[0].runId}/record`)).body as TestRecord;
    expect(back.stages.map((s) => s.readings.length)).toEqual(kept.map((k) => k.length));
    back.stages.forEach((stage, s) => {
      stage.readings.forEach((r, k) => {
        const from = kept[s][k];
        expect(Math.abs(r.tMin - from.tMin)).toBeLessThanOrEqual(0.0005);
        expect(Math.abs(r.pressureKpa - from.pressureKpa)).toBeLessThanOrEqual(0.05);
        for (const key of Object.keys(from.gauges)) expect(Math.abs(r.gauges[key] - from.gauges[key])).toBeLessThanOrEqual(0.005);
      });
    });
  });
});
