import { type Plate, plateAreaM2 } from '../domain/plate';
import { InterpretationInputError, requirePositive } from './input-checks';
import { fitLine } from './regression';

/** One plate's pressure at the common settlement. */
export interface HouselPlate {
  plate: Plate;
  /** Pressure on this plate at the common settlement, kPa. */
  pressureKpa: number;
}

/** Housel's constants: Q = A·m + P·n. */
export interface HouselFit {
  /** Bearing pressure m, kPa (kN/m²). */
  mKpa: number;
  /** Perimeter shear n, kN/m. */
  nKnPerM: number;
  /** R² of the straight line q = m + n·(P/A); 1 for two plates (exact solution). */
  r2: number;
  plates: number;
  formula: string;
  source: string;
}

/** A footing to which Housel's constants are applied. */
export type HouselFooting = { shape: 'square' | 'circular'; widthM: number } | { shape: 'rectangular'; widthM: number; lengthM: number };

/** Perimeter of a plate, m. */
function platePerimeterM(plate: Plate): number {
  const b = plate.sizeMm / 1000;
  return plate.shape === 'square' ? 4 * b : Math.PI * b;
}

/** Area (m²) and perimeter (m) of a footing. */
export function footingAreaAndPerimeter(footing: HouselFooting): { areaM2: number; perimeterM: number } {
  const b = requirePositive(footing.widthM, 'footing.widthM');
  if (footing.shape === 'circular') return { areaM2: (Math.PI * b * b) / 4, perimeterM: Math.PI * b };
  const l = footing.shape === 'rectangular' ? requirePositive(footing.lengthM, 'footing.lengthM') : b;
  return { areaM2: b * l, perimeterM: 2 * (b + l) };
}

/**
 * Housel (1929) perimeter–area method (reference §B.2 item 7): plates of different size loaded to the same
 * settlement carry Q = A·m + P·n. Dividing by A gives the straight line q = m + n·(P/A); two plates
 * solve it exactly, three or more are fitted by least squares on that line (each plate weighs equally).
 */
export function houselFit(plates: readonly HouselPlate[]): HouselFit {
  if (plates.length < 2) throw new InterpretationInputError('plates', `needs at least two plate sizes (got ${plates.length})`);
  const ratios = plates.map((p, i) => {
    requirePositive(p.plate.sizeMm, `plates[${i}].plate.sizeMm`);
    return platePerimeterM(p.plate) / plateAreaM2(p.plate);
  });
  const pressures = plates.map((p, i) => requirePositive(p.pressureKpa, `plates[${i}].pressureKpa`));
  const line = fitLine(ratios, pressures, 'plates');
  return {
    mKpa: line.intercept,
    nKnPerM: line.slope,
    r2: line.r2,
    plates: plates.length,
    formula: 'Q = A·m + P·n ⇔ q = m + n·(P/A)',
    source: 'Housel (1929) Univ. of Michigan Eng. Research Bull. 13',
  };
}

/** Load (kN) and mean pressure (kPa) a footing carries at the plates' common settlement: Q = A·m + P·n (Housel 1929). */
export function houselFootingLoad(fit: Pick<HouselFit, 'mKpa' | 'nKnPerM'>, footing: HouselFooting): { loadKn: number; pressureKpa: number } {
  const { areaM2, perimeterM } = footingAreaAndPerimeter(footing);
  const loadKn = areaM2 * fit.mKpa + perimeterM * fit.nKnPerM;
  return { loadKn, pressureKpa: loadKn / areaM2 };
}
