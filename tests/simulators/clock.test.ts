import { describe, expect, it } from 'vitest';
import { SimClock } from '../../simulators/clock';
import { seededRandom } from '../../simulators/physics/random';
import { Rig } from '../../simulators/physics/rig';
import { scenarioById } from '../../simulators/physics/scenarios';
import { consolidationDegree, equilibriumSettlementMm, timeFactor } from '../../simulators/physics/soil';

const DAY_MS = 24 * 3600 * 1000;

describe('time acceleration', () => {
  it('runs simulated time `speed` times faster than the injected wall clock', () => {
    let wall = 5_000;
    const clock = new SimClock({ speed: 60, wall: () => wall });
    expect(clock.now()).toBe(0);
    wall += 1_000;
    expect(clock.now()).toBe(60_000);
  });

  it('keeps simulated time continuous when the speed changes', () => {
    let wall = 0;
    const clock = new SimClock({ speed: 10, wall: () => wall });
    wall = 2_000;
    clock.setSpeed(1000);
    expect(clock.now()).toBe(20_000);
    wall = 3_000;
    expect(clock.now()).toBe(20_000 + 1_000_000);
  });

  it('rejects speeds outside ×1 … ×1000, naming "speed"', () => {
    expect(() => new SimClock({ speed: 0.5 })).toThrow(/"speed"/);
    expect(() => new SimClock({ speed: 5000 })).toThrow(/"speed"/);
    expect(() => new SimClock().setSpeed(Number.NaN)).toThrow(/"speed"/);
  });

  it('a 24-hour clay hold at ×1000 takes 86.4 s of wall time and consolidates as Terzaghi says', () => {
    let wall = 0;
    const clock = new SimClock({ speed: 1000, wall: () => wall });
    expect(clock.wallMsFor(DAY_MS)).toBe(86_400);

    const scenario = scenarioById('soft-clay');
    const rig = new Rig({ scenario, clock, random: seededRandom(3), maintainTolerance: 0.005 });
    rig.pumpToPlatePressure(100);
    const start = rig.snapshot();
    // The application polls a gauge every 200 ms of wall time.
    let polls = 0;
    while (wall < 86_400) {
      wall += 200;
      rig.readGauge(1);
      polls++;
    }
    const end = rig.snapshot();
    expect(polls).toBe(432);
    expect(end.simTimeS).toBeCloseTo(24 * 3600, 6);

    // Settlement since the load went on, against immediate share + U(Tv)·rest (Terzaghi) plus creep.
    if (scenario.time.kind !== 'clay') throw new Error('soft-clay must be a clay scenario');
    const q = end.platePressureKpa;
    const q0 = rig.platePressureKpa(0, 'rising');
    const total = equilibriumSettlementMm(scenario, q, q) - equilibriumSettlementMm(scenario, q0, q0);
    const immediate = scenario.time.immediateFraction;
    const expected = total * (immediate + (1 - immediate) * consolidationDegree(timeFactor(scenario.time, 24 * 3600)));
    const settled = end.settlementMm - start.settlementMm;
    expect(settled).toBeGreaterThan(expected * 0.97);
    expect(settled).toBeLessThan(expected * 1.1);
  });
});
