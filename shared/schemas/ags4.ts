import { z } from 'zod';
import { RECORD_LIMITS } from '../records/schema';

const asciiLine = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .regex(/^[ -~]*$/, 'printable ASCII only (AGS4 files hold no other characters)');

/**
 * Largest AGS4 file taken, bytes: 32 MB. AGS4 spends about 120 bytes on a reading, so a test at the
 * record's limit of readings (RECORD_LIMITS) needs more than the record's own 8 MB.
 */
export const AGS4_MAX_BYTES = 4 * RECORD_LIMITS.bytes;

/** Options of an AGS4 export (query string): the TRAN issue sequence and status, and who carried out the tests. */
export const ags4ExportQuery = z.strictObject({
  /** TRAN_ISNO: the issue sequence of this transmission; default 1. */
  issue: z.coerce.number().int().min(1).max(9999).default(1),
  /** TRAN_STAT: status of the data, e.g. Preliminary or Final; default Preliminary. */
  status: asciiLine(40).min(1).default('Preliminary'),
  /** PROJ_CONT and PLTG_CONT: the testing organisation. */
  contractor: asciiLine(120).optional(),
});
export type Ags4ExportQuery = z.infer<typeof ags4ExportQuery>;

/** Body of an AGS4 import (JSON, or the text fields of a multipart upload with the file in "file"). */
export const ags4ImportInput = z.object({
  /** The project the tests go to; a LOCA_ID names a test location of it by pit id (a missing one is added). */
  projectId: z.coerce.number().int().positive(),
  content: z.string().max(AGS4_MAX_BYTES, `at most ${AGS4_MAX_BYTES} characters`).optional(),
});
export type Ags4ImportInput = z.infer<typeof ags4ImportInput>;

/** One test an AGS4 import stored, as a completed run. */
export interface Ags4ImportedTest {
  runId: number;
  planId: number;
  planName: string;
  locationId: number;
  pitId: string;
  /** PLTG_TESN of the test in the file. */
  reference: string;
  stages: number;
  readings: number;
}

/** The answer to a stored AGS4 import. */
export interface Ags4ImportResult {
  tests: Ags4ImportedTest[];
  /** Pit ids of the test locations the import added to the project. */
  addedLocations: string[];
  /** AGS4 groups the file holds that Settlescope does not read. */
  ignoredGroups: string[];
}
