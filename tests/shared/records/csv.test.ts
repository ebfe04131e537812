import { reduceStages } from '@shared/interpretation/reduction';
import { CSV_SETTINGS, csvCell, readingsCsvToRecord, recordToReadingsCsv, stagePointsToCsv } from '@shared/records/csv';
import { toStageReadings } from '@shared/records/readings';
import { GAUGE_KEY_PATTERN, RECORD_BRANCHES, type TestRecord } from '@shared/records/schema';
import { MAX_LISTED_ISSUES, type RecordImport } from '@shared/records/validate';
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixtureRecord, fixtureText } from './fixtures';

const PLATE = '# plate_shape: square\n# plate_size_mm: 450\n';

function errorsOf(outcome: RecordImport) {
  if (outcome.ok) return expect.fail('expected the CSV to be rejected');
  expect(outcome).not.toHaveProperty('record');
  return outcome.errors;
}

function recordOf(outcome: RecordImport): TestRecord {
  if (!outcome.ok) return expect.fail(JSON.stringify(outcome.errors));
  return outcome.record;
}

describe('readings CSV import', () => {
  it('the example CSV is the example JSON record: same plate, metadata and every reading', () => {
    const fromCsv = recordOf(readingsCsvToRecord(fixtureText('sand-bearing-450-square.csv')));
    const json = fixtureRecord('sand-bearing-450-square.json');
    expect(fromCsv.stages).toEqual(json.stages);
    expect(fromCsv.plate).toEqual(json.plate);
    expect(fromCsv.metadata).toEqual(json.metadata);
    expect(fromCsv.plan?.procedureId).toBe(json.plan?.procedureId);
    expect(fromCsv.footing).toEqual({ shape: 'square', widthM: 1.5, soilBehaviour: 'cohesionless' });
    expect(fromCsv.gauges).toEqual(json.gauges.map((g) => ({ key: g.key })));
  });

  it('reads the header case-insensitively, trims cells and skips comments and blank lines', () => {
    const text = `${PLATE}\n Stage , BRANCH,target_kpa,t_min,pressure_kpa, left ,right\n# a comment\n0,seating,7,0,7,0,0\n\n1,loading,100,0,100, 0.9 ,1.1\n1,loading,100,1.5,99.5,1e-1,-0.02\n`;
    const record = recordOf(readingsCsvToRecord(text));
    expect(record.gauges).toEqual([{ key: 'left' }, { key: 'right' }]);
    expect(record.stages).toEqual([
      { index: 0, branch: 'seating', targetKpa: 7, readings: [{ tMin: 0, pressureKpa: 7, gauges: { left: 0, right: 0 } }] },
      {
        index: 1,
        branch: 'loading',
        targetKpa: 100,
        readings: [
          { tMin: 0, pressureKpa: 100, gauges: { left: 0.9, right: 1.1 } },
          { tMin: 1.5, pressureKpa: 99.5, gauges: { left: 0.1, right: -0.02 } },
        ],
      },
    ]);
  });

  it('takes what the CSV lacks from the caller, the CSV settings winning', () => {
    const text = '# plate_size_mm: 600\nstage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,50,0,50,0.4\n';
    const record = recordOf(
      readingsCsvToRecord(text, { plate: { shape: 'circular', sizeMm: 300 }, gauges: [{ key: 'g1', label: 'Dial A', xMm: 100, yMm: 0 }] }),
    );
    expect(record.plate).toEqual({ shape: 'circular', sizeMm: 600 });
    expect(record.gauges).toEqual([{ key: 'g1', label: 'Dial A', xMm: 100, yMm: 0 }]);
  });

  it('lists every bad line with its column, and returns no record', () => {
    const text = [
      '# plate_shape: square',
      '# plate_size_mm: 450',
      'stage,branch,target_kpa,t_min,pressure_kpa,g1,g2',
      '0,seating,7,0,7,0,0',
      '1,loading,100,0,100,0.9,0.95',
      '1,loading,100,1,abc,0.95,1.0',
      '1,loading,100,2,100,1.0',
      '1,unloading,100,4,100,1.0,1.1',
      '2,loading,200,-1,200,2,2.1',
      '2,loading,200,3,200,2.1,',
    ].join('\n');
    expect(errorsOf(readingsCsvToRecord(text))).toEqual([
      { line: 6, column: 'pressure_kpa', message: 'expected a number (got "abc")' },
      { line: 7, message: 'has 6 fields, the header 7' },
      { line: 8, column: 'branch', message: '"unloading" differs from the stage\'s first row (line 5: "loading")' },
      { line: 9, column: 't_min', message: 'Too small: expected number to be >=0' },
      { line: 10, column: 'g2', message: 'empty: expected a number' },
    ]);
  });

  it('reports order problems on their lines: times going back, a stage split in two', () => {
    const back = `${PLATE}stage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,1\n1,loading,100,5,100,1.1\n1,loading,100,3,100,1.2\n`;
    expect(errorsOf(readingsCsvToRecord(back))).toEqual([{ line: 6, column: 't_min', message: 'readings must be in time order' }]);
    const split = `${PLATE}stage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,1\n2,loading,200,0,200,2\n1,loading,100,9,100,1.2\n`;
    expect(errorsOf(readingsCsvToRecord(split))).toContainEqual({
      line: 6,
      column: 'stage',
      message: "stage 1 appears again after another stage: a stage's rows must be consecutive",
    });
  });

  it('checks the header', () => {
    const errors = errorsOf(readingsCsvToRecord(`${PLATE}stage,branch,target,t_min,pressure_kpa,g1,1x,g1\n1,loading,100,0,100,1,1,1\n`));
    expect(errors).toEqual([
      { line: 3, column: 'target', message: 'column 3 must be "target_kpa" (the header starts stage,branch,target_kpa,t_min,pressure_kpa)' },
      { line: 3, column: '1x', message: 'a gauge column is named by its key: a letter, then up to 31 letters, digits, "_" or "-"' },
      { line: 3, column: 'g1', message: 'gauge column appears twice' },
    ]);
    expect(errorsOf(readingsCsvToRecord(`${PLATE}stage,branch,target_kpa,t_min,pressure_kpa\n`))).toContainEqual({
      line: 3,
      message: 'no gauge columns after pressure_kpa',
    });
    expect(errorsOf(readingsCsvToRecord('# only a comment\n'))).toEqual([{ line: 1, message: 'no header: the CSV has no lines other than comments' }]);
  });

  it('names a missing plate and a bad setting by line', () => {
    const noPlate = errorsOf(readingsCsvToRecord('stage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,1\n'));
    expect(noPlate).toEqual([{ line: 1, message: 'no plate: add "# plate_shape: square" (or circular) and "# plate_size_mm: 450" lines above the header' }]);
    const badSize = errorsOf(
      readingsCsvToRecord('# plate_shape: square\n# plate_size_mm: big\nstage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,1\n'),
    );
    expect(badSize).toContainEqual({ line: 2, message: 'setting "plate_size_mm": expected a number (got "big")' });
    const badShape = errorsOf(
      readingsCsvToRecord('# plate_shape: hexagonal\n# plate_size_mm: 450\nstage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,1\n'),
    );
    expect(badShape).toEqual([{ line: 1, message: 'plate.shape: Invalid option: expected one of "circular"|"square"' }]);
  });

  it('reports a quote left open with its line', () => {
    const errors = errorsOf(readingsCsvToRecord(`${PLATE}stage,branch,target_kpa,t_min,pressure_kpa,g1\n1,loading,100,0,100,"1\n1,loading,100,1,100,2\n`));
    expect(errors).toHaveLength(1);
    expect(errors[0].message).toMatch(/Quote Not Closed/);
    expect(errors[0].line).toBeGreaterThanOrEqual(4);
  });

  it('imports the example of the fixtures README', () => {
    const readme = fixtureText('README.md');
    const example = /Example:\n\n```\n([^`]*)```/.exec(readme)?.[1] ?? expect.fail('no example in the README');
    const record = recordOf(readingsCsvToRecord(example));
    expect(record.metadata?.site).toBe('Plot 4, Brackenford Business Park');
    expect(record.stages.map((s) => s.readings.length)).toEqual([1, 3, 1]);
  });

  it('is all or nothing: one bad line among good ones gives no record', () => {
    const lines = fixtureText('sand-bearing-450-square.csv').split('\n');
    const at = lines.findIndex((l) => l.startsWith('3,"loading"'));
    lines[at] = lines[at].replace(/,[^,]*$/, ',1.2.3');
    expect(errorsOf(readingsCsvToRecord(lines.join('\n')))).toEqual([{ line: at + 1, column: 'g4', message: 'expected a number (got "1.2.3")' }]);
  });

  it('caps the list at 100 problems and counts the rest', () => {
    const rows = Array.from({ length: 150 }, (_, i) => `1,loading,100,${i},x,1`);
    const outcome = readingsCsvToRecord(`${PLATE}stage,branch,target_kpa,t_min,pressure_kpa,g1\n${rows.join('\n')}\n`);
    expect(errorsOf(outcome)).toHaveLength(MAX_LISTED_ISSUES);
    expect(outcome.ok === false && outcome.omitted).toBe(50);
  });
});

describe('CSV export', () => {
  it('writes the example CSV from the example record', () => {
    expect(recordToReadingsCsv(fixtureRecord('sand-bearing-450-square.json'))).toBe(fixtureText('sand-bearing-450-square.csv'));
  });

  it('writes the stage points: every value read back by an independent CSV parser', () => {
    const record = fixtureRecord('modulus-two-cycle-300.json');
    const points = reduceStages(toStageReadings(record), { kind: 'atTime', minutes: 2 });
    const rows = parse(stagePointsToCsv(points, ['s1']), { columns: true }) as Record<string, string>[];
    expect(Object.keys(rows[0])).toEqual(['stage', 'branch', 't_min', 'pressure_kpa', 'settlement_mm', 'cut_short', 's1']);
    expect(
      rows.map((r) => ({
        index: Number(r.stage),
        branch: r.branch,
        tMin: Number(r.t_min),
        pressureKpa: Number(r.pressure_kpa),
        settlementMm: Number(r.settlement_mm),
        cutShort: r.cut_short === 'true',
        gaugesMm: [Number(r.s1)],
      })),
    ).toEqual(points);
  });
});

/** Records with every reading value in range, for the round trip. */
const recordArbitrary: fc.Arbitrary<TestRecord> = fc.uniqueArray(fc.stringMatching(GAUGE_KEY_PATTERN), { minLength: 1, maxLength: 4 }).chain((keys) => {
  const value = (min: number, max: number) => fc.double({ min, max, noNaN: true }).map((x) => x + 0);
  const reading = fc.record({ tMin: value(0, 43_200), pressureKpa: value(0, 20_000), gauges: fc.tuple(...keys.map(() => value(-500, 500))) });
  const stage = fc.record({
    branch: fc.constantFrom(...RECORD_BRANCHES),
    targetKpa: value(0, 20_000),
    readings: fc.array(reading, { minLength: 1, maxLength: 6 }),
  });
  return fc
    .record({ stages: fc.array(stage, { minLength: 1, maxLength: 5 }), firstIndex: fc.nat(20), shape: fc.constantFrom('circular' as const, 'square' as const) })
    .map(({ stages, firstIndex, shape }) => ({
      format: 'settlescope-record' as const,
      version: 1 as const,
      plate: { shape, sizeMm: 300 },
      gauges: keys.map((key) => ({ key })),
      stages: stages.map((s, i) => ({
        index: firstIndex + 2 * i,
        branch: s.branch,
        targetKpa: s.targetKpa,
        readings: s.readings.map((r) => ({ ...r, gauges: Object.fromEntries(keys.map((k, g) => [k, r.gauges[g]])) })).sort((a, b) => a.tMin - b.tMin),
      })),
    }));
});

describe('round trip', () => {
  it('record → CSV → record gives the same readings, exactly', () => {
    fc.assert(
      fc.property(recordArbitrary, (record) => {
        expect(recordOf(readingsCsvToRecord(recordToReadingsCsv(record)))).toEqual(record);
      }),
      { numRuns: 200 },
    );
  });
});

/** Text a spreadsheet would run: formula starts (OWASP CSV injection guidance), quotes, separators, line breaks. */
const hostileText = fc.oneof(
  fc.string({ maxLength: 60 }),
  fc
    .tuple(fc.constantFrom('=', '+', '-', '@', '\t', '\r', '"', ',', '\n', ',=', '\r\n=', '"=', "'"), fc.string({ maxLength: 40 }))
    .map(([lead, rest]) => `${lead}${rest}`),
  fc.constantFrom('=HYPERLINK("http://example.test/x","click")', 'Sunny,=1+2', '-2+3', '@SUM(A1:A2)', '"\n=cmd|\' /C calc\'!A0'),
);
const FORMULA_START = /^[=+\-@\t\r]/;
const NUMBER_CELL = /^-?\d+(\.\d+)?(e[+-]\d+)?$/;

/** Every cell as a spreadsheet splits the file (RFC 4180, no comment lines): none may start a formula unless it is a plain number. */
function unsafeCells(csv: string): string[] {
  const rows = parse(csv, { relax_column_count: true, relax_quotes: true }) as string[][];
  return rows.flat().filter((cell) => FORMULA_START.test(cell) && !NUMBER_CELL.test(cell));
}

const TEXT_SETTINGS = CSV_SETTINGS.filter((s) => s.kind === 'text' && s.path[0] === 'metadata');

describe('CSV exports are safe to open in a spreadsheet', () => {
  it('a cell: numbers bare (negative ones too), text quoted, formula starts led by an apostrophe', () => {
    expect(csvCell(-1.5)).toBe('-1.5');
    expect(csvCell('-1.5')).toBe(`"'-1.5"`);
    expect(csvCell('=1+2')).toBe(`"'=1+2"`);
    expect(csvCell('say "hi", then')).toBe('"say ""hi"", then"');
    expect(csvCell(Number.NaN)).toBe('"NaN"');
    expect(csvCell("'-1")).toBe(`"''-1"`);
  });

  it('readings CSV: hostile settings stay inside one neutral cell, negative readings stay numbers, and read back the same', () => {
    const base = fixtureRecord('sand-bearing-450-square.json');
    fc.assert(
      fc.property(fc.tuple(...TEXT_SETTINGS.map(() => hostileText)), fc.double({ min: -500, max: -0.001, noNaN: true }), (texts, negative) => {
        const metadata = Object.fromEntries(TEXT_SETTINGS.map((s, i) => [s.path[1], texts[i].slice(0, 40)])); // within every field's limit
        const stages = base.stages.map((st, i) => (i === 1 ? { ...st, readings: st.readings.map((r) => ({ ...r, gauges: { ...r.gauges, g1: negative } })) } : st));
        const csv = recordToReadingsCsv({ ...base, metadata, stages });
        expect(unsafeCells(csv)).toEqual([]);
        const back = recordOf(readingsCsvToRecord(csv));
        // A setting is one line: control characters become spaces, and the ends are trimmed.
        // biome-ignore lint/suspicious/noControlCharactersInRegex: the characters the export replaces
        const expected = Object.fromEntries(Object.entries(metadata).map(([k, v]) => [k, v.replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ').trim()]));
        expect(back.metadata).toEqual({ ...base.metadata, ...expected });
        expect(back.stages[1].readings.every((r) => r.gauges.g1 === negative)).toBe(true);
      }),
      { numRuns: 150 },
    );
  }, 60_000);

  it('stage points CSV: hostile gauge names are neutral cells, negative settlements stay numbers', () => {
    const record = fixtureRecord('modulus-two-cycle-300.json');
    const points = reduceStages(toStageReadings(record), { kind: 'atTime', minutes: 2 }).map((p) => ({ ...p, settlementMm: -p.settlementMm - 0.5 }));
    fc.assert(
      fc.property(hostileText, (name) => {
        const csv = stagePointsToCsv(points, [name]);
        expect(unsafeCells(csv)).toEqual([]);
        const rows = parse(csv) as string[][];
        expect(rows[0][6].replace(/^'(?=[=+\-@\t\r'])/, '')).toBe(name);
        expect(rows.slice(1).map((r) => Number(r[4]))).toEqual(points.map((p) => p.settlementMm));
      }),
      { numRuns: 300 },
    );
  }, 60_000);
});
