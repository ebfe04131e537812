/**
 * Closed loop through the simulator's soil model and the analysis: each scenario's ground is loaded as a
 * maintained-load bearing test would load it (seating, gauges zeroed, six increments to 60 % of its
 * asymptote, each held — an hour on sand, a day on clay — read on the √t schedule to 0.01 mm), the readings
 * become a record, and the analysis must find the envelope the scenario was built with.
 *
 * Tolerances, and why (each effect measured on these scenarios):
 * - asymptote −12 % … +3 %: creep grows as x/(1 − x) with x = q/q_ult, so the later increments settle more
 *   than the envelope and pull the fitted asymptote down (−4 % on dense sand, −9 % on loose sand and soft clay);
 * - initial stiffness ±15 %: the gauges are zeroed at the seating pressure, so every settlement misses the
 *   seating settlement (7 kPa over 1/a), which stiffens the start most on soft ground (+14 % on soft clay);
 *   on clay a day's hold leaves a few per cent of the consolidation undone;
 * - 0.01 mm reading resolution: below 0.5 % of the largest settlement in every scenario.
 * Before the zero correction the seating point entered the fit as a measurement (s/q = 0), which puts the
 * dense sand's asymptote outside these tolerances (checked below).
 */
import { analyzeRecord } from '@shared/interpretation/analyze-record';
import { type HyperbolicDetails, hyperbolicUltimate } from '@shared/interpretation/ultimate';
import type { TestRecord } from '@shared/records/schema';
import { describe, expect, it } from 'vitest';
import { SCENARIOS, type SoilScenario } from '../../simulators/physics/scenarios';
import { initialSoilState, soilSettlementMm, stepSoil } from '../../simulators/physics/soil';

const SEATING_KPA = 7;
const SQRT_SCHEDULE_MIN = [0, 1, 2.25, 4, 6.25, 9, 16, 25, 60, 120, 240, 480, 960, 1440];

/** The record a bearing test on this ground would give (the readings as the rig would store them). */
function bearingTestRecord(scenario: SoilScenario): TestRecord {
  const clay = scenario.time.kind === 'clay';
  const times = SQRT_SCHEDULE_MIN.filter((t) => t <= (clay ? 24 * 60 : 60));
  let state = stepSoil(scenario, initialSoilState(scenario, 0), SEATING_KPA, 300);
  const zero = soilSettlementMm(state); // the gauges are zeroed at the seating pressure
  const stages: TestRecord['stages'] = [{ index: 0, branch: 'seating', targetKpa: SEATING_KPA, readings: [{ tMin: 0, pressureKpa: SEATING_KPA, gauges: { g1: 0 } }] }];
  for (let k = 1; k <= 6; k++) {
    const q = Math.round((0.6 * scenario.envelope.qUltKpa * k) / 6);
    let t = 0;
    const readings = times.map((tMin) => {
      state = stepSoil(scenario, state, q, Math.max((tMin - t) * 60, 1e-3)); // the t = 0 reading: the immediate share
      t = tMin;
      return { tMin, pressureKpa: q, gauges: { g1: Math.round((soilSettlementMm(state) - zero) * 100) / 100 } };
    });
    stages.push({ index: k, branch: 'loading', targetKpa: q, readings });
  }
  return {
    format: 'settlescope-record',
    version: 1,
    plate: scenario.plate,
    plan: { procedureId: clay ? 'bearing-cohesive' : 'bearing-granular', seatingPressureKpa: SEATING_KPA },
    gauges: [{ key: 'g1' }],
    stages,
  };
}

describe('the analysis recovers each simulated ground’s envelope (soil model → record → analysis)', () => {
  for (const scenario of SCENARIOS.values()) {
    it(`${scenario.id}: asymptote ${scenario.envelope.qUltKpa} kPa, initial stiffness ${scenario.envelope.initialStiffnessKpaPerMm} kPa/mm`, () => {
      const analysis = analyzeRecord(bearingTestRecord(scenario));
      if (!analysis.ultimate.applies) return expect.fail(analysis.ultimate.reason);
      const hyperbolic = analysis.ultimate.result.find((m) => m.method === 'hyperbolic');
      const details = hyperbolic?.details as HyperbolicDetails;
      const asymptote = 1 / details.b;
      expect(asymptote / scenario.envelope.qUltKpa).toBeGreaterThan(0.88);
      expect(asymptote / scenario.envelope.qUltKpa).toBeLessThan(1.03);
      expect(Math.abs((details.initialStiffnessKpaPerMm as number) / scenario.envelope.initialStiffnessKpaPerMm - 1)).toBeLessThan(0.15);
      // Loaded to 60 % of the asymptote, the test does not fail: the asymptote is an extrapolation, q_ult ≥ q_max is carried.
      expect(hyperbolic?.standing).toBe('extrapolated');
      if (!analysis.chosenUltimate.applies) return expect.fail(analysis.chosenUltimate.reason);
      expect(analysis.chosenUltimate.result.basis).toBe('lowerBound');
    });
  }

  it('dense sand: with the seating point fitted as if it were a measurement, the asymptote falls outside the tolerance', () => {
    const scenario = SCENARIOS.get('dense-sand') as SoilScenario;
    const analysis = analyzeRecord(bearingTestRecord(scenario));
    const biased = hyperbolicUltimate(analysis.firstLoading).qUltKpa as number; // origin included as a point
    expect(biased / scenario.envelope.qUltKpa).toBeLessThan(0.88);
  });
});
