/**
 * Plate loading tests through AGS4 (edition 4.1.1, groups PLTG and PLTT): export → import gives back the
 * readings and test settings to the precision the file states — time 0.001 min (PLTT_TMIN, else PLTT_TIME
 * 0.1 min), pressure 0.1 kPa (PLTT_PRES), settlement 0.01 mm (PLTT_SETn, 2DP), plate size 0.1 mm, depth
 * 0.01 m, seating load 0.1 kN (PLTG_SEAT, 1DP). What the dictionary cannot hold is carried by DICT headings
 * or stated: readings PLTT_TIME cannot key (rule 10a) are left out and counted, square plates give their
 * equivalent-area diameter.
 */
import { checkAgs4 } from '@shared/ags4/check';
import { exportAgs4 } from '@shared/ags4/plate-export';
import { splitLine } from '@shared/ags4/parse';
import { importAgs4 } from '@shared/ags4/plate-import';
import { equivalentDiameterMm, loadCycles } from '@shared/ags4/plate-map';
import { plateForceKn } from '@shared/domain/plate';
import type { TestRecord } from '@shared/records/schema';
import { describe, expect, it } from 'vitest';
import { exportInput, fixtureFile, fixtureRecord } from './fixtures';

function roundTrip(records: TestRecord[]) {
  const exported = exportAgs4(exportInput(records));
  expect(checkAgs4(exported.text).problems).toEqual([]);
  const imported = importAgs4(exported.text);
  if (!imported.ok) throw new Error(JSON.stringify(imported.problems));
  return { exported, tests: imported.tests };
}

/** The readings and settings a round trip must keep, at the file's stated precision. */
function expectSameTest(back: TestRecord, original: TestRecord) {
  expect(back.plate).toEqual(original.plate);
  expect(back.gauges.map((g) => g.key)).toEqual(original.gauges.map((g) => g.key));
  expect(back.metadata?.testDate).toBe(original.metadata?.testDate);
  expect(back.plan?.procedureId).toBe(original.plan?.procedureId);
  expect(plateForceKn(back.plate, back.plan?.seatingPressureKpa ?? 0)).toBeCloseTo(plateForceKn(original.plate, original.plan?.seatingPressureKpa ?? 0), 1);
  expect(back.ground?.testDepthM).toBeCloseTo(original.ground?.testDepthM ?? 0.5, 2);
  expect(back.stages.map((s) => [s.index, s.branch, s.targetKpa])).toEqual(original.stages.map((s) => [s.index, s.branch, s.targetKpa]));
  back.stages.forEach((stage, s) => {
    const from = original.stages[s].readings;
    expect(stage.readings).toHaveLength(from.length);
    stage.readings.forEach((r, i) => {
      expect(Math.abs(r.tMin - from[i].tMin)).toBeLessThanOrEqual(0.0005);
      expect(Math.abs(r.pressureKpa - from[i].pressureKpa)).toBeLessThanOrEqual(0.05);
      for (const key of Object.keys(from[i].gauges)) expect(Math.abs(r.gauges[key] - from[i].gauges[key])).toBeLessThanOrEqual(0.005);
    });
  });
}

