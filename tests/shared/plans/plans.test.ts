import { describe, expect, it } from 'vitest';
import { plateAreaM2, plateForceKn } from '../../../shared/domain/plate';
import { checkPlan } from '../../../shared/plans/checks';
import { buildStageSequence, loadingTargets } from '../../../shared/plans/stages';
import { PROCEDURE_PROFILES, findProfile } from '../../../shared/procedures/profiles';
import { type PlanInput, planInput } from '../../../shared/schemas/plans';

function planFor(profileId: string, over: Partial<PlanInput> = {}): PlanInput {
  const p = findProfile(profileId)!;
  return planInput.parse({ name: 'x', procedureId: p.id, ...p.defaults, reaction: { kind: 'kentledge', capacityKn: 1000 }, ...over });
}

describe('plate geometry', () => {
  // reference §B.1 areas [calc]: Ø300 0.070686 m², Ø762 0.456037, □450 0.2025.
  it.each([
    ['circular', 300, 0.070686],
    ['circular', 762, 0.456037],
    ['square', 450, 0.2025],
  ] as const)('%s %d mm has area %f m²', (shape, sizeMm, area) => {
    expect(plateAreaM2({ shape, sizeMm })).toBeCloseTo(area, 6);
  });
  // reference §C10 [calc]: DIN 300 mm plate at 0.5 MN/m² → 35.343 kN; 750 mm circular to 600 kPa → 265.07 kN.
  it('gives the force of a pressure', () => {
    expect(plateForceKn({ shape: 'circular', sizeMm: 300 }, 500)).toBeCloseTo(35.343, 3);
    expect(plateForceKn({ shape: 'circular', sizeMm: 750 }, 600)).toBeCloseTo(265.07, 2);
  });
});

describe('stage sequence', () => {
  it('follows the two-cycle modulus test: six stages to σ0max, three unloading stages, reload to the penultimate', () => {
    // reference §A.3/§A.4, DIN 18134 family (from memory): 0.08…0.50 MN/m², unload 0.25/0.125/0, reload to 0.40.
    const stages = buildStageSequence(planFor('modulus-two-cycle'));
    expect(stages.map((s) => `${s.branch[0]}${s.targetKpa}`)).toEqual([
      's10', 'l80', 'l160', 'l240', 'l320', 'l400', 'l500', 'u250', 'u125', 'u0', 'r80', 'r160', 'r240', 'r320', 'r400',
    ]);
    expect(stages.map((s) => s.index)).toEqual(stages.map((_, i) => i));
  });

  it('steps by the smaller of a fixed step and a fraction of the expected ultimate', () => {
    expect(loadingTargets({ mode: 'rule', fixedStepKpa: 100, fractionOfUltimate: 0.2, expectedUltimateKpa: 400, maxPressureKpa: 400 })).toEqual([80, 160, 240, 320, 400]);
    expect(loadingTargets({ mode: 'rule', fixedStepKpa: 50, fractionOfUltimate: 0.2, expectedUltimateKpa: 400, maxPressureKpa: 200 })).toEqual([50, 100, 150, 200]);
    expect(loadingTargets({ mode: 'rule', fixedStepKpa: 30, fractionOfUltimate: 0.1, expectedUltimateKpa: 1000, maxPressureKpa: 90 })).toEqual([30, 60, 90]);
  });

  it('repeats and releases each level for the repeated-loading pavement test', () => {
    const stages = buildStageSequence(planFor('pavement-repeated'));
    const atFirstLevel = stages.filter((s) => s.index > 0 && s.index <= 12);
    expect(atFirstLevel.map((s) => `${s.branch[0]}${s.targetKpa}#${s.repetition}`)).toEqual(
      [1, 2, 3, 4, 5, 6].flatMap((r) => [`l70#${r}`, `u0#${r}`]),
    );
    expect(stages).toHaveLength(1 + 3 * 12);
  });
});

describe('plan self-check', () => {
  it('accepts every profile’s defaults as a valid plan', () => {
    for (const p of PROCEDURE_PROFILES) expect(() => planFor(p.id)).not.toThrow();
  });

  it('sizes the reaction with a 20 % margin (common practice)', () => {
    // reference §C10 [calc]: 750 mm circular plate to 600 kPa → 265.07 kN; +20 % → 318.1 kN.
    const base = { plate: { shape: 'circular' as const, sizeMm: 750, thicknessMm: 25 }, loading: { mode: 'list' as const, pressuresKpa: [100, 200, 300, 400, 500, 600] } };
    const short = checkPlan(planFor('bearing-granular', { ...base, reaction: { kind: 'kentledge', capacityKn: 318, description: '' } }), findProfile('bearing-granular'));
    expect(short.map((c) => c.code)).toContain('reaction_capacity');
    const enough = checkPlan(planFor('bearing-granular', { ...base, reaction: { kind: 'kentledge', capacityKn: 318.2, description: '' } }), findProfile('bearing-granular'));
    expect(enough.map((c) => c.code)).not.toContain('reaction_capacity');
  });

  it('wants the pit five plate widths wide for a bearing test', () => {
    // IS 1888:1982 pit width ≥ 5 Bp (reference §A.2, seen in secondary texts). 450 mm plate → 2.25 m.
    const plan = planFor('bearing-granular');
    const codes = (w: number | null) => checkPlan(plan, findProfile(plan.procedureId), { pitWidthM: w, waterTableDepthM: null, testDepthM: 1 }).map((c) => c.code);
    expect(codes(2.2)).toContain('pit_width');
    expect(codes(2.25)).not.toContain('pit_width');
    expect(codes(null)).toContain('pit_width_unknown');
  });

  it('flags a plate outside the profile range, falling increments and seating above the first increment', () => {
    const plan = planFor('bearing-granular', { plate: { shape: 'square', sizeMm: 200, thicknessMm: 25 }, loading: { mode: 'list', pressuresKpa: [100, 90, 200, 300, 400] }, seatingPressureKpa: 120 });
    const codes = checkPlan(plan, findProfile(plan.procedureId)).map((c) => c.code);
    expect(codes).toEqual(expect.arrayContaining(['plate_size', 'increments_order', 'seating_pressure']));
  });
});
