import path from 'node:path';
import type { Response } from 'express';
import { z } from 'zod';
import { plateForceKn } from '../../shared/domain/plate';
import { findProfile } from '../../shared/procedures/profiles';
import { readingsCsvToRecord } from '../../shared/records/csv';
import { readingCount } from '../../shared/records/readings';
import { RECORD_LIMITS, type TestRecord } from '../../shared/records/schema';
import { formatIssue, parseTestRecord, type RecordImport } from '../../shared/records/validate';
import { initialRunState } from '../../shared/runs/lifecycle';
import { type PlanInput, planInput } from '../../shared/schemas/plans';
import { EDITORS } from '../auth/permissions';
import { loadLocation } from '../auth/scope';
import { HttpError, badRequest } from '../http/errors';
import { route } from '../http/route';
import { singleUpload } from '../http/uploads';
import { RunRecord } from '../models/interpretation';
import { type PersistedRun, Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { TestPlan, planColumns } from '../models/test-plan';
import type { User } from '../models/user';
import { audited } from '../services/audit';

export const IMPORT_FORMATS = ['json', 'csv'] as const;
type ImportFormat = (typeof IMPORT_FORMATS)[number];

/** JSON body, or the text fields of a multipart upload (which arrive as strings). */
export const importInput = z.object({
  locationId: z.coerce.number().int().positive(),
  format: z.enum(IMPORT_FORMATS).optional(),
  content: z.string().max(RECORD_LIMITS.bytes, `at most ${RECORD_LIMITS.bytes} characters`).optional(),
  planName: z.string().trim().min(1).max(160).optional(),
});

/** The record's text and format, from the uploaded file or the `content` field. */
function importedText(body: z.infer<typeof importInput>, file: Express.Multer.File | undefined): { format: ImportFormat; text: string; fileName: string | null } {
  if (file) {
    const ext = path.extname(file.originalname).slice(1).toLowerCase();
    const format = body.format ?? (IMPORT_FORMATS as readonly string[]).find((f) => f === ext);
    if (!format) throw badRequest('file: must be a .json record or a .csv of readings', 'file');
    return { format: format as ImportFormat, text: file.buffer.toString('utf8'), fileName: file.originalname.slice(0, 200) };
  }
  if (body.content === undefined) throw badRequest('content: required (or upload a file in the field "file")', 'content');
  if (!body.format) throw badRequest('format: required: "json" or "csv"', 'format');
  return { format: body.format, text: body.content, fileName: null };
}

function parseImport(format: ImportFormat, text: string): RecordImport {
  if (format === 'csv') return readingsCsvToRecord(text);
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    return { ok: false, errors: [{ field: '(record)', message: `not valid JSON: ${(err as Error).message}` }], omitted: 0 };
  }
  return parseTestRecord(json);
}

/** 400 with every listed problem: `{error: {code: 'invalid_record', message, field?}, issues, omitted}`. */
function rejectRecord(res: Response, errors: RecordImport & { ok: false }): void {
  const [first] = errors.errors;
  const count = errors.errors.length + errors.omitted;
  res.status(400).json({
    error: { code: 'invalid_record', message: `${count === 1 ? 'One problem' : `${count} problems`} in the record; first: ${formatIssue(first)}`, ...(first.field ? { field: first.field } : {}) },
    issues: errors.errors,
    omitted: errors.omitted,
  });
}

const distinct = (xs: number[]) => [...new Set(xs)];

