/**
 * Invented test records for demos and tests (not check values): each stage's settlement moves from its
 * start to its end value as s(t) = start + Δ·(1 − f + f·h(t)/h(T)), h(t) = t/(t + τ), i.e. a share
 * 1 − f at once and f over the hold; end values follow a hyperbola q = s/(a + b·s) on (re)loading and a
 * straight rebound on unloading. Gauges read that settlement on a slightly tilted plane, to 0.01 mm.
 */
import type { Branch } from '@shared/plans/stages';
import type { RecordGauge, TestRecord } from '@shared/records/schema';

/** Settlement (mm) on the hyperbola q = s/(a + b·s), i.e. s = a·q/(1 − b·q). */
export const hyperbolaSettlement = (a: number, b: number, qKpa: number) => (a * qKpa) / (1 - b * qKpa);

interface StagePlan {
  branch: Branch;
  targetKpa: number;
  endMm: number;
  timesMin: readonly number[];
}

interface Scenario {
  gauges: RecordGauge[];
  stages: StagePlan[];
  /** Share of a stage's settlement change that happens during the hold. */
  holdShare: number;
  tauMin: number;
  /** Plate tilt growing with settlement: a gauge at x reads s·(1 + tilt·x), tilt in 1/mm. */
  tilt: number;
}

/** x rounded to `digits` decimals, never −0. */
const fixed = (x: number, digits: number) => Number(x.toFixed(digits)) + 0;

/** Builds the readings of every stage of a scenario. */
function buildStages(scenario: Scenario): TestRecord['stages'] {
  let start = 0;
  return scenario.stages.map((plan, index) => {
    const hold = plan.timesMin[plan.timesMin.length - 1];
    const h = (t: number) => t / (t + scenario.tauMin);
    const delta = plan.endMm - start;
    const readings = plan.timesMin.map((t, k) => {
      const s = start + delta * (1 - scenario.holdShare + (hold > 0 ? (scenario.holdShare * h(t)) / h(hold) : scenario.holdShare));
      // A little load drift, topped up; deterministic so that the files can be regenerated.
      const pressureKpa = Math.max(0, fixed(plan.targetKpa * (1 - 0.004 * ((k % 4) / 3)), 1));
      const gauges = Object.fromEntries(scenario.gauges.map((g) => [g.key, fixed(s * (1 + scenario.tilt * (g.xMm ?? 0)), 2)]));
      return { tMin: t, pressureKpa, gauges };
    });
    start = plan.endMm;
    return { index, branch: plan.branch, targetKpa: plan.targetKpa, readings };
  });
}

/** IS 1888-style reading times (√t-friendly) to `holdMin`. */
function rootTimeSchedule(holdMin: number): number[] {
  const times = [0, 1, 2.25, 4, 6.25, 9, 16, 25, 36, 49, 64].filter((t) => t < holdMin);
  for (let t = 75; t < holdMin; t += 15) times.push(t);
  return [...times, holdMin];
}

