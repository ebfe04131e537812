import { describe, expect, it } from 'vitest';
import { SCENARIO_IDS, type SoilScenario, scenarioById } from '../../simulators/physics/scenarios';
import {
  consolidationDegree,
  consolidationTimeS,
  envelopePressureKpa,
  envelopeSettlementMm,
  equilibriumSettlementMm,
  failurePressureKpa,
  initialSoilState,
  relaxationModes,
  type SoilState,
  soilSettlementMm,
  stepSoil,
  timeFactor,
} from '../../simulators/physics/soil';

const MIN = 60;
const HOUR = 3600;

/** Holds q constant from a rested state under q0; returns settlement (since the start) at the asked times, s. */
function holdAt(soil: SoilScenario, q0: number, q: number, timesS: number[], stepS = 1): number[] {
  let state: SoilState = initialSoilState(soil, q0);
  const start = soilSettlementMm(state);
  let t = 0;
  return timesS.map((until) => {
    while (t < until - 1e-9) {
      const dt = Math.min(stepS, until - t);
      state = stepSoil(soil, state, q, dt);
      t += dt;
    }
    return soilSettlementMm(state) - start;
  });
}

function withoutCreep(soil: SoilScenario): SoilScenario {
  return { ...soil, creep: { ...soil.creep, mmPerLogCycleAtHalf: 0 } };
}

describe('load–settlement envelope (hyperbola q = s/(a + b·s), Kondner 1963)', () => {
  const { envelope } = scenarioById('dense-sand');

  it('rises towards q_ult but never reaches it', () => {
    const pressures = [1, 10, 100, 1_000, 100_000].map((s) => envelopePressureKpa(envelope, s));
    for (let i = 1; i < pressures.length; i++) expect(pressures[i]).toBeGreaterThan(pressures[i - 1]);
    for (const q of pressures) expect(q).toBeLessThan(envelope.qUltKpa);
    expect(pressures.at(-1)).toBeGreaterThan(0.99 * envelope.qUltKpa);
    expect(envelopeSettlementMm(envelope, envelope.qUltKpa)).toBe(Number.POSITIVE_INFINITY);
  });

  it('plots as a straight line s/q = a + b·s in the transformed axes (Kondner 1963)', () => {
    const a = 1 / envelope.initialStiffnessKpaPerMm;
    const b = 1 / envelope.qUltKpa;
    for (const s of [0.5, 2, 8, 30]) expect(s / envelopePressureKpa(envelope, s)).toBeCloseTo(a + b * s, 12);
  });

  it('starts with the initial stiffness 1/a and inverts exactly', () => {
    expect(envelopePressureKpa(envelope, 1e-6) / 1e-6).toBeCloseTo(envelope.initialStiffnessKpaPerMm, 3);
    for (const q of [50, 400, 850]) expect(envelopePressureKpa(envelope, envelopeSettlementMm(envelope, q))).toBeCloseTo(q, 9);
  });
});

