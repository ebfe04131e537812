import { z } from 'zod';
import { analyzeRecord, type AnalyzeRecordOptions, type RecordAnalysis } from '../../shared/interpretation/analyze-record';
import { InterpretationInputError } from '../../shared/interpretation/input-checks';
import { reduceStages } from '../../shared/interpretation/reduction';
import { applyDesignInputs } from '../../shared/interpretation/design-inputs';
import { recordToReadingsCsv, stagePointsToCsv } from '../../shared/records/csv';
import { toStageReadings } from '../../shared/records/readings';
import type { TestRecord } from '../../shared/records/schema';
import { idParams } from '../../shared/schemas/common';
import { type InterpretationSettings, interpretationSettings, ULTIMATE_METHODS } from '../../shared/schemas/interpretation';
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

export const saveInterpretationInput = z.strictObject({
  options: interpretationSettings.default({}),
  chosenMethod: z.enum(ULTIMATE_METHODS),
  reason: z.string().trim().min(1, 'required: say why this method').max(500),
});

/** The record as the engineer wants it read, and the analysis options; a missing design input is a 400 naming its field. */
export function interpretationInput(record: TestRecord, o: InterpretationSettings): { record: TestRecord; options: AnalyzeRecordOptions } {
  try {
    return applyDesignInputs(record, o);
  } catch (err) {
    if (err instanceof InterpretationInputError) throw badRequest(err.message, err.field);
    throw err;
  }
}

function interpret(record: TestRecord, o: InterpretationSettings): RecordAnalysis {
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
    query: interpretationSettings,
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