/** A user-defined ('custom') plan that describes what the record shows was done. */
export function planForRecord(record: TestRecord, name: string): PlanInput {
  const custom = findProfile('custom')!.defaults;
  const targets = (branch: string) => distinct(record.stages.filter((s) => s.branch === branch).map((s) => s.targetKpa));
  const positive = distinct(record.stages.map((s) => s.targetKpa).filter((q) => q > 0));
  const loading = targets('loading').filter((q) => q > 0);
  const reloading = targets('reloading').filter((q) => q > 0);
  const maxPressure = Math.max(0, ...record.stages.flatMap((s) => s.readings.map((r) => r.pressureKpa)));
  const draft = {
    ...custom,
    name,
    procedureId: 'custom',
    plate: { shape: record.plate.shape, sizeMm: record.plate.sizeMm, thicknessMm: 25 },
    seatingPressureKpa: record.plan?.seatingPressureKpa ?? record.stages.find((s) => s.branch === 'seating')?.targetKpa ?? 0,
    loading: { mode: 'list', pressuresKpa: (loading.length ? loading : positive).slice(0, 60) },
    unloadReload: {
      unloadKpa: targets('unloading').slice(0, 20),
      reload: reloading.length ? { mode: 'list', pressuresKpa: reloading.slice(0, 60) } : { mode: 'none' },
      repetitionsPerLevel: 1,
    },
    holdRule: record.plan?.holdRule ?? custom.holdRule,
    // The reaction is not in the record: the largest plate force of the test, rounded up, stands for it.
    reaction: { kind: 'other', capacityKn: Math.max(1, Math.ceil(plateForceKn(record.plate, maxPressure))), description: 'Not recorded (imported test)' },
    footing: record.footing ? { shape: record.footing.shape, widthM: record.footing.widthM, lengthM: null, soilBehaviour: record.footing.soilBehaviour } : null,
    notes: 'Describes an imported test record.',
  };
  const parsed = planInput.safeParse(draft);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new HttpError(400, 'invalid_record', `The record cannot be described as a plan: ${issue.path.join('.')}: ${issue.message}`);
  }
  return parsed.data;
}

export function importedRunState(record: TestRecord, nowMs: number): PersistedRun {
  const last = record.stages[record.stages.length - 1];
  return {
    lifecycle: { ...initialRunState(), phase: 'completed', stageIndex: last.index, closedReason: 'imported test record' },
    clock: { speed: 1, anchorWallMs: nowMs, anchorRunMs: nowMs },
    alarms: {},
    lastSeq: 0,
    lastSampleMs: null,
  };
}

/** Stores a validated record as a plan, a completed run and the run's record, all in one transaction. */
async function storeImport(user: User, locationId: number, record: TestRecord, source: { format: ImportFormat; fileName: string | null; planName?: string }) {
  const name = source.planName ?? `Imported test ${[record.metadata?.pit, record.metadata?.testDate].filter(Boolean).join(' ') || new Date().toISOString().slice(0, 10)}`.slice(0, 160);
  const plan = planForRecord(record, name);
  const now = new Date();
  const readings = readingCount(record);
  return audited(
    async (transaction) => {
      const created = await TestPlan.create({ locationId, ...planColumns(plan) }, { transaction });
      const run = await Run.create(
        { planId: created.id, rigId: null, status: 'completed', state: importedRunState(record, now.getTime()), startedAt: null, finishedAt: now, createdBy: user.id },
        { transaction },
      );
      await RunEvent.create(
        { runId: run.id, at: now, kind: 'imported', userId: user.id, payload: { by: { id: user.id, name: user.name }, format: source.format, fileName: source.fileName, stages: record.stages.length, readings } },
        { transaction },
      );
      await RunRecord.create({ runId: run.id, source: 'import', record }, { transaction });
      return { runId: run.id, planId: created.id, planName: created.name, stages: record.stages.length, readings };
    },
    (r) => ({ userId: user.id, entity: 'run', entityId: r.runId, action: 'imported', after: { ...r, locationId, format: source.format, fileName: source.fileName } }),
  );
}

/** 8 MB, the record's own size limit. */
const MAX_UPLOAD_BYTES = RECORD_LIMITS.bytes;

export const importRoutes = [
  route({
    method: 'post',
    path: '/api/imports',
    access: EDITORS,
    summary: 'Import a test recorded elsewhere (settlescope-record JSON or readings CSV) as a completed run',
    before: [singleUpload('file', MAX_UPLOAD_BYTES)],
    body: importInput,
    handler: async ({ body, user, req, res }) => {
      const source = importedText(body, req.file);
      try {
        await loadLocation(user!, body.locationId);
      } catch {
        throw badRequest('locationId: no such test location', 'locationId');
      }
      const parsed = parseImport(source.format, source.text);
      if (!parsed.ok) return rejectRecord(res, parsed);
      return storeImport(user!, body.locationId, parsed.record, { ...source, planName: body.planName });
    },
  }),
];