describe('Terzaghi one-dimensional consolidation', () => {
  // Terzaghi consolidation theory, values as tabulated in soil-mechanics texts:
  // Tv = 0.197 → U = 50 %, Tv = 0.848 → U = 90 %.
  it('matches the tabulated U(Tv) on both branches', () => {
    expect(consolidationDegree(0.197)).toBeCloseTo(0.5, 2);
    expect(consolidationDegree(0.848)).toBeCloseTo(0.9, 3);
    // Tv = 0.287 → U = 60 %, the change-over between the branches (from memory).
    expect(consolidationDegree(0.287)).toBeCloseTo(0.6, 2);
    expect(consolidationDegree(0)).toBe(0);
  });

  it('rejects a negative time factor, naming it', () => {
    expect(() => consolidationDegree(-1)).toThrow(/"timeFactor"/);
  });

  it('the stepped modal solution follows the same published values', () => {
    const soil = withoutCreep(scenarioById('soft-clay'));
    if (soil.time.kind !== 'clay') throw new Error('soft-clay must be a clay scenario');
    const t50 = consolidationTimeS(soil.time, 0.5);
    const t90 = consolidationTimeS(soil.time, 0.9);
    expect(timeFactor(soil.time, t50)).toBeCloseTo(0.197, 2);
    expect(timeFactor(soil.time, t90)).toBeCloseTo(0.848, 3);

    const q0 = 5;
    const q = 100;
    const total = equilibriumSettlementMm(soil, q, q) - equilibriumSettlementMm(soil, q0, q0);
    const immediate = soil.time.immediateFraction * total;
    const [atStart, at50, at90] = holdAt(soil, q0, q, [1, t50, t90], 60);
    const degree = (s: number) => (s - immediate) / (total - immediate);
    expect(degree(atStart)).toBeLessThan(0.02);
    expect(degree(at50)).toBeCloseTo(0.5, 2);
    expect(degree(at90)).toBeCloseTo(0.9, 2);
  });

  it('clay scenarios need 12–48 h for 90 % consolidation, so a clay hold lasts about a day', () => {
    const clays = SCENARIO_IDS.map(scenarioById).filter((s) => s.time.kind === 'clay');
    expect(clays.length).toBeGreaterThanOrEqual(2);
    for (const clay of clays) {
      if (clay.time.kind !== 'clay') continue;
      const hours = consolidationTimeS(clay.time, 0.9) / HOUR;
      // "drainage length chosen so that 90 % takes 12–48 h" (reference §G, calc).
      expect(hours).toBeGreaterThanOrEqual(12);
      expect(hours).toBeLessThanOrEqual(48);
    }
  });

  it('mode weights sum to one', () => {
    for (const id of SCENARIO_IDS) {
      const sum = relaxationModes(scenarioById(id).time).reduce((total, mode) => total + mode.weight, 0);
      expect(sum).toBeCloseTo(1, 12);
    }
  });
});

describe('granular hold', () => {
  const sand = scenarioById('dense-sand');

  it('settles mostly within minutes, at a decaying rate', () => {
    const times = [1, 2, 4, 8, 16, 32].map((m) => m * MIN);
    const s = holdAt(sand, 10, 400, times);
    const rates = times.slice(1).map((t, i) => (s[i + 1] - s[i]) / ((t - times[i]) / MIN));
    for (let i = 1; i < rates.length; i++) expect(rates[i]).toBeLessThan(rates[i - 1]);
    // Below the 0.02 mm/min rule of thumb (common practice) well before half an hour.
    expect(rates.at(-1)).toBeLessThan(0.02);
    expect(s[3] / s[5]).toBeGreaterThan(0.95);
  });

  it('follows s_end − (s_end − s_0)·e^(−t/τ) for the delayed share', () => {
    const soil = withoutCreep(sand);
    if (soil.time.kind !== 'granular') throw new Error('dense-sand must be granular');
    const tau = soil.time.tauMin * MIN;
    const [s0, sTau, sEnd] = holdAt(soil, 10, 300, [1e-6, tau, 40 * tau]);
    expect((sEnd - sTau) / (sEnd - s0)).toBeCloseTo(Math.exp(-1), 3);
  });

  it('creeps more per log cycle of time the nearer q is to q_ult', () => {
    const creepOver = (q: number) => {
      const [s10, s100] = holdAt(sand, q, q, [10 * MIN, 100 * MIN], 10);
      return s100 - s10;
    };
    expect(creepOver(800)).toBeGreaterThan(3 * creepOver(300));
  });
});

describe('failure', () => {
  const loose = scenarioById('loose-sand');
  const qf = failurePressureKpa(loose.envelope);

  it('past R_f·q_ult the settlement rate stops decaying and stays above 0.02 mm/min', () => {
    const times = [60, 120, 240, 480].map((m) => m * MIN);
    const s = holdAt(loose, 10, qf * 1.05, times, 10);
    const rates = times.slice(1).map((t, i) => (s[i + 1] - s[i]) / ((t - times[i]) / MIN));
    for (const rate of rates) expect(rate).toBeGreaterThan(0.02);
    expect(rates[2] / rates[1]).toBeGreaterThan(0.97);
  });

  it('below R_f·q_ult the same soil comes to rest', () => {
    const times = [60, 120].map((m) => m * MIN);
    const s = holdAt(loose, 10, qf * 0.8, times, 10);
    expect((s[1] - s[0]) / 60).toBeLessThan(0.005);
  });
});