/** Maintained-load bearing test on medium dense sand, 450 mm square plate, to 600 kPa, then unloaded (invented site). */
export function sandBearingRecord(): TestRecord {
  const [a, b] = [0.01, 0.00125];
  const seating = hyperbolaSettlement(a, b, 7);
  const targets = [100, 200, 300, 400, 500, 600];
  const loadEnd = (q: number) => fixed(hyperbolaSettlement(a, b, q) - seating, 3);
  const peak = loadEnd(600);
  const stages: StagePlan[] = [
    { branch: 'seating', targetKpa: 7, endMm: 0, timesMin: [0, 1, 2, 5] },
    ...targets.map((q) => ({ branch: 'loading' as const, targetKpa: q, endMm: loadEnd(q), timesMin: rootTimeSchedule(q === 600 ? 90 : 60) })),
    ...[300, 0].map((q) => ({ branch: 'unloading' as const, targetKpa: q, endMm: fixed(peak - 0.004 * (600 - q), 3), timesMin: rootTimeSchedule(30) })),
  ];
  const gauges: RecordGauge[] = [
    { key: 'g1', label: 'East dial', xMm: 200, yMm: 0 },
    { key: 'g2', label: 'West dial', xMm: -200, yMm: 0 },
    { key: 'g3', label: 'North dial', xMm: 0, yMm: 200 },
    { key: 'g4', label: 'South dial', xMm: 0, yMm: -200 },
  ];
  return {
    format: 'settlescope-record',
    version: 1,
    metadata: {
      project: 'Brackenford logistics shed',
      client: 'Halloway Estates Ltd',
      site: 'Plot 4, Brackenford Business Park',
      pit: 'TP-03',
      testDate: '2024-05-14',
      crew: 'R. Okafor, L. Brandt',
      weather: 'Dry, overcast, 14 °C',
    },
    plate: { shape: 'square', sizeMm: 450 },
    plan: { procedureId: 'bearing-granular', seatingPressureKpa: 7, holdRule: { kind: 'rate', maxRateMmPerMin: 0.02, windowMin: 10, minHoldMin: 60 } },
    ground: { description: 'Medium dense silty sand', testDepthM: 1.0, waterTableBelowTestM: 4.5 },
    footing: {
      shape: 'square',
      widthM: 1.5,
      soilBehaviour: 'cohesionless',
      foundationDepthM: 1.0,
      unitWeightKnM3: 18,
      permissibleSettlementMm: 25,
      factorOfSafety: 3,
    },
    gauges,
    stages: buildStages({ gauges, stages, holdShare: 0.15, tauMin: 5, tilt: 0.0004 }),
    events: [
      { stage: 0, tMin: 5, kind: 'note', text: 'Seating pressure applied and released; gauges zeroed under the seating load.' },
      { stage: 5, tMin: 25, kind: 'top-up', text: 'Pump topped up: pressure back to target.' },
      { stage: 6, tMin: 40, kind: 'weather', text: 'Light drizzle; pit covered with a tarpaulin.' },
    ],
  };
}

/** Two-cycle deformation-modulus test (DIN 18134 pattern) on a crushed-rock sub-base, 300 mm circular plate (invented site). */
export function modulusTwoCycleRecord(): TestRecord {
  const seating = hyperbolaSettlement(0.0025, 1 / 1500, 10);
  const firstLoading = (q: number) => fixed(hyperbolaSettlement(0.0025, 1 / 1500, q) - seating, 3);
  const peak = firstLoading(500);
  const residual = fixed(peak - 0.0008 * 500, 3);
  const times = [0, 0.5, 1, 1.5, 2];
  const stages: StagePlan[] = [
    { branch: 'seating', targetKpa: 10, endMm: 0, timesMin: [0, 0.5] },
    ...[80, 160, 240, 320, 400, 500].map((q) => ({ branch: 'loading' as const, targetKpa: q, endMm: firstLoading(q), timesMin: times })),
    ...[250, 125, 0].map((q) => ({ branch: 'unloading' as const, targetKpa: q, endMm: fixed(peak - 0.0008 * (500 - q), 3), timesMin: times })),
    ...[80, 160, 240, 320, 400].map((q) => ({
      branch: 'reloading' as const,
      targetKpa: q,
      endMm: fixed(residual + hyperbolaSettlement(0.0016, 0.0003, q), 3),
      timesMin: times,
    })),
  ];
  const gauges: RecordGauge[] = [{ key: 's1', label: 'Lever-arm probe', xMm: 0, yMm: 0 }];
  return {
    format: 'settlescope-record',
    version: 1,
    metadata: {
      project: 'Millbrook cycleway',
      client: 'Millbrook Town Council',
      site: 'Chainage 0+420',
      pit: 'PLT-07',
      testDate: '2024-07-02',
      crew: 'S. Varga',
      weather: 'Sunny, 21 °C',
    },
    plate: { shape: 'circular', sizeMm: 300 },
    plan: { procedureId: 'modulus-two-cycle', seatingPressureKpa: 10, holdRule: { kind: 'fixed', durationMin: 2 }, reduction: { kind: 'atTime', minutes: 2 } },
    ground: { description: 'Compacted crushed-rock sub-base, 250 mm' },
    gauges,
    stages: buildStages({ gauges, stages, holdShare: 0.03, tauMin: 0.5, tilt: 0 }),
    events: [{ stage: 0, tMin: 0.5, kind: 'note', text: 'Preload 0.01 MN/m² for 30 s, probe zeroed.' }],
  };
}