describe('export → import round trip', () => {
  it('gives back both fixture tests: stages, readings, plate, gauges, seating, depth, date, method', () => {
    const originals = [fixtureRecord('modulus-two-cycle-300'), fixtureRecord('sand-bearing-450-square')];
    const { tests } = roundTrip(originals);
    expect(tests.map((t) => [t.locationId, t.reference])).toEqual([
      ['PLT-07', 'R1'],
      ['TP-03', 'R2'],
    ]);
    for (const [i, t] of tests.entries()) expectSameTest(t.record, originals[i]);
    // Texts come back as printable ASCII: "21 °C" was written "21 deg C".
    expect(tests[0].record.metadata?.weather).toBe('Sunny, 21 deg C');
    expect(tests[1].record.ground?.waterTableBelowTestM).toBe(4.5);
    expect(tests[1].record.events?.map((e) => [e.stage, e.text])).toEqual(originals[1].events?.map((e) => [e.stage, e.text]));
  });

  it('writes a two-cycle test as PLTG cycles 1 and 2 with Ev1 and Ev2 on their rows', () => {
    const record = fixtureRecord('modulus-two-cycle-300');
    expect(loadCycles(record.stages)).toEqual([1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2]);
    const lines = fixtureFile().text.split('\r\n');
    const fields = (line: string) => {
      const split = splitLine(line);
      if ('problem' in split) throw new Error(split.problem);
      return split.fields;
    };
    const heading = fields(lines[lines.indexOf('"GROUP","PLTG"') + 1]);
    const start = lines.indexOf('"GROUP","PLTG"');
    const rows = lines.slice(start, lines.indexOf('', start)).filter((l) => l.startsWith('"DATA","PLT-07","0.50","R1"'));
    expect(rows).toHaveLength(2);
    const [one, two] = rows.map((r) => Object.fromEntries(fields(r).map((v, i) => [heading[i], v])));
    expect([one.PLTG_CYC, two.PLTG_CYC]).toEqual(['1', '2']);
    expect(one.PLTG_SMOD).toMatch(/^\d+\.\d$/);
    expect(two.PLTG_EV2).toBe(two.PLTG_SMOD);
    expect(one.PLTG_EV2).toBe('');
    expect(one.PLTG_SEAT).toBe('0.7'); // 10 kPa × π·0.3²/4 m² = 0.707 kN (plate area, reference §B.1 formula A = πD²/4)
  });

  it('gives a square plate the equivalent-area diameter and keeps its shape and side in DICT headings', () => {
    expect(equivalentDiameterMm(450)).toBeCloseTo(507.8, 1); // 2·450/√π = 507.77 mm (hand-worked, πD²/4 = b²)
    const { exported } = roundTrip([fixtureRecord('sand-bearing-450-square')]);
    expect(exported.text).toMatch(/"DATA","TP-03","1\.00","R1","1","508",/);
    expect(exported.text).toContain('Square plate 450.0 mm: PLTG_PDIA is the equivalent-area diameter');
    expect(exported.notes).toContain('TP-03 R1: square plate, PLTG_PDIA holds the equivalent-area diameter');
  });

  it('carries gauges beyond four in DICT headings PLTT_S5, PLTT_S6', () => {
    const base = fixtureRecord('sand-bearing-450-square');
    const six: TestRecord = {
      ...base,
      gauges: [...base.gauges, { key: 'g5' }, { key: 'g6' }],
      stages: base.stages.map((s) => ({
        ...s,
        readings: s.readings.map((r) => ({ ...r, gauges: { ...r.gauges, g5: r.gauges.g1 + 0.01, g6: r.gauges.g2 - 0.01 } })),
      })),
    };
    const { exported, tests } = roundTrip([six]);
    expect(exported.text).toContain('"DATA","HEADING","PLTT","PLTT_S6","OTHER","2DP","Settlement of gauge 6","mm","PLTG"');
    expectSameTest(tests[0].record, six);
  });

  it('states the readings PLTT_TIME cannot key (two in the same 0.1 min) and keeps the last of each', () => {
    const base = fixtureRecord('modulus-two-cycle-300');
    // Readings every 5 s: 0, 0.083, 0.167, 0.25, 0.333… min; 0.25 and 0.333 both round to 0.3 min.
    const dense: TestRecord = {
      ...base,
      stages: base.stages.map((s) => ({
        ...s,
        readings: Array.from({ length: 25 }, (_, i) => ({ tMin: i / 12, pressureKpa: s.targetKpa, gauges: { s1: i * 0.01 } })),
      })),
    };
    const { exported, tests } = roundTrip([dense]);
    // Slots 0.0 … 2.0 min: 21 per stage of 25 readings, so 4 left out per stage (hand count).
    expect(exported.notes).toContain('PLT-07 R1 cycle 1: 40 readings left out (a later reading of the same stage falls in the same 0.1 min of PLTT_TIME)');
    expect(exported.notes).toContain('PLT-07 R1 cycle 2: 20 readings left out (a later reading of the same stage falls in the same 0.1 min of PLTT_TIME)');
    expect(exported.text).toContain('40 readings within 0.1 min of a later one left out');
    const stage = tests[0].record.stages[1];
    expect(stage.readings).toHaveLength(21);
    const kept = stage.readings.map((r) => Math.round(r.tMin * 12));
    expect(kept.slice(0, 6)).toEqual([0, 1, 2, 4, 5, 6]); // 0.25 min (3/12) gives way to 0.333 (4/12) in slot 0.3
    for (const r of stage.readings) expect(r.gauges.s1).toBeCloseTo(Math.round(r.tMin * 12) * 0.01, 5);
  });
});

