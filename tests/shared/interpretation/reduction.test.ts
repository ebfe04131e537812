import { describe, expect, it } from 'vitest';
import { meanSettlement, planeFitTilt, reduceStages, type StageReadings, stageSettlementSeries, tiltBetweenGauges } from '@shared/interpretation/reduction';
import { expectRel } from './tolerance';

describe('gauge averaging and tilt', () => {
  it('two opposite gauges: mean and tilt (reference §C11, computed from the formula [calc])', () => {
    expectRel(meanSettlement([4.2, 3.4]), 3.8);
    const tilt = tiltBetweenGauges(4.2, 3.4, 280);
    expectRel(tilt.radians, 0.002857);
    expectRel(tilt.degrees, 0.1637);
    expectRel(tilt.oneIn, 350);
  });

  it('three gauges at 120°: plane-fit centre, gradient and tilt (reference §C11, computed from the formula [calc])', () => {
    const at = (deg: number, s: number) => ({ xMm: 140 * Math.cos((deg * Math.PI) / 180), yMm: 140 * Math.sin((deg * Math.PI) / 180), settlementMm: s });
    const plane = planeFitTilt([at(90, 3.9), at(210, 3.6), at(330, 3.3)]);
    expectRel(plane.centreMm, 3.6);
    expectRel(plane.gradientX, -0.001237);
    expectRel(plane.gradientY, 0.002143);
    expectRel(plane.tilt.radians, 0.002474);
    for (const r of plane.residualsMm) expect(Math.abs(r)).toBeLessThan(1e-12);
  });

  it('four gauges: the plane centre is the mean and the residual shows dishing', () => {
    // Constructed [calc]: gauges at (±100, 0) and (0, ±100) on the plane s = 2 + 0.001x + 0.002y, with the
    // x-pair raised by 0.05 mm and the y-pair lowered by 0.05 mm (a saddle). With symmetric positions the
    // normal equations decouple: c0 = mean = 2, cx = Σxs/Σx² = 0.001, cy = 0.002; residuals ±0.05.
    const plane = planeFitTilt([
      { xMm: 100, yMm: 0, settlementMm: 2.1 + 0.05 },
      { xMm: -100, yMm: 0, settlementMm: 1.9 + 0.05 },
      { xMm: 0, yMm: 100, settlementMm: 2.2 - 0.05 },
      { xMm: 0, yMm: -100, settlementMm: 1.8 - 0.05 },
    ]);
    expectRel(plane.centreMm, 2, 1e-12);
    expectRel(plane.gradientX, 0.001, 1e-9);
    expectRel(plane.gradientY, 0.002, 1e-9);
    expect(plane.residualsMm.map((r) => +r.toFixed(12))).toEqual([0.05, 0.05, -0.05, -0.05]);
  });

  it('a level plate has no "1 in N"', () => {
    expect(tiltBetweenGauges(2, 2, 300)).toEqual({ radians: 0, degrees: 0, oneIn: null });
  });

  it('rejects too few or collinear gauges and a zero separation, naming the field', () => {
    expect(() => planeFitTilt([{ xMm: 0, yMm: 0, settlementMm: 1 }, { xMm: 1, yMm: 0, settlementMm: 1 }])).toThrow(/gauges: a plane needs at least three gauges/);
    const collinear = [0, 100, 200].map((x) => ({ xMm: x, yMm: 0, settlementMm: 1 }));
    expect(() => planeFitTilt(collinear)).toThrow(/gauges: the points do not determine the fit/);
    expect(() => tiltBetweenGauges(1, 2, 0)).toThrow(/separationMm/);
    expect(() => meanSettlement([])).toThrow(/gauges: needs at least one gauge/);
  });
});

describe('reduceStages', () => {
  const stage: StageReadings = {
    index: 2,
    branch: 'loading',
    targetKpa: 100,
    readings: [
      { tMin: 0, pressureKpa: 99, gauges: [1.0, 1.2] },
      { tMin: 1, pressureKpa: 100, gauges: [1.4, 1.6] },
      { tMin: 2, pressureKpa: 100, gauges: [1.6, 1.8] },
      { tMin: 4, pressureKpa: 98, gauges: [1.8, 2.2] },
    ],
  };

  it('end of hold takes the last reading and the mean of its gauges', () => {
    const [p] = reduceStages([stage]);
    expect(p).toMatchObject({ index: 2, branch: 'loading', pressureKpa: 98, gaugesMm: [1.8, 2.2], tMin: 4, cutShort: false });
    expectRel(p.settlementMm, 2.0, 1e-12);
  });

  it('a fixed time interpolates linearly between the readings around it', () => {
    // At 3 min, halfway between the 2 and 4 min readings [calc]: q = 99, gauges 1.7 and 2.0, mean 1.85.
    const [p] = reduceStages([stage], { kind: 'atTime', minutes: 3 });
    expectRel(p.pressureKpa, 99, 1e-12);
    expectRel(p.gaugesMm[0], 1.7, 1e-12);
    expectRel(p.gaugesMm[1], 2.0, 1e-12);
    expectRel(p.settlementMm, 1.85, 1e-12);
    expect(p.tMin).toBe(3);
  });

  it('a fixed time after the stage ended uses the last reading and says so', () => {
    const [p] = reduceStages([stage], { kind: 'atTime', minutes: 10 });
    expect(p.cutShort).toBe(true);
    expect(p.tMin).toBe(4);
  });

  it('gives the stage time series of mean settlement', () => {
    expect(stageSettlementSeries(stage).map((r) => [r.tMin, +r.settlementMm.toFixed(12)])).toEqual([
      [0, 1.1],
      [1, 1.5],
      [2, 1.7],
      [4, 2.0],
    ]);
  });

  it('rejects empty stages, uneven gauge counts, unordered times and early fixed times, naming the field', () => {
    expect(() => reduceStages([{ ...stage, readings: [] }])).toThrow(/stages\[0\]\.readings: the stage has no readings/);
    const uneven = { ...stage, readings: [stage.readings[0], { tMin: 1, pressureKpa: 100, gauges: [1] }] };
    expect(() => reduceStages([uneven])).toThrow(/stages\[0\]\.readings\[1\]\.gauges/);
    const unordered = { ...stage, readings: [stage.readings[1], stage.readings[0]] };
    expect(() => reduceStages([unordered])).toThrow(/stages\[0\]\.readings\[1\]\.tMin: readings must be in time order/);
    const late = { ...stage, readings: stage.readings.slice(2) };
    expect(() => reduceStages([late], { kind: 'atTime', minutes: 1 })).toThrow(/rule\.minutes/);
    const nan = { ...stage, readings: [{ tMin: 0, pressureKpa: 100, gauges: [1, Number.NaN] }] };
    expect(() => reduceStages([nan])).toThrow(/stages\[0\]\.readings\[0\]\.gauges\[1\]/);
  });
});
