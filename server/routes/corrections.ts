import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { idParams } from '../../shared/schemas/common';
import { toMicro } from '../../shared/runs/samples';
import { loadRigContext } from '../acquisition/rig-context';
import { EDITORS, STAFF } from '../auth/permissions';
import { badRequest, notFound } from '../http/errors';
import { route } from '../http/route';
import { CORRECTION_ACTIONS, SampleCorrection, correctedValues } from '../models/correction';
import { Run } from '../models/run';
import { audited } from '../services/audit';
import { assertRunUnlocked } from '../services/signoff';

/** A correction of one archived reading; `valueMm` (the gauge reading it should have been) only with 'correct-value'. */
export const correctionInput = z
  .strictObject({
    seq: z.number().int().positive(),
    action: z.enum(CORRECTION_ACTIONS),
    valueMm: z.number().min(-1000).max(1000).optional(),
    reason: z.string().trim().min(3).max(500),
  })
  .superRefine((v, ctx) => {
    if (v.action === 'correct-value' && v.valueMm === undefined) ctx.addIssue({ code: 'custom', path: ['valueMm'], message: 'required to correct a value' });
    if (v.action === 'mark-faulty' && v.valueMm !== undefined) ctx.addIssue({ code: 'custom', path: ['valueMm'], message: 'not allowed when marking a reading faulty' });
  });

interface SampleAt {
  seq: number;
  tMs: number;
  channel: number;
  value: number | null;
  status: number;
}

const sql = () => Run.sequelize!;

async function sampleBySeq(runId: number, seq: number): Promise<SampleAt | null> {
  const [row] = (await sql().query('SELECT seq, t_ms AS tMs, channel, value, status FROM samples WHERE run_id = ? AND seq = ?', {
    replacements: [runId, seq],
    type: QueryTypes.SELECT,
  })) as SampleAt[];
  return row ? { ...row, seq: Number(row.seq), tMs: Number(row.tMs) } : null;
}

/** The rig channels a run recorded (none for a run without a rig, e.g. an imported one). */
async function runChannels(run: Run) {
  return run.rigId === null ? [] : (await loadRigContext(run.rigId)).rig.channels;
}

/** Per channel, the last archived sample at or before `tMs` (one short index walk back per channel, never a scan of the run). */
async function readingsAt(run: Run, tMs: number): Promise<SampleAt[]> {
  const channelCount = (await runChannels(run)).length;
  const rows = await Promise.all(
    Array.from({ length: channelCount }, (_, channel) => channel).map(
      async (channel) =>
        (
          (await sql().query('SELECT seq, t_ms AS tMs, channel, value, status FROM samples WHERE run_id = ? AND channel = ? AND t_ms <= ? ORDER BY t_ms DESC, seq DESC LIMIT 1', {
            replacements: [run.id, channel, tMs],
            type: QueryTypes.SELECT,
          })) as SampleAt[]
        )[0],
    ),
  );
  return rows.filter((r): r is SampleAt => r !== undefined).map((r) => ({ ...r, seq: Number(r.seq), tMs: Number(r.tMs) }));
}

async function requireRun(runId: number): Promise<Run> {
  const run = await Run.findByPk(runId);
  if (!run) throw notFound('Run');
  return run;
}

export const correctionRoutes = [
  route({
    method: 'get',
    path: '/api/runs/:id/corrections',
    access: STAFF,
    summary: 'Every correction of the run’s readings, oldest first',
    params: idParams,
    handler: async ({ params }) => {
      await requireRun(params.id);
      return { items: (await SampleCorrection.findAll({ where: { runId: params.id }, order: [['id', 'ASC']] })).map((c) => c.toDto()) };
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/corrections',
    access: EDITORS,
    summary: 'Mark an archived reading faulty or correct its value (kept beside the original, audited)',
    params: idParams,
    body: correctionInput,
    handler: async ({ params, body, user }) => {
      const run = await requireRun(params.id);
      const sample = await sampleBySeq(run.id, body.seq);
      if (!sample) throw notFound(`Sample ${body.seq} of run ${run.id}`);
      if (body.action === 'correct-value') {
        const channels = await runChannels(run);
        if (channels[sample.channel]?.role !== 'gauge') throw badRequest('seq: only a gauge reading can be given a new value (mark others faulty)', 'seq');
      }
      const previous = (await correctedValues(run.id)).get(sample.seq);
      const correction = await audited(
        async (t) => {
          await assertRunUnlocked(run.id, t);
          return SampleCorrection.create(
            {
              runId: run.id,
              seq: sample.seq,
              channel: sample.channel,
              tMs: sample.tMs,
              action: body.action,
              originalValue: sample.value,
              newValue: body.valueMm === undefined ? null : toMicro(body.valueMm),
              reason: body.reason,
              userId: user!.id,
              userName: user!.name,
              at: new Date(),
            },
            { transaction: t },
          );
        },
        (c) => ({
          userId: user!.id,
          entity: 'sample',
          entityId: `${run.id}:${c.seq}`,
          action: c.action,
          before: { value: previous === undefined ? sample.value : previous },
          after: { value: c.newValue },
          reason: c.reason,
        }),
      );
      return correction.toDto();
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/readings-at',
    access: STAFF,
    summary: 'Per channel, the last archived reading at or before a run time, with its correction',
    params: idParams,
    query: z.object({ tMs: z.coerce.number().int() }),
    handler: async ({ params, query }) => {
      const run = await requireRun(params.id);
      const [rows, corrected] = await Promise.all([readingsAt(run, query.tMs), correctedValues(run.id)]);
      return {
        tMs: query.tMs,
        items: rows.map((r) => ({ ...r, ...(corrected.has(r.seq) ? { correctedValue: corrected.get(r.seq) ?? null, faulty: corrected.get(r.seq) === null } : {}) })),
      };
    },
  }),
];
