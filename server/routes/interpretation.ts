import { z } from 'zod';
import { analyzeRecord, type AnalyzeRecordOptions, type RecordAnalysis } from '../../shared/interpretation/analyze-record';
import { InterpretationInputError } from '../../shared/interpretation/input-checks';
import { reduceStages } from '../../shared/interpretation/reduction';
import type { UltimateMethod } from '../../shared/interpretation/ultimate';
import { recordToReadingsCsv, stagePointsToCsv } from '../../shared/records/csv';
import { toStageReadings } from '../../shared/records/readings';
import type { RecordFooting, TestRecord } from '../../shared/records/schema';
import { idParams } from '../../shared/schemas/common';
import { EDITORS, STAFF } from '../auth/permissions';
import { badRequest, notFound } from '../http/errors';
import { route } from '../http/route';
import { Interpretation } from '../models/interpretation';
import { Run } from '../models/run';
import { User } from '../models/user';
import { audited } from '../services/audit';
import { loadRunRecord, recordUnavailable } from '../services/run-record';
import { assertRunUnlocked } from '../services/signoff';
import type { Response } from 'express';

export const ULTIMATE_METHODS = ['logLogIntersection', 'tangentIntersection', 'hyperbolic', 'settlementCriterion', 'brinchHansen80'] as const satisfies readonly UltimateMethod[];

/** A number, also when it comes as query-string text; other text is left for zod to reject with the field's name. */
const numeric = <T extends z.ZodNumber>(schema: T) => z.preprocess((v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v), schema);

/** The engineer's interpretation settings; every one optional (absent: the record's own value or the method's default). */
export const interpretationOptions = z.strictObject({
  /** Footing to scale to; overrides the record's footing field by field. */
  footingShape: z.enum(['square', 'circular', 'strip', 'rectangular']).optional(),
  /** Footing width, m. */
  footingWidthM: numeric(z.number().positive().max(50)).optional(),
  soilBehaviour: z.enum(['cohesionless', 'cohesive']).optional(),
  /** Permissible footing settlement, mm. */
  permissibleSettlementMm: numeric(z.number().positive().max(500)).optional(),
  factorOfSafety: numeric(z.number().min(1).max(10)).optional(),
  /** The ultimate-pressure method carried to the footing; default the lowest value any method determines. */
  ultimateMethod: z.enum(ULTIMATE_METHODS).optional(),
  /** σ0max convention of Ev2 (DIN 18134). */
  evConvention: z.enum(['firstLoadingMax', 'branchMax']).optional(),
});
export type InterpretationOptions = z.infer<typeof interpretationOptions>;

export const saveInterpretationInput = z.strictObject({
  options: interpretationOptions.default({}),
  chosenMethod: z.enum(ULTIMATE_METHODS),
  reason: z.string().trim().min(1, 'required: say why this method').max(500),
});

/** The record's footing with the engineer's overrides, or none; a footing needs a width and a soil behaviour. */
function footingWith(record: TestRecord, o: InterpretationOptions): RecordFooting | undefined {
  const base = record.footing;
  const overrides = {
    ...(o.footingShape ? { shape: o.footingShape } : {}),
    ...(o.footingWidthM !== undefined ? { widthM: o.footingWidthM } : {}),
    ...(o.soilBehaviour ? { soilBehaviour: o.soilBehaviour } : {}),
    ...(o.permissibleSettlementMm !== undefined ? { permissibleSettlementMm: o.permissibleSettlementMm } : {}),
    ...(o.factorOfSafety !== undefined ? { factorOfSafety: o.factorOfSafety } : {}),
  };
  if (base) return { ...base, ...overrides };
  if (Object.keys(overrides).length === 0) return undefined;
  if (o.footingWidthM === undefined) throw badRequest('footingWidthM: required, as the record names no footing', 'footingWidthM');
  if (!o.soilBehaviour) throw badRequest('soilBehaviour: required, as the record names no footing', 'soilBehaviour');
  return { shape: 'square', ...overrides, widthM: o.footingWidthM, soilBehaviour: o.soilBehaviour };
}

/** The record as the engineer wants it read, and the analysis options. */
export function interpretationInput(record: TestRecord, o: InterpretationOptions): { record: TestRecord; options: AnalyzeRecordOptions } {
  const footing = footingWith(record, o);
  return {
    record: { ...record, footing },
    options: { ...(o.ultimateMethod ? { ultimateMethod: o.ultimateMethod } : {}), ...(o.evConvention ? { evConvention: o.evConvention } : {}) },
  };
}

