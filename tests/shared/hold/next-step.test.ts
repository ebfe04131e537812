import { describe, expect, it } from 'vitest';
import { nextStepPrompt } from '@shared/hold/next-step';

const stage = (targetKpa: number) => ({ index: 3, branch: 'loading' as const, targetKpa });
/** An ideal jack: p = F / A_ram; kN / cm² → MPa is × 10. */
const idealRam = (ramCm2: number) => (forceKn: number) => (forceKn / ramCm2) * 10;
/** The calibration line F (kN) = 0.35 + 4.92·p (MPa) of DOMAIN §C10, inverted. */
const calibrationLine = (forceKn: number) => (forceKn - 0.35) / 4.92;

describe('nextStepPrompt', () => {
  it('converts the C10 target into plate force, jack force and ram pressure (DOMAIN §C10, calc)', () => {
    // 450 mm square plate (0.2025 m²), 100 kPa → 20.250 kN; apparatus 0.60 kN → jack 19.650 kN; ram 50 cm² → 3.9300 MPa.
    const prompt = nextStepPrompt({
      stage: stage(100),
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      forceToGaugePressure: idealRam(50),
      gaugeUnit: 'MPa',
    });
    expect(prompt).toMatchObject({ stageIndex: 3, branch: 'loading', targetKpa: 100, gaugeUnit: 'MPa', problem: null });
    expect(prompt.plateForceKn).toBeCloseTo(20.25, 9);
    expect(prompt.jackForceKn).toBeCloseTo(19.65, 9);
    expect(prompt.gaugePressure).toBeCloseTo(3.93, 9);
  });

  it('goes through the jack calibration passed in: F = 0.35 + 4.92·p → p = 3.9228 MPa (DOMAIN §C10, calc)', () => {
    const prompt = nextStepPrompt({
      stage: stage(100),
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      forceToGaugePressure: calibrationLine,
      gaugeUnit: 'MPa',
    });
    expect(prompt.gaugePressure).toBeCloseTo(3.9228, 4);
  });

  it('gives the DIN 300 mm plate at 0.5 MN/m²: 35.343 kN, 15.434 MPa on a 22.9 cm² ram (DOMAIN §C10, calc)', () => {
    const prompt = nextStepPrompt({ stage: stage(500), plate: { shape: 'circular', sizeMm: 300 }, forceToGaugePressure: idealRam(22.9), gaugeUnit: 'MPa' });
    expect(prompt.plateForceKn).toBeCloseTo(35.343, 3);
    expect(prompt.gaugePressure).toBeCloseTo(15.434, 3);
  });

  it('says so when the force is outside the calibrated range, instead of a number', () => {
    const prompt = nextStepPrompt({ stage: stage(100), plate: { shape: 'square', sizeMm: 450 }, forceToGaugePressure: () => null, gaugeUnit: 'bar' });
    expect(prompt.gaugePressure).toBeNull();
    expect(prompt.problem).toMatch(/outside the jack's calibrated range/);
    // A calibration that would give a negative pressure is out of range too.
    const low = nextStepPrompt({ stage: stage(1), plate: { shape: 'circular', sizeMm: 300 }, forceToGaugePressure: calibrationLine, gaugeUnit: 'MPa' });
    expect(low).toMatchObject({ gaugePressure: null });
  });

  it('prompts a full release when the apparatus alone reaches the target', () => {
    const unload = nextStepPrompt({
      stage: { index: 9, branch: 'unloading', targetKpa: 0 },
      plate: { shape: 'square', sizeMm: 450 },
      apparatusWeightKn: 0.6,
      forceToGaugePressure: calibrationLine,
      gaugeUnit: 'MPa',
    });
    expect(unload).toMatchObject({ jackForceKn: 0, gaugePressure: 0 });
    expect(unload.problem).toMatch(/Release the jack fully.*3\.0 kPa/);
    const seating = nextStepPrompt({ stage: stage(0), plate: { shape: 'square', sizeMm: 450 }, forceToGaugePressure: calibrationLine, gaugeUnit: 'MPa' });
    expect(seating).toMatchObject({ jackForceKn: 0, gaugePressure: 0, problem: null });
  });

  it('throws naming the field for bad input', () => {
    const base = { plate: { shape: 'square' as const, sizeMm: 450 }, forceToGaugePressure: calibrationLine, gaugeUnit: 'MPa' };
    expect(() => nextStepPrompt({ ...base, stage: stage(-5) })).toThrow(/^stage\.targetKpa:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), apparatusWeightKn: Number.NaN })).toThrow(/^apparatusWeightKn:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), plate: { shape: 'square', sizeMm: 0 } })).toThrow(/^plate\.sizeMm:/);
    expect(() => nextStepPrompt({ ...base, stage: stage(100), forceToGaugePressure: () => Number.NaN })).toThrow(/^forceToGaugePressure:/);
  });
});
