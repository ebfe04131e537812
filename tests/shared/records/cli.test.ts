/** `npm run analyze` run as a child process, as an engineer runs it. */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { afterAll, describe, expect, it } from 'vitest';
import { fixtureRecord, fixtureText } from './fixtures';
import { pavementTest, repeatedLoadingTest, straightLineTo600 } from './synthetic';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const TSX = path.join(ROOT, 'node_modules/.bin/tsx');
const FIXTURES = 'tests/fixtures/records';
const scratch = mkdtempSync(path.join(tmpdir(), 'settlescope-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

function analyze(...args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile(TSX, ['server/cli/analyze.ts', ...args], { cwd: ROOT, maxBuffer: 16 * 1024 * 1024 }, (error, stdout, stderr) => {
      resolve({ code: error ? Number(error.code) : 0, stdout, stderr });
    });
  });
}

function scratchFile(name: string, text: string): string {
  const file = path.join(scratch, name);
  writeFileSync(file, text);
  return file;
}

const ANALYSIS_KEYS = [
  'analysisVersion',
  'summary',
  'procedure',
  'reduction',
  'zeroCorrection',
  'firstLoading',
  'extent',
  'ultimate',
  'chosenUltimate',
  'footing',
  'subgradeModulus',
  'deformationModuli',
  'evAcceptance',
  'elasticModulus',
  'undrainedStrength',
  'unloadReloadModulus',
  'cycles',
  'timeSettlement',
  'scalingWarnings',
  'cautions',
];

