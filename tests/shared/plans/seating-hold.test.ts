import { describe, expect, it } from 'vitest';
import { seatingHoldMin } from '../../../shared/plans/stages';
import { PROCEDURE_PROFILES, SEATING_HOLD_MIN } from '../../../shared/procedures/profiles';
import { planInput } from '../../../shared/schemas/plans';

const base = { name: 'x', procedureId: 'custom', plate: { shape: 'circular', sizeMm: 300 }, seatingPressureKpa: 7, loading: { mode: 'list', pressuresKpa: [50, 100] }, unloadReload: { unloadKpa: [0], reload: { mode: 'none' } }, holdRule: { kind: 'fixed', durationMin: 2 }, readingSchedule: { kind: 'interval', everyMin: 1 }, termination: { maxSettlementMm: 25, maxHoldMin: 60 }, reaction: { kind: 'kentledge', capacityKn: 100 } };

describe('seating hold, a plan setting', () => {
  it('is what the plan says, and half a minute for a plan saved before the setting existed', () => {
    expect(seatingHoldMin(planInput.parse({ ...base, seatingHoldMin: 2 }))).toBe(2);
    expect(planInput.parse(base).seatingHoldMin).toBe(0.5);
    // A plan stored before the setting existed reads back without it.
    expect(seatingHoldMin({ ...planInput.parse(base), seatingHoldMin: undefined })).toBe(0.5);
  });

  it('is refused beyond an hour or below zero, naming the field', () => {
    const issue = planInput.safeParse({ ...base, seatingHoldMin: -1 }).error?.issues[0];
    expect(issue?.path).toEqual(['seatingHoldMin']);
    expect(planInput.safeParse({ ...base, seatingHoldMin: 61 }).success).toBe(false);
  });

  it('is among every procedure’s defaults', () => {
    for (const p of PROCEDURE_PROFILES) expect(p.defaults.seatingHoldMin).toBe(SEATING_HOLD_MIN);
  });
});
