import { z } from 'zod';
import { PRESSURE_UNITS } from './units';

/** Units a calibration maps between: instrument reading (input) → engineering value (output). */
export const CALIBRATION_UNITS = [...PRESSURE_UNITS, 'kN', 'mm', 'in', 'counts', 'mV'] as const;
export type CalibrationUnit = (typeof CALIBRATION_UNITS)[number];

/** One calibration point: instrument reading `x` (input unit) ↔ true value `y` (output unit). */
const pointSchema = z.object({ x: z.number(), y: z.number() });

/** A table must rise strictly in x and be strictly monotonic in y, so it can be read both ways. */
const tableSchema = z
  .array(pointSchema)
  .min(2, 'a table needs at least two points')
  .max(200)
  .superRefine((points, ctx) => {
    const dir = Math.sign(points[points.length - 1].y - points[0].y);
    points.forEach((p, i) => {
      if (i === 0) return;
      const prev = points[i - 1];
      if (p.x <= prev.x) ctx.addIssue({ code: 'custom', message: 'x must rise strictly from point to point', path: [i, 'x'] });
      if (dir === 0 || Math.sign(p.y - prev.y) !== dir)
        ctx.addIssue({ code: 'custom', message: 'y must rise (or fall) strictly from point to point', path: [i, 'y'] });
    });
  });

export const curveSchema = z.discriminatedUnion('kind', [
  /** y = c0 + c1·x */
  z.object({ kind: z.literal('linear'), c0: z.number(), c1: z.number().refine((c1) => c1 !== 0, 'c1 must not be 0') }),
  /** y = Σ coefficients[k]·x^k (coefficients from the constant term up). */
  z.object({ kind: z.literal('polynomial'), coefficients: z.array(z.number()).min(1).max(11) }),
  /** Piecewise-linear through the points; linear extension of the end segments outside them. */
  z.object({ kind: z.literal('table'), points: tableSchema }),
]);
export type CalibrationCurve = z.infer<typeof curveSchema>;

/**
 * An instrument calibration as the server stores and validates it. `curve` serves rising input
 * (and all input when there is no `fallingCurve`); `fallingCurve`, when given, serves falling input
 * (jack seal friction makes unloading read differently). `range` is the input span covered by the
 * certificate; polynomial curves need it to be inverted.
 */
export const calibrationSchema = z
  .object({
    inputUnit: z.enum(CALIBRATION_UNITS),
    outputUnit: z.enum(CALIBRATION_UNITS),
    curve: curveSchema,
    fallingCurve: curveSchema.optional(),
    range: z
      .tuple([z.number(), z.number()])
      .refine(([lo, hi]) => lo < hi, 'range must be [min, max] with min < max')
      .optional(),
  })
  .strict();
export type Calibration = z.infer<typeof calibrationSchema>;
