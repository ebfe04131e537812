import { z } from 'zod';
import { MAX_SPEED, MIN_SPEED } from './clock';
import { FAULT_KINDS } from './devices/faults';

/*
 * The operator's physical actions at the rig, and the simulator's own knobs, as validated
 * commands. The control channel turns each `POST /<action>` body into one of these.
 */

const pump = z
  .object({
    action: z.literal('pump'),
    /** Mean pressure wanted under the plate, kPa; the jack model gives the oil pressure. */
    pressureKpa: z.number().min(0).optional(),
    /** Oil pressure wanted on the jack gauge, MPa. */
    gaugeMpa: z.number().min(0).optional(),
  })
  .refine((body) => (body.pressureKpa === undefined) !== (body.gaugeMpa === undefined), {
    message: 'give exactly one of "pressureKpa" or "gaugeMpa"',
  });

export const rigCommandSchema = z.discriminatedUnion('action', [
  pump,
  z.object({ action: z.literal('top-up') }),
  z.object({ action: z.literal('release') }),
  /** Re-seat gauge N (1-based): its reading jumps back, the plate does not move. */
  z.object({ action: z.literal('gauge-reset'), gauge: z.number().int().min(1) }),
  /** Show a fault for `durationS` wall seconds on one device (by port id) or on all. */
  z.object({ action: z.literal('fault'), kind: z.enum(FAULT_KINDS), durationS: z.number().positive().max(3600), device: z.string().min(1).optional() }),
  z.object({ action: z.literal('speed'), factor: z.number().min(MIN_SPEED).max(MAX_SPEED) }),
  /** Automatic pressure maintainer: tolerance as a fraction of the target, or null for off. */
  z.object({ action: z.literal('maintain'), tolerance: z.number().gt(0).lt(0.5).nullable() }),
]);

export type RigCommand = z.infer<typeof rigCommandSchema>;
export type RigAction = RigCommand['action'];

export const RIG_ACTIONS: readonly RigAction[] = rigCommandSchema.options.map((option) => option.shape.action.value);

/** A zod failure as one line that names the field in quotes, e.g. `"gauge": Too small: expected number to be >=1`. */
export function describeIssues(error: z.ZodError): string {
  return error.issues.map((issue) => (issue.path.length ? `"${issue.path.join('.')}": ${issue.message}` : issue.message)).join('; ');
}
