import { describe, expect, it } from 'vitest';
import { jackGaugeFor } from '@shared/calibration/jack';
import type { Calibration } from '@shared/calibration/schema';
import { nextStepPrompt } from '@shared/hold/next-step';

const stage = (targetKpa: number) => ({ index: 3, branch: 'loading' as const, targetKpa });
const answer = (pressure: number) => ({ pressure, refusal: null });
/** An ideal jack: p = F / A_ram; kN / cm² → MPa is × 10. */
const idealRam = (ramCm2: number) => (forceKn: number) => answer((forceKn / ramCm2) * 10);
/** The calibration line F (kN) = 0.35 + 4.92·p (MPa) of reference §C10, as a certificate valid 0–70 MPa. */
const line = (range: [number, number] = [0, 70]): Calibration => ({ inputUnit: 'MPa', outputUnit: 'kN', curve: { kind: 'linear', c0: 0.35, c1: 4.92 }, range });
const calibrationLine = jackGaugeFor(line()).pressureFor;

describe('nextStepPrompt', () => {
  it('converts the C10 target into plate force, jack force and ram pressure (reference §C10, calc)', () => {
    // 450 mm square plate (0.2025 m²), 100 kPa → 20.250 kN; apparatus 0.60 kN → jack 19.650 kN; ram 50 cm² → 3.9300 MPa.
    const prompt = nextStepPrompt({
      stage: stage(100),
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      gaugePressureFor: idealRam(50),
      gaugeUnit: 'MPa',
    });
    expect(prompt).toMatchObject({ stageIndex: 3, branch: 'loading', targetKpa: 100, gaugeUnit: 'MPa', problem: null });
    expect(prompt.plateForceKn).toBeCloseTo(20.25, 9);
    expect(prompt.jackForceKn).toBeCloseTo(19.65, 9);
    expect(prompt.gaugePressure).toBeCloseTo(3.93, 9);
  });

  it('goes through the jack calibration passed in: F = 0.35 + 4.92·p → p = 3.9228 MPa (reference §C10, calc)', () => {
    const prompt = nextStepPrompt({
      stage: stage(100),
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      gaugePressureFor: calibrationLine,
      gaugeUnit: 'MPa',
    });
    expect(prompt.gaugePressure).toBeCloseTo(3.9228, 4);
  });

  it('gives the DIN 300 mm plate at 0.5 MN/m²: 35.343 kN, 15.434 MPa on a 22.9 cm² ram (reference §C10, calc)', () => {
    const prompt = nextStepPrompt({ stage: stage(500), plate: { shape: 'circular', sizeMm: 300 }, gaugePressureFor: idealRam(22.9), gaugeUnit: 'MPa' });
    expect(prompt.plateForceKn).toBeCloseTo(35.343, 3);
    expect(prompt.gaugePressure).toBeCloseTo(15.434, 3);
  });

  it('refuses a target beyond the jack calibration, saying what it needs and what to do', () => {
    // 600 mm plate, 1100 kPa: F = 1100 · π/4 · 0.6² = 311.02 kN → p = (311.02 − 0.35)/4.92 = 63.14 MPa (calc),
    // beyond a certificate valid to 50 MPa.
    const needed = (1100 * (Math.PI / 4) * 0.36 - 0.35) / 4.92;
    expect(needed).toBeCloseTo(63.14, 2);
    const plate = { shape: 'circular' as const, sizeMm: 600 };
    const prompt = nextStepPrompt({ stage: stage(1100), plate, gaugePressureFor: jackGaugeFor(line([0, 50])).pressureFor, gaugeUnit: 'MPa' });
    expect(prompt.gaugePressure).toBeNull();
    expect(prompt.problem).toBe('Target 1100 kPa needs 63.14 MPa on the jack gauge; the jack calibration is valid to 50 MPa. Go to unloading from here, or use a larger jack.');
    // The same in the unit the crew reads (1 MPa = 10 bar).
    const inBar = jackGaugeFor(line([0, 50]), { unit: 'bar' });
    expect(nextStepPrompt({ stage: stage(1100), plate, gaugePressureFor: inBar.pressureFor, gaugeUnit: inBar.unit }).problem).toMatch(/needs 631\.4 bar on the jack gauge; the jack calibration is valid to 500 bar/);
    // Within the calibration the prompt stands.
    expect(nextStepPrompt({ stage: stage(800), plate, gaugePressureFor: jackGaugeFor(line([0, 50])).pressureFor, gaugeUnit: 'MPa' })).toMatchObject({ problem: null });
  });

  it("refuses a target above the jack's rated pressure even where the calibration reaches", () => {
    const plate = { shape: 'circular' as const, sizeMm: 600 };
    const rated = jackGaugeFor(line([0, 70]), { ratedPressureMpa: 60 }).pressureFor;
    const prompt = nextStepPrompt({ stage: stage(1100), plate, gaugePressureFor: rated, gaugeUnit: 'MPa' });
    expect(prompt).toMatchObject({ gaugePressure: null, problem: 'Target 1100 kPa needs 63.14 MPa on the jack gauge; the jack is rated to 60 MPa. Go to unloading from here, or use a larger jack.' });
    // Both limits broken: the lower one is named.
    const both = jackGaugeFor(line([0, 62]), { ratedPressureMpa: 55 }).pressureFor;
    expect(nextStepPrompt({ stage: stage(1100), plate, gaugePressureFor: both, gaugeUnit: 'MPa' }).problem).toMatch(/rated to 55 MPa/);
    expect(nextStepPrompt({ stage: stage(800), plate, gaugePressureFor: rated, gaugeUnit: 'MPa' }).gaugePressure).toBeCloseTo((800 * (Math.PI / 4) * 0.36 - 0.35) / 4.92, 9);
  });

  it('refuses a force below the calibration, and says when there is no calibration at all', () => {
    // 1 kPa on a 300 mm plate is 0.071 kN, below the 0.35 kN the line gives at 0 MPa.
    const low = nextStepPrompt({ stage: stage(1), plate: { shape: 'circular', sizeMm: 300 }, gaugePressureFor: calibrationLine, gaugeUnit: 'MPa' });
    expect(low).toMatchObject({ gaugePressure: null, problem: expect.stringMatching(/below the jack calibration's range \(from 0 MPa\)/) });
    const none = nextStepPrompt({ stage: stage(100), plate: { shape: 'square', sizeMm: 450 }, gaugePressureFor: jackGaugeFor(null).pressureFor, gaugeUnit: 'bar' });
    expect(none).toMatchObject({ gaugePressure: null, problem: expect.stringMatching(/no calibrated jack/) });
  });

  it('prompts a full release when the apparatus alone reaches the target', () => {
    const unload = nextStepPrompt({
      stage: { index: 9, branch: 'unloading', targetKpa: 0 },
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      gaugePressureFor: calibrationLine,
      gaugeUnit: 'MPa',
    });
    expect(unload).toMatchObject({ jackForceKn: 0, gaugePressure: 0 });
    expect(unload.problem).toMatch(/Release the jack fully.*3\.0 kPa/);
    const seating = nextStepPrompt({ stage: stage(0), plate: { shape: 'square', sizeMm: 450 }, gaugePressureFor: calibrationLine, gaugeUnit: 'MPa' });
    expect(seating).toMatchObject({ jackForceKn: 0, gaugePressure: 0, problem: null });
  });

  it('throws naming the field for bad input', () => {
    const base = { plate: { shape: 'square' as const, sizeMm: 450 }, gaugePressureFor: calibrationLine, gaugeUnit: 'MPa' };
    expect(() => nextStepPrompt({ ...base, stage: stage(-5) })).toThrow(/^stage\.targetKpa:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), apparatusWeightKn: Number.NaN })).toThrow(/^apparatusWeightKn:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), plate: { shape: 'square', sizeMm: 0 } })).toThrow(/^plate\.sizeMm:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), gaugePressureFor: () => answer(Number.NaN) })).toThrow(/^gaugePressureFor:/);
  });
});