/**
 * A week-long maintained-load test on clay: 600 mm circular plate, seven 24-hour holds read every
 * `everyMin` minutes (default 1: 10,087 readings), two gauges.
 */
export function weekLongClayRecord(everyMin = 1): TestRecord {
  const [a, b] = [0.02, 1 / 400];
  const hold = 24 * 60;
  const times = Array.from({ length: Math.floor(hold / everyMin) + 1 }, (_, i) => i * everyMin);
  const stages: StagePlan[] = [
    { branch: 'seating', targetKpa: 7, endMm: 0, timesMin: [0, 1, 2, 5, 10] },
    ...[40, 80, 120, 160, 200, 240, 280].map((q) => ({
      branch: 'loading' as const,
      targetKpa: q,
      endMm: fixed(hyperbolaSettlement(a, b, q), 3),
      timesMin: times,
    })),
  ];
  const gauges: RecordGauge[] = [
    { key: 'a', xMm: 270, yMm: 0 },
    { key: 'b', xMm: -270, yMm: 0 },
  ];
  return {
    format: 'settlescope-record',
    version: 1,
    plate: { shape: 'circular', sizeMm: 600 },
    footing: { shape: 'square', widthM: 2.5, soilBehaviour: 'cohesive' },
    gauges,
    stages: buildStages({ gauges, stages, holdShare: 0.4, tauMin: 120, tilt: 0.0002 }),
  };
}

export const round2 = (x: number) => Math.round(x * 100) / 100;

/** A record of one reading per stage (read to 0.01 mm), under a named procedure. */
export function pointRecord(procedureId: string | undefined, plate: TestRecord['plate'], stages: readonly [Branch, number, number][], footing?: TestRecord['footing']): TestRecord {
  return {
    format: 'settlescope-record',
    version: 1,
    plate,
    ...(procedureId ? { plan: { procedureId } } : {}),
    ...(footing ? { footing } : {}),
    gauges: [{ key: 'g1' }],
    stages: stages.map(([branch, q, s], index) => ({ index, branch, targetKpa: q, readings: [{ tMin: 2, pressureKpa: q, gauges: { g1: round2(s) } }] })),
  };
}

export const steps = (from: number, to: number, step: number) => Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);

/** A small deterministic generator (LCG, Numerical Recipes constants) for the property tests. */
export function lcg(seed: number) {
  let x = seed >>> 0;
  return () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 32;
  };
}

/** The straight line: s = (q − 7)/60 read to 0.01 mm, 50 to 600 kPa on a 450 mm square plate, bearing procedure [calc]. */
export function straightLineTo600(): TestRecord {
  return pointRecord('bearing-granular', { shape: 'square', sizeMm: 450 }, [
    ['seating', 7, 0],
    ...steps(50, 600, 50).map((q) => ['loading', q, (q - 7) / 60] as [Branch, number, number]),
  ]);
}

/** A single-loading pavement test on a circular plate: s = (q − 7)/50, the profile's six increments [calc]. */
export function pavementTest(sizeMm: number): TestRecord {
  return pointRecord('pavement-single', { shape: 'circular', sizeMm }, [
    ['seating', 7, 0],
    ...[35, 70, 105, 140, 175, 210].map((q) => ['loading', q, (q - 7) / 50] as [Branch, number, number]),
  ]);
}

/**
 * A repeated-loading pavement test [calc]: three levels, six applications each; application r of level q
 * settles q/50 + 0.05·(r − 1) + 0.3·level, and each release leaves 40 % of that.
 */
export const REPEATED_LOADING = {
  levels: [70, 140, 210],
  loaded: (q: number, level: number, r: number) => q / 50 + 0.05 * (r - 1) + 0.3 * level,
} as const;

export function repeatedLoadingTest(): TestRecord {
  const stages: [Branch, number, number][] = [['seating', 7, 0]];
  REPEATED_LOADING.levels.forEach((q, level) => {
    for (let r = 1; r <= 6; r++) {
      stages.push(['loading', q, REPEATED_LOADING.loaded(q, level, r)]);
      stages.push(['unloading', 0, 0.4 * REPEATED_LOADING.loaded(q, level, r)]);
    }
  });
  return pointRecord('pavement-repeated', { shape: 'circular', sizeMm: 762 }, stages);
}