function interpret(record: TestRecord, o: InterpretationOptions): RecordAnalysis {
  const input = interpretationInput(record, o);
  return analyzeRecord(input.record, input.options);
}

function download(res: Response, fileName: string, type: string, body: string): void {
  res.type(type).attachment(fileName).send(body);
}

/** The headline figures of a saved analysis, for the list of versions. */
function headline(result: Record<string, unknown>) {
  const a = result as unknown as RecordAnalysis;
  return {
    qUltKpa: a.chosenUltimate?.applies ? a.chosenUltimate.result.qUltKpa : null,
    allowableKpa: a.footing?.applies && a.footing.result.allowable.applies ? a.footing.result.allowable.result.qAllowKpa : null,
  };
}

async function requireRun(id: number): Promise<Run> {
  const run = await Run.findByPk(id);
  if (!run) throw notFound('Run');
  return run;
}

export const interpretationRoutes = [
  route({
    method: 'get',
    path: '/api/runs/:id/record',
    access: STAFF,
    summary: 'The test record of a run (settlescope-record JSON, as a download)',
    params: idParams,
    handler: async ({ params, res }) => {
      const record = await loadRunRecord(params.id);
      res.attachment(`run-${params.id}-record.json`);
      return record;
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/record.csv',
    access: STAFF,
    summary: 'Every reading of a run as a readings CSV',
    params: idParams,
    handler: async ({ params, res }) => download(res, `run-${params.id}-readings.csv`, 'text/csv', recordToReadingsCsv(await loadRunRecord(params.id))),
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/stage-points.csv',
    access: STAFF,
    summary: 'The reduced stage points of a run (one row per stage) as CSV',
    params: idParams,
    handler: async ({ params, res }) => {
      const record = await loadRunRecord(params.id);
      let points: ReturnType<typeof reduceStages>;
      try {
        points = reduceStages(toStageReadings(record), record.plan?.reduction ?? { kind: 'endOfHold' });
      } catch (err) {
        if (err instanceof InterpretationInputError) throw recordUnavailable(`The readings cannot be reduced to stage points: ${err.message}`);
        throw err;
      }
      download(
        res,
        `run-${params.id}-stage-points.csv`,
        'text/csv',
        stagePointsToCsv(
          points,
          record.gauges.map((g) => g.key),
        ),
      );
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/interpretation',
    access: STAFF,
    summary: 'Every interpretation method on the run’s record, with the engineer’s settings from the query',
    params: idParams,
    query: interpretationOptions,
    handler: async ({ params, query }) => interpret(await loadRunRecord(params.id), query),
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/interpretations',
    access: STAFF,
    summary: 'Saved interpretations of a run, newest version first',
    params: idParams,
    handler: async ({ params }) => {
      await requireRun(params.id);
      const saved = await Interpretation.findAll({ where: { runId: params.id }, order: [['version', 'DESC']] });
      const ids = [...new Set(saved.map((s) => s.createdBy).filter((id): id is number => id !== null))];
      const names = new Map((ids.length ? await User.findAll({ where: { id: ids } }) : []).map((u) => [u.id, u.name]));
      return {
        items: saved.map((s) => {
          const { result, ...dto } = s.toDto();
          return { ...dto, createdByName: s.createdBy === null ? null : (names.get(s.createdBy) ?? null), ...headline(result) };
        }),
      };
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/interpretations',
    access: EDITORS,
    summary: 'Save an interpretation of a run as its next version, with the chosen ultimate method and why',
    params: idParams,
    body: saveInterpretationInput,
    handler: async ({ params, body, user }) => {
      await requireRun(params.id);
      const options = { ...body.options, ultimateMethod: body.chosenMethod };
      const result = interpret(await loadRunRecord(params.id), options);
      const saved = await audited(
        async (transaction) => {
          // Locking the run row serialises two saves of one run, so each gets its own version.
          await Run.findByPk(params.id, { transaction, lock: transaction.LOCK.UPDATE });
          await assertRunUnlocked(params.id, transaction);
          const last = (await Interpretation.max('version', { where: { runId: params.id }, transaction })) as number | null;
          return Interpretation.create(
            { runId: params.id, version: (last ?? 0) + 1, options, result: result as unknown as Record<string, unknown>, chosenMethod: body.chosenMethod, reason: body.reason, createdBy: user!.id },
            { transaction },
          );
        },
        (s) => ({
          userId: user!.id,
          entity: 'interpretation',
          entityId: s.id,
          action: 'saved',
          after: { runId: s.runId, version: s.version, chosenMethod: s.chosenMethod, options: s.options, ...headline(s.result) },
          reason: body.reason,
        }),
      );
      return saved.toDto();
    },
  }),
];
