import { z } from 'zod';
import { idParams } from '../../shared/schemas/common';
import { runCommandEnvelope, runCreateInput } from '../../shared/schemas/runs';
import { STAFF } from '../auth/permissions';
import { HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { assertRunUnlocked } from '../services/signoff';
import { Interpretation } from '../models/interpretation';
import { Rig } from '../models/rig';
import { Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { TestLocation } from '../models/test-location';
import { TestPlan } from '../models/test-plan';
import { Project } from '../models/project';
import { Signoff } from '../models/signoff';
import { CommandRefused } from '../runs/run-engine';
import type { RunManager } from '../runs/run-manager';
import { sampleSpan, samplesAfter, summarizeSamples, toBatch } from '../runs/samples-query';

const actorOf = (user: { id: number; name: string; role: 'admin' | 'engineer' | 'operator' | 'client' }) => ({ id: user.id, name: user.name, role: user.role });

export const runRoutes = (runs: RunManager) => [
  route({
    method: 'get',
    path: '/api/runs',
    access: STAFF,
    summary: 'Runs, newest first, with their plan, location, rig and where their report stands (interpreted, draft / in review / signed)',
    handler: async () => {
      const all = await Run.findAll({ order: [['id', 'DESC']], limit: 200 });
      const ids = all.map((r) => r.id);
      // Where each run's report stands, for the engineer's queues and the staff list of reports.
      const signoffs = new Map((await Signoff.findAll({ where: { runId: ids }, attributes: ['runId', 'state'] })).map((s) => [s.runId, s.state]));
      const interpreted = new Set((await Interpretation.findAll({ where: { runId: ids }, attributes: ['runId'], group: ['runId'] })).map((i) => i.runId));
      const plans = new Map((await TestPlan.findAll({ where: { id: [...new Set(all.map((r) => r.planId))] }, include: [{ model: TestLocation, as: 'location', include: [{ model: Project, as: 'project' }] }] })).map((p) => [p.id, p]));
      const rigs = new Map((await Rig.findAll()).map((r) => [r.id, r.name]));
      return {
        items: all.map((r) => {
          const plan = plans.get(r.planId);
          const engine = runs.engine(r.id);
          const view = engine?.isActive ? engine.view() : null;
          return {
            id: r.id,
            phase: r.status,
            planId: r.planId,
            planName: plan?.name ?? '',
            pitId: plan?.location?.pitId ?? '',
            projectCode: plan?.location?.project?.code ?? '',
            rigName: r.rigId ? (rigs.get(r.rigId) ?? '') : '',
            stageIndex: r.state?.lifecycle?.stageIndex ?? 0,
            stageCount: view?.stages.length ?? null,
            verdict: view?.hold?.verdict ?? null,
            activeAlarms: view ? view.alarms.filter((a) => a.state === 'unacknowledged').length : 0,
            startedAt: r.startedAt?.toISOString() ?? null,
            finishedAt: r.finishedAt?.toISOString() ?? null,
            review: { state: signoffs.get(r.id) ?? 'draft', interpreted: interpreted.has(r.id) },
          };
        }),
      };
    },
  }),
  route({
    method: 'post',
    path: '/api/runs',
    access: STAFF,
    summary: 'Set up a run of a plan on a rig',
    body: runCreateInput,
    handler: ({ body, user }) => runs.create(body.planId, body.rigId, actorOf(user!)),
  }),
  route({
    method: 'get',
    path: '/api/runs/:id',
    access: STAFF,
    summary: 'A run as the console shows it',
    params: idParams,
    handler: async ({ params }) => {
      const engine = await runs.load(params.id);
      if (!engine) throw notFound('Run');
      return engine.view();
    },
  }),
  route({
    method: 'post',
    path: '/api/runs/:id/commands',
    access: STAFF,
    summary: 'Send a command to a run (quoting the version it was decided on)',
    status: 200,
    params: idParams,
    body: runCommandEnvelope,
    handler: async ({ params, body, user }) => {
      // Even a note changes a signed run's record (its events, its weather line).
      await assertRunUnlocked(params.id);
      // A closed run has released its engine; it still takes notes, through its loaded view.
      const engine = runs.engine(params.id) ?? (await runs.load(params.id));
      if (!engine) throw notFound('Run');
      try {
        return await engine.command(body.command, actorOf(user!), body.version);
      } catch (err) {
        if (err instanceof CommandRefused) throw new HttpError(err.code === 'conflict' ? 409 : err.code === 'forbidden' ? 403 : 400, `command_${err.code}`, err.message);
        throw err;
      }
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/events',
    access: STAFF,
    summary: 'Everything that happened in a run',
    params: idParams,
    handler: async ({ params }) => ({ items: (await RunEvent.findAll({ where: { runId: params.id }, order: [['id', 'ASC']] })).map((e) => e.toDto()) }),
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/samples',
    access: STAFF,
    summary: 'Archived samples after a sequence number, in columns',
    params: idParams,
    query: z.object({ afterSeq: z.coerce.number().int().min(0).default(0), limit: z.coerce.number().int().min(1).max(100_000).default(10_000) }),
    handler: async ({ params, query }) => {
      if (!(await Run.findByPk(params.id))) throw notFound('Run');
      return toBatch(params.id, await samplesAfter(Run.sequelize!, params.id, query.afterSeq, query.limit));
    },
  }),
  route({
    method: 'get',
    path: '/api/runs/:id/samples/summary',
    access: STAFF,
    summary: 'Min/max per time bucket and channel over a span (for plots and replay at any zoom)',
    params: idParams,
    query: z.object({
      fromMs: z.coerce.number().int().optional(),
      toMs: z.coerce.number().int().optional(),
      buckets: z.coerce.number().int().min(1).max(10_000).default(1000),
    }),
    handler: async ({ params, query }) => {
      if (!(await Run.findByPk(params.id))) throw notFound('Run');
      const span = await sampleSpan(Run.sequelize!, params.id);
      const fromMs = query.fromMs ?? span?.fromMs ?? 0;
      const toMs = query.toMs ?? span?.toMs ?? fromMs + 1;
      if (toMs <= fromMs) throw new HttpError(400, 'invalid_input', 'toMs: must be after fromMs', 'toMs');
      return summarizeSamples(Run.sequelize!, params.id, fromMs, toMs, query.buckets);
    },
  }),
];
