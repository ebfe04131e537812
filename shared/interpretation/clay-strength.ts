import { InterpretationInputError, requireNonNegative, requirePositive } from './input-checks';

/** Where the plate was tested: at the surface (or in a pit wider than its influence) or in a borehole. */
export type PlateTestSetting = 'surface' | 'borehole';

/** Input of {@link undrainedShearStrength}. */
export interface ClayStrengthInput {
  /** Ultimate (failure) pressure of the plate, kPa. */
  ultimatePressureKpa: number;
  /** Plate diameter, mm. */
  plateDiameterMm: number;
  setting: PlateTestSetting;
  /** Depth of the plate below ground level, m. Needed for a borehole test. Default 0. */
  depthM?: number;
  /** Borehole diameter, mm; the overburden γz is subtracted only when it is below 3 plate diameters. */
  boreholeDiameterMm?: number;
  /** Total unit weight of the soil above the plate, kN/m³; needed when γz is subtracted. */
  unitWeightKnM3?: number;
  /**
   * Bearing capacity factor chosen by the engineer. Required in a borehole shallower than 4 plate
   * diameters, where the standard gives no value; otherwise overrides the rule of the standard.
   */
  nc?: number;
}

/** Undrained shear strength from a plate test in clay, with the terms used. */
export interface ClayStrengthResult {
  cuKpa: number;
  nc: number;
  ncRule: 'surface' | 'deepBorehole' | 'engineer';
  /** γ·z subtracted from the ultimate pressure, kPa (0 when not applicable). */
  overburdenKpa: number;
  formula: string;
  source: string;
}

const SURFACE_NC = 6;
const DEEP_NC = 9;
const DEEP_BOREHOLE_IN_DIAMETERS = 4;
const NARROW_BOREHOLE_IN_DIAMETERS = 3;

/**
 * Undrained shear strength of clay from a plate test, EN 1997-2 Annex K.1 (after Marsland 1972):
 * c_u = (p_u − γ·z)/N_c with N_c = 6 for a circular plate on the surface and N_c = 9 in a borehole
 * deeper than 4 plate diameters; γ·z is subtracted only in a borehole narrower than 3 plate diameters
 * (reference §B.2 item 6). Between the surface and 4 diameters the engineer must give N_c.
 */
export function undrainedShearStrength(input: ClayStrengthInput): ClayStrengthResult {
  const pu = requirePositive(input.ultimatePressureKpa, 'ultimatePressureKpa');
  const diameterM = requirePositive(input.plateDiameterMm, 'plateDiameterMm') / 1000;
  const depthM = requireNonNegative(input.depthM ?? 0, 'depthM');
  const inBorehole = input.setting === 'borehole';
  if (!inBorehole && input.setting !== 'surface') throw new InterpretationInputError('setting', 'must be "surface" or "borehole"');

  let nc: number;
  let ncRule: ClayStrengthResult['ncRule'];
  if (input.nc !== undefined) {
    [nc, ncRule] = [requirePositive(input.nc, 'nc'), 'engineer'];
  } else if (!inBorehole) {
    [nc, ncRule] = [SURFACE_NC, 'surface'];
  } else if (depthM > DEEP_BOREHOLE_IN_DIAMETERS * diameterM) {
    [nc, ncRule] = [DEEP_NC, 'deepBorehole'];
  } else {
    throw new InterpretationInputError('nc', `the standard gives N_c only on the surface (6) and deeper than ${DEEP_BOREHOLE_IN_DIAMETERS} plate diameters (9); give N_c for this depth`);
  }

  let overburdenKpa = 0;
  if (inBorehole) {
    if (input.boreholeDiameterMm === undefined) throw new InterpretationInputError('boreholeDiameterMm', 'is required for a borehole test');
    if (requirePositive(input.boreholeDiameterMm, 'boreholeDiameterMm') < NARROW_BOREHOLE_IN_DIAMETERS * input.plateDiameterMm) {
      if (input.unitWeightKnM3 === undefined) throw new InterpretationInputError('unitWeightKnM3', 'is required: γz is subtracted in a borehole narrower than 3 plate diameters');
      overburdenKpa = requirePositive(input.unitWeightKnM3, 'unitWeightKnM3') * depthM;
    }
  }
  if (pu <= overburdenKpa) throw new InterpretationInputError('ultimatePressureKpa', `must exceed the overburden γz = ${overburdenKpa} kPa`);
  return {
    cuKpa: (pu - overburdenKpa) / nc,
    nc,
    ncRule,
    overburdenKpa,
    formula: 'c_u = (p_u − γ·z)/N_c',
    source: 'EN 1997-2:2007 Annex K.1 (after Marsland 1972)',
  };
}
