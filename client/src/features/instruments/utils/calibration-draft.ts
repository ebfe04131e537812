import type { CalibrationCurve, CalibrationUnit } from '@shared/calibration/schema';
import type { CalibrationRecordInput, InstrumentKind } from '@shared/schemas/instruments';
import { formatDate } from '../../../lib/format';

export type CurveKind = CalibrationCurve['kind'];

/** One curve as the form edits it: the fields of every kind are kept, so switching kind loses nothing. */
export interface CurveDraft {
  kind: CurveKind;
  c0: number | null;
  c1: number | null;
  coefficients: number[];
  points: { x: number | null; y: number | null }[];
}

/** The calibration form's values; `toCalibrationInput` turns them into what the server takes. */
export interface CalibrationDraft {
  calibratedOn: string;
  dueOn: string;
  notes: string;
  /** Whether the falling (unloading) branch is given, as for a jack with seal friction. */
  hasFalling: boolean;
  method: {
    inputUnit: CalibrationUnit | '';
    outputUnit: CalibrationUnit | '';
    curve: CurveDraft;
    fallingCurve: CurveDraft;
    range: [number | null, number | null];
  };
}

const blankCurve = (): CurveDraft => ({
  kind: 'linear',
  c0: 0,
  c1: null,
  coefficients: [],
  points: [
    { x: null, y: null },
    { x: null, y: null },
  ],
});

/** Units a new calibration starts from, by what the instrument reads and gives. */
const UNITS_BY_KIND: Record<InstrumentKind, [CalibrationUnit, CalibrationUnit]> = {
  gauge: ['mm', 'mm'],
  pressure: ['bar', 'bar'],
  jack: ['bar', 'kN'],
  'load-cell': ['mV', 'kN'],
};

/** A blank record: calibrated today, due in a year (a common interval; the certificate decides). */
export function blankCalibrationDraft(kind: InstrumentKind, today = new Date()): CalibrationDraft {
  const iso = (d: Date) => formatDate(d.toISOString());
  const due = new Date(today);
  due.setFullYear(due.getFullYear() + 1);
  const [inputUnit, outputUnit] = UNITS_BY_KIND[kind];
  return {
    calibratedOn: iso(today),
    dueOn: iso(due),
    notes: '',
    hasFalling: false,
    method: { inputUnit, outputUnit, curve: blankCurve(), fallingCurve: blankCurve(), range: [null, null] },
  };
}

/**
 * Only the chosen kind's fields of a curve. Empty boxes (null) go through as they are so the
 * schema names them "required" instead of the form guessing a number.
 */
function curveInput(draft: CurveDraft): unknown {
  switch (draft.kind) {
    case 'linear':
      return { kind: 'linear', c0: draft.c0, c1: draft.c1 };
    case 'polynomial':
      return { kind: 'polynomial', coefficients: draft.coefficients };
    case 'table':
      return { kind: 'table', points: draft.points };
  }
}

/**
 * The record as the server's schema reads it. Paths are kept (`method.curve.points.2.y`), so the
 * schema's errors land on the form's own boxes. Unvalidated: the caller parses it.
 */
export function toCalibrationInput(draft: CalibrationDraft): unknown {
  const [lo, hi] = draft.method.range;
  const { inputUnit, outputUnit } = draft.method;
  return {
    calibratedOn: draft.calibratedOn,
    dueOn: draft.dueOn,
    notes: draft.notes,
    method: {
      inputUnit: inputUnit || undefined,
      outputUnit: outputUnit || undefined,
      curve: curveInput(draft.method.curve),
      ...(draft.hasFalling ? { fallingCurve: curveInput(draft.method.fallingCurve) } : {}),
      ...(lo == null && hi == null ? {} : { range: [lo, hi] }),
    },
  } satisfies Record<keyof CalibrationRecordInput, unknown>;
}
