import { plateForceKn } from '@shared/domain/plate';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../simulators/physics/random';
import { gaugeReadingMm, Rig, type RigOptions } from '../../simulators/physics/rig';
import { scenarioById } from '../../simulators/physics/scenarios';

const MIN_MS = 60_000;

/** A rig on a hand-driven clock. */
function rigOn(scenario: string, options: Partial<RigOptions> = {}) {
  let t = 0;
  const rig = new Rig({ scenario: scenarioById(scenario), clock: { now: () => t }, random: seededRandom(42), ...options });
  return {
    rig,
    wait: (ms: number) => {
      t += ms;
    },
  };
}

function isMultipleOf(value: number, step: number): boolean {
  return Math.abs(value / step - Math.round(value / step)) < 1e-6;
}

describe('jack and pressure', () => {
  it('pumps to the oil pressure that puts the asked pressure on the plate', () => {
    const { rig, wait } = rigOn('dense-sand', { apparatusKn: 0.5 });
    rig.pumpToPlatePressure(200);
    expect(rig.snapshot().phase).toBe('pumping');
    wait(30_000);
    const state = rig.snapshot();
    expect(state.phase).toBe('holding');
    expect(rig.platePressureKpa(state.targetMpa, 'rising')).toBeCloseTo(200, 9);
    // A little has leaked and followed the plate since the target was reached.
    expect(state.platePressureKpa).toBeLessThan(200);
    expect(state.platePressureKpa).toBeGreaterThan(199);
    // Force from the jack plus the apparatus weight equals the plate force (shared plate geometry).
    expect(state.forceKn + 0.5).toBeCloseTo(plateForceKn(rig.scenario.plate, state.platePressureKpa), 6);
    // F = p × A × efficiency (reference §D.1): 80 mm ram, 0.98 on the rising branch.
    expect(state.forceKn).toBeCloseTo((state.oilMpa * 5027 * 0.98) / 1000, 6);
  });

  it('loses 1–3 % of its pressure per 10 min of a quiet hold (common practice)', () => {
    const { rig, wait } = rigOn('dense-sand');
    rig.pumpToPlatePressure(300);
    wait(10 * MIN_MS);
    const before = rig.snapshot().oilMpa;
    wait(10 * MIN_MS);
    const loss = 1 - rig.snapshot().oilMpa / before;
    expect(loss).toBeGreaterThanOrEqual(0.01);
    expect(loss).toBeLessThanOrEqual(0.03);
  });

  it('tops up to the last target, and releases to zero', () => {
    const { rig, wait } = rigOn('dense-sand');
    rig.pumpToOil(5);
    wait(30 * MIN_MS);
    expect(rig.snapshot().oilMpa).toBeLessThan(5 * 0.97);
    rig.topUp();
    wait(10_000);
    expect(rig.snapshot().oilMpa).toBeCloseTo(5, 1);
    rig.release();
    wait(10_000);
    expect(rig.snapshot()).toMatchObject({ phase: 'released', oilMpa: 0, branch: 'falling' });
    expect(() => rig.topUp()).toThrow(/"top-up"/);
  });

  it('keeps the pressure within tolerance with the maintainer on', () => {
    const { rig, wait } = rigOn('soft-clay', { maintainTolerance: 0.01 });
    rig.pumpToOil(1.2);
    for (let i = 0; i < 24 * 60; i++) {
      wait(MIN_MS);
      expect(rig.snapshot().oilMpa).toBeGreaterThan(1.2 * 0.985);
    }
  });

  it('cannot hold pressure once the soil fails: the plate runs away from the jack', () => {
    const { rig, wait } = rigOn('loose-sand');
    rig.pumpToPlatePressure(300);
    wait(10 * MIN_MS);
    const before = rig.snapshot().oilMpa;
    wait(10 * MIN_MS);
    expect(1 - rig.snapshot().oilMpa / before).toBeGreaterThan(0.03);
  });

  it('refuses pressures beyond the jack, naming the field', () => {
    const { rig } = rigOn('dense-sand');
    expect(() => rig.pumpToOil(80)).toThrow(/"gaugeMpa"/);
    expect(() => rig.pumpToPlatePressure(-5)).toThrow(/"pressureKpa"/);
    expect(() => rig.pumpToPlatePressure(1e6)).toThrow(/"pressureKpa"/);
  });

  it('reads the transducer within ±0.1 % of full scale, with real scatter', () => {
    const { rig, wait } = rigOn('dense-sand', { transducerFullScaleMpa: 40 });
    rig.pumpToOil(10);
    wait(60_000);
    const truth = rig.snapshot().oilMpa;
    const reads = Array.from({ length: 500 }, () => rig.readOilMpa());
    for (const value of reads) expect(Math.abs(value - truth)).toBeLessThanOrEqual(0.04 + 1e-12);
    expect(Math.max(...reads) - Math.min(...reads)).toBeGreaterThan(0.04);
  });
});

