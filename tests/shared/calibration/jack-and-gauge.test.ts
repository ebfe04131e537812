import { describe, expect, it } from 'vitest';
import { plateForceKn } from '@shared/domain/plate';
import { calibrationSchema } from '@shared/calibration/schema';
import { gaugeSettlement, resetOffset, settlementSign } from '@shared/hold/gauge-reset';
import { createForceToGaugePressure, idealJackCalibration, idealJackForceKn, idealJackPressure, plateForceFromGaugeKn } from '@shared/calibration/jack';
import { convertPressure } from '@shared/calibration/units';

/** A table curve from [x, y] pairs. */
const table = (...pairs: [number, number][]) => ({ kind: 'table' as const, points: pairs.map(([x, y]) => ({ x, y })) });

const rel = (expected: number, digits = 1e-3) => expect.closeTo(expected, -Math.log10(Math.abs(expected) * digits));

describe('pressure units', () => {
  it('1 bar = 100 kPa, 1 MPa = 10 bar = 1000 kPa', () => {
    // reference §0 conversions [calc]: 1 bar = 100 kPa.
    expect(convertPressure(1, 'bar', 'kPa')).toBe(100);
    expect(convertPressure(3.93, 'MPa', 'bar')).toBeCloseTo(39.3, 12);
    expect(convertPressure(15434, 'kPa', 'MPa')).toBeCloseTo(15.434, 12);
    expect(convertPressure(7, 'bar', 'bar')).toBe(7);
  });
});

describe('reference §C10: hydraulic conversion', () => {
  // reference §C10 [calc]: 450 mm square plate (0.2025 m²) at 100 kPa → 20.250 kN; apparatus 0.60 kN →
  // jack 19.650 kN; ram 50 cm² → 3.9300 MPa = 39.30 bar; calibration F = 0.35 + 4.92·p → 3.9228 MPa.
  const total = plateForceKn({ shape: 'square', sizeMm: 450 }, 100);

  it('ideal ram: 20.250 kN less 0.60 kN → 3.9300 MPa = 39.30 bar', () => {
    expect(total).toEqual(rel(20.25));
    expect(idealJackPressure(total - 0.6, 50, 'MPa')).toEqual(rel(3.93));
    expect(idealJackPressure(total - 0.6, 50, 'bar')).toEqual(rel(39.3));
    const toGauge = createForceToGaugePressure(idealJackCalibration(50), { apparatusWeightKn: 0.6 });
    expect(toGauge(total)).toEqual(rel(3.93));
    expect(createForceToGaugePressure(idealJackCalibration(50, 'bar'), { apparatusWeightKn: 0.6 })(total)).toEqual(rel(39.3));
    expect(createForceToGaugePressure(idealJackCalibration(50), { apparatusWeightKn: 0.6, unit: 'bar' })(total)).toEqual(rel(39.3));
  });

  it('calibration line F = 0.35 + 4.92·p → 3.9228 MPa, and back to 20.250 kN on the plate', () => {
    const line = calibrationSchema.parse({ inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 } });
    const p = createForceToGaugePressure(line, { apparatusWeightKn: 0.6 })(total);
    expect(p).toEqual(rel(3.9228));
    expect(plateForceFromGaugeKn(line, p, { apparatusWeightKn: 0.6 })).toEqual(rel(20.25, 1e-9));
  });

  it('DIN 300 mm plate at 0.5 MN/m² → 35.343 kN; ram 22.9 cm² → 15.434 MPa (154 bar)', () => {
    // reference §C10 [calc].
    const force = plateForceKn({ shape: 'circular', sizeMm: 300 }, 500);
    expect(force).toEqual(rel(35.343));
    expect(idealJackPressure(force, 22.9, 'MPa')).toEqual(rel(15.434));
    expect(Math.round(idealJackPressure(force, 22.9, 'bar'))).toBe(154);
    expect(idealJackForceKn(15.434, 'MPa', 22.9)).toEqual(rel(35.343));
  });

  it('refuses a calibration that is not pressure → kN, and a force the apparatus alone exceeds', () => {
    const gauge = calibrationSchema.parse({ inputUnit: 'mm', outputUnit: 'mm', curve: { kind: 'linear', c0: 0, c1: 1 } });
    expect(() => createForceToGaugePressure(gauge)).toThrow(/"inputUnit"/);
    expect(() => createForceToGaugePressure({ ...gauge, inputUnit: 'bar' })).toThrow(/"outputUnit"/);
    expect(() => createForceToGaugePressure(idealJackCalibration(50), { apparatusWeightKn: 0.6 })(0.5)).toThrow(/below the apparatus weight/);
    expect(() => idealJackCalibration(0)).toThrow(/"ramAreaCm2"/);
  });

  it('uses the falling branch for unloading targets', () => {
    // Seal friction: unloading gives more force per bar than loading (reference §D.1 [CP]); invented table.
    const jack = calibrationSchema.parse({
      inputUnit: 'bar',
      outputUnit: 'kN',
      curve: table([0, 0], [100, 48], [200, 97]),
      fallingCurve: table([0, 0], [100, 52], [200, 101]),
    });
    expect(createForceToGaugePressure(jack)(72.5)).toBeCloseTo(150, 9);
    expect(createForceToGaugePressure(jack, { branch: 'falling' })(76.5)).toBeCloseTo(150, 9);
    expect(plateForceFromGaugeKn(jack, 150, { branch: 'falling', apparatusWeightKn: 1 })).toBeCloseTo(77.5, 9);
  });
});

describe('reference §C12: gauge reset and direction', () => {
  it('reading 24.30 → 1.15 at reset gives offset 23.15 mm; later 3.00 mm → 26.15 mm settlement', () => {
    // reference §C12 [calc/CP].
    const sign = settlementSign('retracts');
    const offset = resetOffset(24.3, 1.15, sign);
    expect(offset).toBeCloseTo(23.15, 12);
    expect(gaugeSettlement(3.0, 0, sign, [offset])).toBeCloseTo(26.15, 12);
    // Continuity: just before and just after the reset the settlement is the same.
    expect(gaugeSettlement(1.15, 0, sign, [offset])).toBeCloseTo(gaugeSettlement(24.3, 0, sign), 12);
  });

  it('the same test on a gauge whose stem extends: readings fall as the plate settles', () => {
    // C12 mirrored about a 25.00 mm zero [calc]: 0.70 → 23.85 at reset, later 22.00.
    const sign = settlementSign('extends');
    expect(sign).toBe(-1);
    const offset = resetOffset(0.7, 23.85, sign);
    expect(offset).toBeCloseTo(23.15, 12);
    expect(gaugeSettlement(22.0, 25.0, sign, [offset])).toBeCloseTo(26.15, 12);
  });
});