describe('unloading and reloading', () => {
  it('granular scenarios rebound 10–30 % of their settlement on release (common practice)', () => {
    for (const id of ['dense-sand', 'loose-sand']) {
      const soil = scenarioById(id);
      const qMax = 0.6 * soil.envelope.qUltKpa;
      const atMax = equilibriumSettlementMm(soil, qMax, qMax);
      const released = equilibriumSettlementMm(soil, 0, qMax);
      const rebound = (atMax - released) / atMax;
      expect(rebound).toBeGreaterThanOrEqual(0.1);
      expect(rebound).toBeLessThanOrEqual(0.3);
    }
  });

  it('reloading is stiffer than first loading and rejoins the virgin curve at the old maximum', () => {
    const soil = scenarioById('dense-sand');
    const qMax = 500;
    const step = 50;
    for (let q = 0; q < qMax; q += step) {
      const reload = equilibriumSettlementMm(soil, q + step, qMax) - equilibriumSettlementMm(soil, q, qMax);
      const virgin = equilibriumSettlementMm(soil, q + step, q + step) - equilibriumSettlementMm(soil, q, q);
      expect(reload).toBeLessThan(virgin);
    }
    expect(equilibriumSettlementMm(soil, qMax, qMax)).toBeCloseTo(equilibriumSettlementMm(soil, qMax, 0), 12);
  });

  it('compacted fill gives Ev2/Ev1 of 2–3 (common practice) over 0.3–0.7 of the maximum pressure', () => {
    const soil = scenarioById('compacted-fill');
    const max = 500; // DIN-type first loading to 0.5 MN/m²
    const s = (q: number, qMax: number) => equilibriumSettlementMm(soil, q, qMax);
    // Ev = 1.5·r·Δσ/Δs with the same Δσ on both loadings, so the ratio is Δs1/Δs2.
    const firstLoading = s(0.7 * max, 0.7 * max) - s(0.3 * max, 0.3 * max);
    const secondLoading = s(0.7 * max, max) - s(0.3 * max, max);
    const ratio = firstLoading / secondLoading;
    expect(ratio).toBeGreaterThanOrEqual(2);
    expect(ratio).toBeLessThanOrEqual(3);
  });

  it('settlement of a held load falls back along the unload curve after release', () => {
    const soil = withoutCreep(scenarioById('dense-sand'));
    let state = initialSoilState(soil, 10);
    for (let t = 0; t < 30 * MIN; t += 10) state = stepSoil(soil, state, 400, 10);
    const loaded = soilSettlementMm(state);
    for (let t = 0; t < 30 * MIN; t += 10) state = stepSoil(soil, state, 10, 10);
    expect(soilSettlementMm(state)).toBeCloseTo(equilibriumSettlementMm(soil, 10, 400), 3);
    expect(soilSettlementMm(state)).toBeLessThan(loaded);
  });
});

describe('scenarios', () => {
  it('has the named grounds and rejects an unknown one, naming "scenario"', () => {
    expect(SCENARIO_IDS).toEqual(expect.arrayContaining(['dense-sand', 'loose-sand', 'stiff-clay', 'soft-clay', 'compacted-fill']));
    expect(() => scenarioById('moon-dust')).toThrow(/"scenario".*dense-sand/);
  });

  it('keeps q_ult within the common-practice ranges for a 300 mm plate (reference §G)', () => {
    const ranges: Record<string, [number, number]> = {
      'dense-sand': [800, 1200],
      'loose-sand': [250, 400],
      'stiff-clay': [600, 900],
      'soft-clay': [120, 250],
    };
    for (const [id, [low, high]] of Object.entries(ranges)) {
      const { qUltKpa } = scenarioById(id).envelope;
      expect(qUltKpa).toBeGreaterThanOrEqual(low);
      expect(qUltKpa).toBeLessThanOrEqual(high);
    }
  });
});