describe('gauges', () => {
  it('read in whole counts of their resolution, at most one count from the truth', () => {
    for (const resolutionMm of [0.01, 0.001]) {
      const { rig, wait } = rigOn('loose-sand', { gauges: [{ resolutionMm }] });
      rig.pumpToPlatePressure(150);
      for (let i = 0; i < 200; i++) {
        wait(3_000);
        const reading = rig.readGauge(1);
        const clean = rig.snapshot().gauges[0].readingMm;
        expect(isMultipleOf(reading, resolutionMm)).toBe(true);
        expect(Math.abs(reading - clean)).toBeLessThanOrEqual(resolutionMm * 1.000001);
      }
    }
  });

  it('quantises a position to the nearest count (pure reading function)', () => {
    const gauge = { travelMm: 25, resolutionMm: 0.01, startMm: 1, noiseCounts: 1 };
    expect(gaugeReadingMm(gauge, 1.234, 0)).toBe(2.23);
    expect(gaugeReadingMm(gauge, 1.236, 1)).toBe(2.25);
    expect(gaugeReadingMm(gauge, 30, 0)).toBe(25);
    expect(gaugeReadingMm(gauge, 30, 1)).toBe(25);
    expect(gaugeReadingMm(gauge, -5, -1)).toBe(0);
  });

  it('stop at the end of their travel while the plate keeps moving', () => {
    const { rig, wait } = rigOn('loose-sand', { gauges: [{ travelMm: 5, startMm: 1 }] });
    rig.pumpToPlatePressure(250);
    wait(20 * MIN_MS);
    const state = rig.snapshot();
    expect(state.gauges[0].plateMm).toBeGreaterThan(8);
    expect(state.gauges[0]).toMatchObject({ readingMm: 5, atStop: true });
    for (let i = 0; i < 50; i++) expect(rig.readGauge(1)).toBeLessThanOrEqual(5);
  });

  it('jump back on a reset while the plate does not move, then follow the plate again', () => {
    const { rig, wait } = rigOn('loose-sand', { gauges: [{ startMm: 1 }, { startMm: 1 }] });
    rig.pumpToPlatePressure(200);
    wait(15 * MIN_MS);
    const before = rig.snapshot();
    rig.resetGauge(1);
    const after = rig.snapshot();
    expect(before.gauges[0].readingMm).toBeGreaterThan(5);
    expect(after.gauges[0].readingMm).toBe(1);
    expect(after.gauges[0].resets).toBe(1);
    expect(after.settlementMm).toBe(before.settlementMm);
    expect(after.gauges[1].readingMm).toBe(before.gauges[1].readingMm);

    wait(15 * MIN_MS);
    const later = rig.snapshot();
    const plateMoved = later.gauges[0].plateMm - after.gauges[0].plateMm;
    expect(later.gauges[0].readingMm - 1).toBeCloseTo(plateMoved, 2);
  });

  it('refuses an unknown gauge number, naming "gauge"', () => {
    const { rig } = rigOn('dense-sand');
    expect(() => rig.resetGauge(4)).toThrow(/"gauge"/);
    expect(() => rig.readGauge(0)).toThrow(/"gauge"/);
  });

  it('show a tilt that grows with settlement on patchy ground', () => {
    const { rig, wait } = rigOn('loose-sand', { gauges: [{}, {}] });
    rig.pumpToPlatePressure(100);
    wait(20 * MIN_MS);
    const low = rig.snapshot();
    rig.pumpToPlatePressure(200);
    wait(20 * MIN_MS);
    const high = rig.snapshot();
    expect(high.tilt).toBeGreaterThan(low.tilt);
    // Opposite gauges differ by nonUniformity × mean settlement.
    const difference = high.gauges[0].plateMm - high.gauges[1].plateMm;
    expect(difference).toBeCloseTo(rig.scenario.nonUniformity * high.settlementMm, 6);
  });
});