describe('AGS4 files from elsewhere', () => {
  const row = (...fields: string[]) => fields.map((f) => `"${f}"`).join(',');
  const file = [
    row('GROUP', 'PROJ'),
    row('HEADING', 'PROJ_ID', 'PROJ_NAME'),
    row('UNIT', '', ''),
    row('TYPE', 'ID', 'X'),
    row('DATA', 'P1', 'Other firm'),
    '',
    row('GROUP', 'TRAN'),
    row('HEADING', 'TRAN_ISNO', 'TRAN_DATE', 'TRAN_PROD', 'TRAN_STAT', 'TRAN_AGS', 'TRAN_DLIM', 'TRAN_RCON'),
    row('UNIT', '', 'yyyy-mm-dd', '', '', '', '', ''),
    row('TYPE', 'X', 'DT', 'X', 'X', 'X', 'X', 'X'),
    row('DATA', '1', '2026-01-05', 'Other firm', 'Final', '4.1.1', '|', '+'),
    '',
    row('GROUP', 'UNIT'),
    row('HEADING', 'UNIT_UNIT', 'UNIT_DESC'),
    row('UNIT', '', ''),
    row('TYPE', 'X', 'X'),
    ...['m', 'mm', 'kN', 'min', 'yyyy-mm-dd'].map((u) => row('DATA', u, u)),
    '',
    row('GROUP', 'TYPE'),
    row('HEADING', 'TYPE_TYPE', 'TYPE_DESC'),
    row('UNIT', '', ''),
    row('TYPE', 'X', 'X'),
    ...['ID', 'X', 'DT', '0DP', '1DP', '2DP'].map((t) => row('DATA', t, t)),
    '',
    row('GROUP', 'LOCA'),
    row('HEADING', 'LOCA_ID'),
    row('UNIT', ''),
    row('TYPE', 'ID'),
    row('DATA', 'TP1'),
    '',
    row('GROUP', 'GEOL'),
    row('HEADING', 'LOCA_ID', 'GEOL_TOP'),
    row('UNIT', '', 'm'),
    row('TYPE', 'ID', '2DP'),
    row('DATA', 'TP1', '0.00'),
    '',
    row('GROUP', 'PLTG'),
    row('HEADING', 'LOCA_ID', 'PLTG_DPTH', 'PLTG_TESN', 'PLTG_CYC', 'PLTG_PDIA', 'PLTG_SEAT'),
    row('UNIT', '', 'm', '', '', 'mm', 'kN'),
    row('TYPE', 'ID', '2DP', 'X', 'X', '0DP', '1DP'),
    row('DATA', 'TP1', '0.50', 'A', '1', '300', '0.7'),
    '',
    row('GROUP', 'PLTT'),
    row('HEADING', 'LOCA_ID', 'PLTG_DPTH', 'PLTG_TESN', 'PLTG_CYC', 'PLTT_STG', 'PLTT_TIME', 'PLTT_LOAD', 'PLTT_SET1', 'PLTT_SET2'),
    row('UNIT', '', 'm', '', '', '', 'min', 'kN', 'mm', 'mm'),
    row('TYPE', 'ID', '2DP', 'X', 'X', 'X', '1DP', '1DP', '2DP', '2DP'),
    row('DATA', 'TP1', '0.50', 'A', '1', 'S', '0.0', '0.7', '0.00', '0.00'),
    row('DATA', 'TP1', '0.50', 'A', '1', 'L1', '0.0', '7.1', '0.20', '0.22'),
    row('DATA', 'TP1', '0.50', 'A', '1', 'L1', '1.0', '7.1', '0.21', '0.23'),
    row('DATA', 'TP1', '0.50', 'A', '1', 'U1', '0.0', '3.5', '0.15', '0.17'),
  ].join('\r\n');

  it('reads PLTG/PLTT without Settlescope headings, inferring branches, and lists the groups not used', () => {
    const imported = importAgs4(`${file}\r\n`);
    if (!imported.ok) throw new Error(JSON.stringify(imported.problems));
    expect(imported.ignoredGroups).toEqual(['GEOL']);
    const [test] = imported.tests;
    expect(test).toMatchObject({ locationId: 'TP1', reference: 'A', depthM: 0.5 });
    expect(test.record.plate).toEqual({ shape: 'circular', sizeMm: 300 });
    expect(test.record.gauges).toEqual([{ key: 'g1' }, { key: 'g2' }]);
    // 0.7 kN on a 300 mm plate (area 0.0707 m²) = 9.9 kPa: the seating load; 7.1 kN = 100.44 kPa, a rise: loading; 3.5 kN a fall: unloading.
    expect(test.record.stages.map((s) => [s.index, s.branch, s.targetKpa])).toEqual([
      [0, 'seating', 9.9],
      [1, 'loading', 100.4],
      [2, 'unloading', 49.5],
    ]);
    expect(test.record.stages[1].readings[1]).toEqual({ tMin: 1, pressureKpa: 100.44, gauges: { g1: 0.21, g2: 0.23 } });
  });

  it('refuses a column in another unit, naming it (units are not converted)', () => {
    const imported = importAgs4(file.replace('"UNIT","","m","","","","min","kN","mm","mm"', '"UNIT","","m","","","","min","kN","m","mm"'));
    expect(imported.ok).toBe(false);
    if (!imported.ok)
      expect(imported.problems).toEqual([
        expect.objectContaining({ group: 'PLTT', heading: 'PLTT_SET1', message: 'read in mm; the file gives "m" (units are not converted)' }),
      ]);
  });
});
