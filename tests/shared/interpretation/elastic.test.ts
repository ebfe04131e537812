import { describe, expect, it } from 'vitest';
import { dinSecantModulus } from '@shared/interpretation/deformation-modulus';
import { DIN_IMPLIED_POISSON, elasticModulusFromEv, elasticModulusFromSettlement, rigidPlateModulus } from '@shared/interpretation/elastic';
import { expectRel } from './tolerance';

// reference §C9, computed from the formula (EN 1997-2 Annex K.2; Das, Bowles) [calc]: Δq = 0.2 MPa, Δs = 1.0 mm.
const step = { deltaPressureKpa: 200, deltaSettlementMm: 1.0 };

describe('elastic modulus from a rigid plate', () => {
  it('circular D = 300 mm, ν = 0.3: E = 42.883 MPa; undrained ν = 0.5: 35.343 MPa (reference §C9 [calc])', () => {
    const e = rigidPlateModulus({ plate: { shape: 'circular', sizeMm: 300 }, ...step, poisson: 0.3 });
    expectRel(e.eMpa, 42.883);
    expectRel(e.influenceFactor, Math.PI / 4, 1e-12);
    expect(e.source).toMatch(/EN 1997-2/);
    expectRel(rigidPlateModulus({ plate: { shape: 'circular', sizeMm: 300 }, ...step, poisson: 0.5 }).eMpa, 35.343);
  });

  it('square 300 mm: I = 0.82 → 44.772, 0.88 → 48.048, 0.886 → 48.388 MPa (reference §C9 [calc])', () => {
    const square = { plate: { shape: 'square', sizeMm: 300 }, ...step, poisson: 0.3 } as const;
    expectRel(rigidPlateModulus(square).eMpa, 44.772);
    expectRel(rigidPlateModulus({ ...square, squareInfluenceFactor: 0.88 }).eMpa, 48.048);
    expectRel(rigidPlateModulus({ ...square, squareInfluenceFactor: 0.886 }).eMpa, 48.388);
  });

  it('general form with any influence factor (flexible circle centre I = 1.00, reference §B.7 table)', () => {
    // [calc] E = 200·300·(1 − 0.09)·1.00/1.0/1000 = 54.6 MPa.
    expectRel(elasticModulusFromSettlement({ ...step, widthMm: 300, poisson: 0.3, influenceFactor: 1 }).eMpa, 54.6);
  });

  it('relation to DIN Ev: Ev = 45.000, factor (π/3)(1 − ν²) = 0.95295, implied ν = 0.21230 (reference §C9 [calc])', () => {
    expectRel(dinSecantModulus(300, 0.2, 1.0), 45.0);
    expectRel(elasticModulusFromEv(45, 0.3) / 45, 0.95295);
    expectRel(elasticModulusFromEv(45, 0.3), 42.883);
    expectRel(DIN_IMPLIED_POISSON, 0.2123);
    expectRel(elasticModulusFromEv(45, DIN_IMPLIED_POISSON), 45, 1e-12);
  });

  it('rejects ν outside 0–0.5 and non-positive steps, naming the field', () => {
    expect(() => rigidPlateModulus({ plate: { shape: 'circular', sizeMm: 300 }, ...step, poisson: 0.6 })).toThrow(/poisson/);
    expect(() => rigidPlateModulus({ plate: { shape: 'circular', sizeMm: 300 }, ...step, deltaSettlementMm: 0, poisson: 0.3 })).toThrow(/deltaSettlementMm/);
    expect(() => rigidPlateModulus({ plate: { shape: 'hexagon', sizeMm: 300 } as never, ...step, poisson: 0.3 })).toThrow(/plate\.shape/);
  });
});