describe('npm run analyze', { timeout: 30_000 }, () => {
  it('--json prints the analysis of a JSON record as valid JSON, exit 0', async () => {
    const run = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--json');
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    const printed = JSON.parse(run.stdout);
    expect(Object.keys(printed)).toEqual(ANALYSIS_KEYS);
    expect(printed).toEqual(JSON.parse(JSON.stringify(analyzeRecord(fixtureRecord('sand-bearing-450-square.json')))));
  });

  it('reads the readings CSV by its extension, and a record without extension by its first character', async () => {
    const csv = await analyze(`${FIXTURES}/sand-bearing-450-square.csv`, '--json');
    expect(csv.code).toBe(0);
    expect(JSON.parse(csv.stdout).summary.readings).toBe(90);
    const noExtension = await analyze(scratchFile('modulus-record', fixtureText('modulus-two-cycle-300.json')), '--json');
    expect(noExtension.code).toBe(0);
    expect(JSON.parse(noExtension.stdout).deformationModuli.applies).toBe(true);
  });

  it('prints a readable table with units and the cautions', async () => {
    const run = await analyze(`${FIXTURES}/modulus-two-cycle-300.json`);
    expect(run.code).toBe(0);
    const ev = result(analyzeRecord(fixtureRecord('modulus-two-cycle-300.json')).deformationModuli);
    expect(run.stdout).toContain(
      `Ev1 / Ev2 / Ev2÷Ev1                   ${ev.ev1.evMnM2?.toFixed(1)} / ${ev.ev2?.evMnM2?.toFixed(1)} MN/m² / ${ev.ratio?.toFixed(2)}`,
    );
    expect(run.stdout).toMatch(/^stage {2}branch {5}q \(kPa\) {2}s \(mm\) {2}t \(min\)$/m);
    expect(run.stdout).toContain('Cautions\n  - The results describe the soil under one plate');
  });

  it('speaks a practitioner’s words: no internal identifiers, every table explained, the procedure named', async () => {
    for (const name of ['sand-bearing-450-square.json', 'modulus-two-cycle-300.json']) {
      const run = await analyze(`${FIXTURES}/${name}`);
      expect(run.code).toBe(0);
      expect(run.stdout.match(/\b[a-z]{2,}[A-Z][a-z]+[A-Za-z]*\b/g) ?? [], name).toEqual([]); // no camelCase keys (units such as kPa are fine)
      expect(run.stdout.split('\n').slice(1).join('\n')).not.toMatch(/bearing-granular|modulus-two-cycle/); // the procedure by name, not by key
    }
    const sand = await analyze(`${FIXTURES}/sand-bearing-450-square.json`);
    expect(sand.stdout).toContain('  Procedure                             Bearing test — maintained load, granular soil');
    expect(sand.stdout).toContain('    q_ult/q_max: over the largest pressure tested (600.0 kPa); above 1 lies beyond the test');
    expect(sand.stdout).toMatch(/Carried to the footing checks {9}Failure not reached: q_ult ≥ 600\.0 kPa/);
    const modulus = await analyze(`${FIXTURES}/modulus-two-cycle-300.json`, '--ev2-required', '45', '--ev-ratio-max', '2.2');
    const acceptance = result(analyzeRecord(fixtureRecord('modulus-two-cycle-300.json'), { evRequirement: { name: 'the contract’s requirement as entered', minEv2MnM2: 45, maxRatio: 2.2 } }).evAcceptance);
    expect(modulus.stdout).toContain(acceptance.checks.map((c) => c.message).join(' '));
    expect(modulus.stdout).toContain('    300 mm circular plate; σ0max of the first loading for Ev1 and Ev2 (σ0max = 500 kPa); stages read 2 min after each target was reached.');
    expect(modulus.stdout).toMatch(/Ultimate pressure of the plate\n {2}All methods {27}not shown for this procedure/);
  });

  it('takes the design inputs as flags, checked as the page checks them (strip footing from a square plate in clay)', async () => {
    const run = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--footing-shape', 'strip', '--soil', 'clay', '--method', 'hyperbolic', '--safety-factor', '2.5');
    expect(run.stderr).toBe('');
    const expected = analyzeRecord(
      { ...fixtureRecord('sand-bearing-450-square.json'), footing: { ...fixtureRecord('sand-bearing-450-square.json').footing!, shape: 'strip', soilBehaviour: 'cohesive', factorOfSafety: 2.5 } },
      { ultimateMethod: 'hyperbolic' },
    );
    const footing = result(expected.footing);
    expect(run.stdout).toContain(`  Ultimate pressure of the footing      ${result(footing.ultimate).qUltKpa.toFixed(1)} kPa (shape factor 0.833)`);
    expect(run.stdout).toContain('factor of safety 2.5 on the net ultimate');
    const bad = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--soil', 'rock');
    expect([bad.code, bad.stderr]).toEqual([2, 'analyze: --soil: "rock" is not one of sand, clay, cohesionless, cohesive\n']);
    const bond = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--scaling', 'bond', '--bond-n', '0.3');
    const bondSettlement = result(result(analyzeRecord(fixtureRecord('sand-bearing-450-square.json'), { scaling: { kind: 'bond', exponentN: 0.3 } }).footing).settlement);
    expect(bond.stdout).toContain(`  Safe pressure for settlement          ${bondSettlement.qKpa?.toFixed(1)} kPa`);
    expect(bond.stdout).toContain('settlement scaled by Bond’s rule (n = 0.3)');
    const noN = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--scaling', 'bond');
    expect([noN.code, noN.stderr]).toEqual([2, 'analyze: --bond-n: required with Bond’s rule (0.03 for clay to 0.5 for dense sand)\n']);
    const low = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--safety-factor', '0.5');
    expect(low.code).toBe(2);
    expect(low.stderr).toMatch(/^analyze: --safety-factor: Too small/);
  });

  it('prints the done-when cases as the analysis states them: straight line, 300 mm pavement test, repeated loading', async () => {
    const straight = await analyze(scratchFile('straight.json', JSON.stringify(straightLineTo600())));
    expect(straight.code).toBe(0);
    expect(straight.stdout).toContain(result(analyzeRecord(straightLineTo600()).chosenUltimate).statement);
    expect(straight.stdout).toContain('Failure not reached: q_ult ≥ 600.0 kPa');
    expect(straight.stdout).not.toMatch(/ {2}(ultimate|yield pressure) {2}/); // no method stands as an ultimate or a yield

    const pavement = await analyze(scratchFile('pavement-300.json', JSON.stringify(pavementTest(300))));
    const k = result(analyzeRecord(pavementTest(300)).subgradeModulus.atSettlement);
    expect(pavement.stdout).toContain(`  k, 300 mm plate, fixed settlement     ${k.kMnM3?.toFixed(2)} MN/m³`);
    expect(pavement.stdout).toContain('settlement basis 0.05 in = 1.27 mm (ASTM D1196 / AASHTO T 222 family)');
    expect(pavement.stdout).toMatch(/k, 750\/762 mm plate +\d+\.\d\d MN\/m³ \(\d+ pci\): k, 750 mm plate by the IRC:58 conversion\. A conversion, not a measurement/);

    const file = scratchFile('repeated.json', JSON.stringify(repeatedLoadingTest()));
    const repeated = await analyze(file);
    expect(repeated.stdout).toContain('Load–release cycles (repeated loading)');
    expect(repeated.stdout).toContain('loading curve from application 1 of each load level');
    const sixth = await analyze(file, '--application', '6');
    const k6 = result(analyzeRecord(repeatedLoadingTest(), { kApplication: 6 }).subgradeModulus.atSettlement);
    expect(sixth.stdout).toContain(`${k6.kMnM3?.toFixed(2)} MN/m³`);
    expect(sixth.stdout).toContain('loading curve from application 6 of each load level');
  });

  it('exits 2 naming the file, line and column of a broken CSV', async () => {
    const lines = fixtureText('sand-bearing-450-square.csv').split('\n');
    const at = lines.findIndex((l) => l.startsWith('2,"loading"'));
    lines[at] = lines[at].replace(/^(([^,]*,){4})[^,]*/, '$1twelve');
    const file = scratchFile('broken.csv', lines.join('\n'));
    const run = await analyze(file);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toBe(`analyze: ${file}: not a valid test record\n  line ${at + 1}, column "pressure_kpa": expected a number (got "twelve")\n`);
  });

  it('exits 2 naming the field of an invalid record and the place of bad JSON', async () => {
    const record = JSON.parse(fixtureText('modulus-two-cycle-300.json'));
    record.stages[4].readings[1].gauges.s1 = null;
    const invalid = await analyze(scratchFile('invalid.json', JSON.stringify(record)));
    expect(invalid.code).toBe(2);
    expect(invalid.stderr).toContain('  stages.4.readings.1.gauges.s1: Invalid input: expected number, received null');
    const badJson = await analyze(scratchFile('bad.json', '{\n  "format": "settlescope-record",\n  "version": 1,,\n}'));
    expect(badJson.code).toBe(2);
    expect(badJson.stderr).toMatch(/bad\.json: not valid JSON \(line 3, column 16\)/);
  });

  it('exits 2 for a missing file, a missing FILE and an unknown option, quoting the option', async () => {
    const missing = await analyze(path.join(scratch, 'nowhere.json'));
    expect([missing.code, missing.stderr]).toEqual([2, `analyze: ${path.join(scratch, 'nowhere.json')}: cannot read it (no such file)\n`]);
    const none = await analyze();
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/^analyze: no FILE given\n\nUsage: npm run analyze -- FILE \[--json\]/);
    const unknown = await analyze(`${FIXTURES}/sand-bearing-450-square.json`, '--fast');
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain("Unknown option '--fast'");
  });
});

function result<T>(finding: { applies: true; result: T } | { applies: false; reason: string }): T {
  if (!finding.applies) return expect.fail(finding.reason);
  return finding.result;
}
