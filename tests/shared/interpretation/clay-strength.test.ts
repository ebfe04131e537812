import { describe, expect, it } from 'vitest';
import { undrainedShearStrength } from '@shared/interpretation/clay-strength';
import { expectRel } from './tolerance';

// Computed by hand from c_u = (p_u − γz)/N_c with the N_c and γz rules of EN 1997-2 Annex K.1 (reference §B.2 item 6 [seen]).
describe('undrained shear strength from a plate in clay', () => {
  it('surface: N_c = 6, no overburden ⇒ 600/6 = 100 kPa', () => {
    const r = undrainedShearStrength({ ultimatePressureKpa: 600, plateDiameterMm: 300, setting: 'surface' });
    expect(r).toMatchObject({ nc: 6, ncRule: 'surface', overburdenKpa: 0 });
    expectRel(r.cuKpa, 100);
  });

  it('deep narrow borehole (z = 3 m > 4D, borehole 600 mm < 3D): (600 − 19·3)/9 = 60.333 kPa', () => {
    const r = undrainedShearStrength({ ultimatePressureKpa: 600, plateDiameterMm: 300, setting: 'borehole', depthM: 3, boreholeDiameterMm: 600, unitWeightKnM3: 19 });
    expect(r).toMatchObject({ nc: 9, ncRule: 'deepBorehole' });
    expectRel(r.overburdenKpa, 57);
    expectRel(r.cuKpa, 60.3333);
  });

  it('deep wide borehole (1000 mm ≥ 3D): no overburden ⇒ 600/9 = 66.667 kPa', () => {
    const r = undrainedShearStrength({ ultimatePressureKpa: 600, plateDiameterMm: 300, setting: 'borehole', depthM: 3, boreholeDiameterMm: 1000 });
    expect(r.overburdenKpa).toBe(0);
    expectRel(r.cuKpa, 66.6667);
  });

  it('shallow borehole (z = 1 m < 4D): the engineer must give N_c; with 7.5 ⇒ (600 − 19)/7.5 = 77.467 kPa', () => {
    const shallow = { ultimatePressureKpa: 600, plateDiameterMm: 300, setting: 'borehole', depthM: 1, boreholeDiameterMm: 600, unitWeightKnM3: 19 } as const;
    expect(() => undrainedShearStrength(shallow)).toThrow(/^nc: /);
    const r = undrainedShearStrength({ ...shallow, nc: 7.5 });
    expect(r.ncRule).toBe('engineer');
    expectRel(r.cuKpa, 77.4667);
  });

  it('names the missing or bad field', () => {
    const deep = { ultimatePressureKpa: 600, plateDiameterMm: 300, setting: 'borehole', depthM: 3 } as const;
    expect(() => undrainedShearStrength(deep)).toThrow(/boreholeDiameterMm: is required/);
    expect(() => undrainedShearStrength({ ...deep, boreholeDiameterMm: 600 })).toThrow(/unitWeightKnM3: is required/);
    expect(() => undrainedShearStrength({ ...deep, boreholeDiameterMm: 600, unitWeightKnM3: 19, ultimatePressureKpa: 50 })).toThrow(/ultimatePressureKpa: must exceed the overburden/);
    expect(() => undrainedShearStrength({ ultimatePressureKpa: -1, plateDiameterMm: 300, setting: 'surface' })).toThrow(/ultimatePressureKpa/);
  });
});
