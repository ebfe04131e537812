/** Plate geometry. Areas per reference §B.1: A = B² (square) or πD²/4 (circular). */
export const PLATE_SHAPES = ['circular', 'square'] as const;
export type PlateShape = (typeof PLATE_SHAPES)[number];

export interface Plate {
  shape: PlateShape;
  /** Diameter (circular) or side (square), mm. */
  sizeMm: number;
}

/** Bearing area of the plate in m². */
export function plateAreaM2(plate: Plate): number {
  const b = plate.sizeMm / 1000;
  return plate.shape === 'square' ? b * b : (Math.PI * b * b) / 4;
}

/** Force in kN on the plate at a mean pressure in kPa (kPa × m² = kN). */
export function plateForceKn(plate: Plate, pressureKpa: number): number {
  return pressureKpa * plateAreaM2(plate);
}

/** Mean pressure in kPa under a total plate force in kN. */
export function platePressureKpa(plate: Plate, forceKn: number): number {
  return forceKn / plateAreaM2(plate);
}
