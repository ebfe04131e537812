import { describe, expect, it } from 'vitest';
import { checkPlan } from '../../../shared/plans/checks';
import { defaultsForPlate } from '../../../shared/procedures/plate-rules';
import { findProfile } from '../../../shared/procedures/profiles';
import { type PlanInput, planInput } from '../../../shared/schemas/plans';

const modulus = findProfile('modulus-two-cycle')!;
const planFrom = (defaults: ReturnType<typeof defaultsForPlate>['defaults'], over: Partial<PlanInput> = {}): PlanInput =>
  planInput.parse({ name: 'x', procedureId: modulus.id, ...defaults, reaction: { kind: 'kentledge', capacityKn: 1000 }, ...over });
const codes = (plan: PlanInput) => checkPlan(plan, modulus).map((c) => c.code);

describe('plate-dependent defaults of the two-cycle modulus test', () => {
  // DIN 18134 family, from memory: σ0max 0.5 / 0.25 / 0.2 MN/m², stop at 5 / 8 / 13 mm for 300 / 600 / 762 mm plates.
  it.each([
    [300, 500, 5, [80, 160, 240, 320, 400, 500], [250, 125, 0]],
    [600, 250, 8, [40, 80, 120, 160, 200, 250], [125, 62.5, 0]],
    [762, 200, 13, [32, 64, 96, 128, 160, 200], [100, 50, 0]],
  ])('a %d mm plate loads to %d kPa and stops at %d mm', (sizeMm, maxKpa, stopMm, loads, unloads) => {
    const { defaults, sources } = defaultsForPlate(modulus, sizeMm);
    expect(defaults.plate.sizeMm).toBe(sizeMm);
    expect(defaults.loading).toEqual({ mode: 'list', pressuresKpa: loads });
    expect(Math.max(...loads)).toBe(maxKpa);
    expect(defaults.unloadReload.unloadKpa).toEqual(unloads);
    expect(defaults.termination.maxSettlementMm).toBe(stopMm);
    // The plate-dependent settings name the plate and the rule's source, once each.
    const stop = sources.filter((s) => s.setting === 'termination.maxSettlementMm');
    expect(stop).toEqual([{ setting: 'termination.maxSettlementMm', tag: 'from memory', text: expect.stringContaining(`${stopMm} mm on the ${sizeMm} mm plate`) }]);
    expect(sources.filter((s) => s.setting === 'loading')).toHaveLength(1);
    expect(codes(planFrom(defaults))).not.toContain('plate_rule_pressure');
    expect(codes(planFrom(defaults))).not.toContain('plate_rule_settlement');
  });

  it("leaves a profile without a plate rule as it is", () => {
    const bearing = findProfile('bearing-granular')!;
    const { defaults, sources } = defaultsForPlate(bearing, 600);
    expect({ ...defaults, plate: bearing.defaults.plate }).toEqual(bearing.defaults);
    expect(defaults.plate.sizeMm).toBe(600);
    expect(sources).toBe(bearing.sources);
  });
});

describe('plan checks against the plate rule', () => {
  it("warns when a 600 mm plate keeps the 300 mm plate's maximum and stop limit", () => {
    const plan = planFrom(defaultsForPlate(modulus, 300).defaults, { plate: { shape: 'circular', sizeMm: 600, thicknessMm: 25 } });
    const checks = checkPlan(plan, modulus);
    expect(checks.find((c) => c.code === 'plate_rule_pressure')).toMatchObject({ severity: 'warning', field: 'loading', message: expect.stringContaining('600 mm plate to 250 kPa') });
    expect(checks.find((c) => c.code === 'plate_rule_settlement')).toMatchObject({ severity: 'warning', field: 'termination.maxSettlementMm', message: expect.stringContaining('at 8 mm') });
  });

  it('warns when the plate is not one the rule names', () => {
    const plan = planFrom(defaultsForPlate(modulus, 450).defaults);
    expect(checkPlan(plan, modulus).find((c) => c.code === 'plate_rule_size')).toMatchObject({ field: 'plate.sizeMm', message: expect.stringContaining('300 / 600 / 762 mm') });
  });
});
