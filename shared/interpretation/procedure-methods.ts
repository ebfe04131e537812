import { findProfile, type ProcedureKind } from '../procedures/profiles';
import type { ReductionRule } from './reduction';

/** The groups of methods whose use depends on the procedure the test followed. */
export type MethodGroup = 'ultimate' | 'footing' | 'subgradeModulus' | 'deformationModuli' | 'elasticModulus' | 'cycles';

/** Whether a group is shown, and if not, why. */
export type Shown = { shown: true } | { shown: false; why: string };

/** How a test of one procedure is read: which methods apply, how stages are read, the settlement basis of k. */
export interface ProcedureReading {
  kind: ProcedureKind | 'unnamed';
  /** The procedure's name, or what stands for it when the record names none. */
  name: string;
  methods: Record<MethodGroup, Shown>;
  /** Which reading stands for each stage when the record does not say. */
  reduction: ReductionRule;
  /** Settlement at which k is read, mm, and the convention that fixes it. */
  kSettlement: { mm: number; basis: string };
  /** Which application of each load level gives the loading curve and k (1 = the first application). */
  kApplication: number;
  /** A note shown beside the methods when the procedure does not fix them; null otherwise. */
  note: string | null;
}

const SHOWN: Shown = { shown: true };
const hidden = (why: string): Shown => ({ shown: false, why });

/** 0.05 in in mm: the ASTM/AASHTO settlement basis of k. */
export const K_SETTLEMENT_ASTM_MM = 1.27;
/** 1.25 mm: the IS 9214 / IRC:58 / DIN 18134 settlement basis of k. */
export const K_SETTLEMENT_METRIC_MM = 1.25;

const ASTM_BASIS = { mm: K_SETTLEMENT_ASTM_MM, basis: '0.05 in = 1.27 mm (ASTM D1196 / AASHTO T 222 family)' };
const METRIC_BASIS = { mm: K_SETTLEMENT_METRIC_MM, basis: '1.25 mm (IS 9214 / IRC:58; DIN 18134 ks)' };

const NOT_TO_FAILURE = 'this procedure does not load the plate towards failure, so the bearing (ultimate and footing) methods are for bearing tests only';
const BEARING_NOT_K = 'k is read on pavement and modulus tests (a pavement procedure), not on a bearing test';
const EV_NEEDS = 'Ev1 and Ev2 need the two-cycle deformation-modulus procedure';
const NOT_REPEATED = 'only repeated-loading tests are split cycle by cycle';

/**
 * The reading of a test by its procedure (the profile the record names): bearing tests get the ultimate
 * pressure and the footing; pavement tests k (ASTM basis 0.05 in) and, when repeated, the per-cycle split;
 * the two-cycle modulus test Ev1/Ev2 (stages read 2 min after the target, as DIN 18134 practice has it).
 * A record that names no known procedure is shown every method, with a note to check each one applies.
 */
export function procedureReading(procedureId: string | null | undefined): ProcedureReading {
  const profile = procedureId ? findProfile(procedureId) : undefined;
  const endOfHold: ReductionRule = { kind: 'endOfHold' };
  const base = { reduction: endOfHold, kApplication: 1, note: null };
  switch (profile?.kind) {
    case 'bearing':
      return {
        ...base,
        kind: 'bearing',
        name: profile.name,
        kSettlement: METRIC_BASIS,
        methods: { ultimate: SHOWN, footing: SHOWN, elasticModulus: SHOWN, subgradeModulus: hidden(BEARING_NOT_K), deformationModuli: hidden(EV_NEEDS), cycles: hidden(NOT_REPEATED) },
      };
    case 'pavement': {
      const repeated = profile.defaults.unloadReload.repetitionsPerLevel > 1;
      return {
        ...base,
        kind: 'pavement',
        name: profile.name,
        kSettlement: ASTM_BASIS,
        methods: {
          ultimate: hidden(NOT_TO_FAILURE),
          footing: hidden(NOT_TO_FAILURE),
          elasticModulus: SHOWN,
          subgradeModulus: SHOWN,
          deformationModuli: hidden(EV_NEEDS),
          cycles: repeated ? SHOWN : hidden(NOT_REPEATED),
        },
      };
    }
    case 'modulus':
      return {
        ...base,
        kind: 'modulus',
        name: profile.name,
        reduction: { kind: 'atTime', minutes: 2 },
        kSettlement: METRIC_BASIS,
        methods: {
          ultimate: hidden(NOT_TO_FAILURE),
          footing: hidden(NOT_TO_FAILURE),
          elasticModulus: SHOWN,
          subgradeModulus: SHOWN,
          deformationModuli: SHOWN,
          cycles: hidden(NOT_REPEATED),
        },
      };
    default:
      return {
        ...base,
        kind: profile ? profile.kind : 'unnamed',
        name: profile?.name ?? (procedureId ? `procedure "${procedureId}" (not a known profile)` : 'no procedure named'),
        kSettlement: METRIC_BASIS,
        methods: { ultimate: SHOWN, footing: SHOWN, elasticModulus: SHOWN, subgradeModulus: SHOWN, deformationModuli: SHOWN, cycles: SHOWN },
        note: 'The procedure does not fix which methods apply: every method is shown; check that each suits how the test was run.',
      };
  }
}
