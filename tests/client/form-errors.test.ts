import { planInput } from '@shared/schemas/plans';
import { projectInput } from '@shared/schemas/projects';
import { describe, expect, it } from 'vitest';
import { nearestField, readableErrors } from '../../client/src/lib/form-errors';

describe('nearestField', () => {
  const fields = ['loading.pressuresKpa', 'plate.sizeMm', 'name'];

  it('walks a server path up to the field the form shows', () => {
    expect(nearestField('loading.pressuresKpa.2', fields)).toBe('loading.pressuresKpa');
    expect(nearestField('plate.sizeMm', fields)).toBe('plate.sizeMm');
  });

  it('gives null for a path the form does not show', () => {
    expect(nearestField('reaction.capacityKn', fields)).toBeNull();
  });
});

describe('readable zod messages', () => {
  const messages = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
    Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));

  it('says "required" for an empty number and keeps the schema own messages', () => {
    const result = projectInput.safeParse({ code: '', name: 'x', organizationId: Number.NaN, site: 'y' }, readableErrors);
    expect(messages(result)).toMatchObject({ code: 'required', organizationId: 'required' });
  });

  it('states limits in words', () => {
    const result = planInput.shape.plate.safeParse({ shape: 'square', sizeMm: 50, thicknessMm: 25 }, readableErrors);
    expect(messages(result)).toEqual({ sizeMm: 'at least 100' });
  });
});
