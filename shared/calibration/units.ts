/** Pressure units of jack gauges and transducers. 1 MPa = 10 bar = 1000 kPa; 1 bar = 100 kPa (reference §0). */
export const PRESSURE_UNITS = ['MPa', 'bar', 'kPa'] as const;
export type PressureUnit = (typeof PRESSURE_UNITS)[number];

const KPA_PER_UNIT: Record<PressureUnit, number> = { MPa: 1000, bar: 100, kPa: 1 };

export function isPressureUnit(unit: string): unit is PressureUnit {
  return (PRESSURE_UNITS as readonly string[]).includes(unit);
}

/** `value` in `from` expressed in `to`. */
export function convertPressure(value: number, from: PressureUnit, to: PressureUnit): number {
  return from === to ? value : (value * KPA_PER_UNIT[from]) / KPA_PER_UNIT[to];
}
