/**
 * AGS4 exchange of plate loading tests (edition 4.1.1): a run's, a location's or a project's tests as one
 * checked AGS4 file, and AGS4 files read into imported runs, all in one transaction or none.
 */
import { exportAgs4, type PlateResults, type PlateTestExport, plateResults } from '../../shared/ags4/plate-export';
import { checkAgs4, formatAgs4Problem } from '../../shared/ags4/check';
import { type Ags4Import, importAgs4, type ImportedPlateTest } from '../../shared/ags4/plate-import';
import type { Ags4Problem } from '../../shared/ags4/parse';
import { analyzeRecord } from '../../shared/interpretation/analyze-record';
import { readingCount } from '../../shared/records/readings';
import type { TestRecord } from '../../shared/records/schema';
import type { Ags4ExportQuery, Ags4ImportedTest, Ags4ImportResult } from '../../shared/schemas/ags4';
import { locationInput } from '../../shared/schemas/projects';
import { transaction } from '../db/transaction';
import { HttpError, notFound } from '../http/errors';
import { Interpretation, RunRecord } from '../models/interpretation';
import { Organization } from '../models/organization';
import { Project } from '../models/project';
import { Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { Signoff } from '../models/signoff';
import { TestLocation } from '../models/test-location';
import { TestPlan, planColumns } from '../models/test-plan';
import type { User } from '../models/user';
import { importedRunState, planForRecord } from '../routes/imports';
import { audit } from './audit';
import { loadRunRecord } from './run-record';

/** Results for PLTG: the signed interpretation's, else the latest saved one's, else the default analysis. */
async function resultsOf(runId: number, record: TestRecord, signoff: Signoff | null): Promise<PlateResults | undefined> {
  const version = signoff?.state === 'signed' ? signoff.interpretationVersion : null;
  const saved = version
    ? await Interpretation.findOne({ where: { runId, version } })
    : await Interpretation.findOne({ where: { runId }, order: [['version', 'DESC']] });
  if (saved) return plateResults(saved.result);
  try {
    return plateResults(analyzeRecord(record));
  } catch {
    return undefined; // a record the analysis cannot read still exports its readings
  }
}

/** TEST_STAT: the run's phase and where its sign-off stands. */
function statusOf(run: Run, signoff: Signoff | null): string {
  if (!signoff || signoff.state === 'draft') return run.status;
  return signoff.state === 'signed' ? `${run.status}, signed (revision ${signoff.revision})` : `${run.status}, in review`;
}

/** What an export covers: the runs, with their locations, of one project. */
export interface Ags4Scope {
  project: Project;
  runs: { run: Run; location: TestLocation }[];
  /** Names the scope in messages: "at PLT-01", "of run 12". */
  label: string;
  /** Names the scope in the file name. */
  slug: string;
}

/** The runs of the locations given, oldest first. */
async function runsAt(locations: readonly TestLocation[]): Promise<Ags4Scope['runs']> {
  const plans = await TestPlan.findAll({ where: { locationId: locations.map((l) => l.id) } });
  const runs = plans.length ? await Run.findAll({ where: { planId: plans.map((p) => p.id) }, order: [['id', 'ASC']] }) : [];
  return runs.map((run) => ({ run, location: locations.find((l) => l.id === plans.find((p) => p.id === run.planId)!.locationId)! }));
}

async function projectOf(location: TestLocation): Promise<Project> {
  const project = await Project.findByPk(location.projectId);
  if (!project) throw notFound('Project');
  return project;
}

/** One run's test (404 for an unknown run). Access is the caller's to check. */
export async function runScope(runId: number): Promise<Ags4Scope> {
  const run = await Run.findByPk(runId);
  const plan = run && (await TestPlan.findByPk(run.planId));
  const location = plan && (await TestLocation.findByPk(plan.locationId));
  if (!run || !location) throw notFound('Run');
  return { project: await projectOf(location), runs: [{ run, location }], label: `of run ${run.id}`, slug: `run-${run.id}` };
}

/** Every test of a location. */
export async function locationScope(location: TestLocation): Promise<Ags4Scope> {
  return { project: await projectOf(location), runs: await runsAt([location]), label: `at ${location.pitId}`, slug: location.pitId };
}

/** Every test of a project. */
export async function projectTestsScope(project: Project): Promise<Ags4Scope> {
  const locations = await TestLocation.findAll({ where: { projectId: project.id }, order: [['pitId', 'ASC']] });
  return { project, runs: await runsAt(locations), label: `of project ${project.code}`, slug: 'plate-tests' };
}

const safeName = (text: string) => text.replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 60) || 'tests';

/** The AGS4 file of the runs in scope; runs whose record cannot be built are left out and named in TRAN_REM. */
export async function ags4Export(scope: Ags4Scope, options: Ags4ExportQuery): Promise<{ fileName: string; text: string; notes: string[] }> {
  const tests: PlateTestExport[] = [];
  const skipped: string[] = [];
  for (const { run, location } of scope.runs) {
    let record: TestRecord;
    try {
      record = await loadRunRecord(run.id);
    } catch (error) {
      if (error instanceof HttpError && scope.runs.length > 1) {
        skipped.push(`run ${run.id} at ${location.pitId} left out: ${error.message}`);
        continue;
      }
      throw error;
    }
    const signoff = await Signoff.findByPk(run.id);
    tests.push({
      locationId: location.pitId,
      reference: `R${run.id}`,
      depthM: record.ground?.testDepthM ?? location.testDepthM,
      record,
      status: statusOf(run, signoff),
      organisation: options.contractor,
      results: await resultsOf(run.id, record, signoff),
    });
  }
  if (tests.length === 0)
    throw new HttpError(404, 'no_tests', `No test ${scope.label} has a record to export${skipped.length ? ` (${skipped.join('; ')})` : ''}.`);
  const organization = await Organization.findByPk(scope.project.organizationId);
  const locations = [
    ...new Map(scope.runs.filter(({ location }) => tests.some((t) => t.locationId === location.pitId)).map(({ location }) => [location.id, location])).values(),
  ];
  const exported = exportAgs4({
    project: { id: scope.project.code, name: scope.project.name, site: scope.project.site, client: organization?.name, contractor: options.contractor },
    transmission: { issue: options.issue, date: new Date().toISOString().slice(0, 10), status: options.status, producer: 'Settlescope', remarks: skipped },
    locations: locations.map((l) => ({ id: l.pitId, remarks: l.soilDescription || undefined, finalDepthM: l.testDepthM })),
    tests,
  });
  // Checked before it is offered: a file that breaks AGS4 is never sent.
  const checked = checkAgs4(exported.text);
  if (checked.problems.length > 0) {
    throw new HttpError(409, 'ags4_unwritable', `The tests cannot be written as valid AGS4: ${checked.problems.slice(0, 3).map(formatAgs4Problem).join('; ')}`);
  }
  return { fileName: `${safeName(scope.project.code)}-${safeName(scope.slug)}.ags`, text: exported.text, notes: [...exported.notes, ...skipped] };
}

/** A refused AGS4 import: every problem by line, group and heading. */
export class Ags4Refused extends Error {
  constructor(readonly outcome: Extract<Ags4Import, { ok: false }>) {
    super(`${outcome.problems.length + outcome.omitted} problems in the AGS4 file`);
  }
}

/** The location of each LOCA_ID in the project: found by pit id, or described for adding. */
async function locationsFor(project: Project, tests: readonly ImportedPlateTest[], described: Map<string, { remarks?: string }>) {
  const existing = await TestLocation.findAll({ where: { projectId: project.id, pitId: [...new Set(tests.map((t) => t.locationId))] } });
  const problems: Ags4Problem[] = [];
  const toAdd = new Map<string, ReturnType<typeof locationInput.parse>>();
  for (const test of tests) {
    if (existing.some((l) => l.pitId === test.locationId) || toAdd.has(test.locationId)) continue;
    const parsed = locationInput.safeParse({ pitId: test.locationId, testDepthM: test.depthM, soilDescription: described.get(test.locationId)?.remarks ?? '' });
    if (parsed.success) toAdd.set(test.locationId, parsed.data);
    else
      problems.push({
        line: test.line,
        group: 'PLTG',
        heading: 'LOCA_ID',
        rule: 'settlescope',
        message: `cannot add a test location "${test.locationId}": ${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}`,
      });
  }
  return { existing, toAdd, problems };
}

/** Reads an AGS4 file and stores every plate loading test in it as an imported run of the project, in one transaction. */
export async function ags4Import(user: User, project: Project, text: string, fileName: string | null): Promise<Ags4ImportResult> {
  const outcome = importAgs4(text);
  if (!outcome.ok) throw new Ags4Refused(outcome);
  const described = new Map(outcome.locations.map((l) => [l.id, l]));
  const { existing, toAdd, problems } = await locationsFor(project, outcome.tests, described);
  const plans = outcome.tests.map((test) => {
    try {
      return planForRecord(test.record, `AGS4 ${test.locationId} ${test.reference}`.slice(0, 160));
    } catch (error) {
      problems.push({ line: test.line, group: 'PLTG', rule: 'settlescope', message: (error as Error).message });
      return null;
    }
  });
  if (problems.length) throw new Ags4Refused({ ok: false, problems, omitted: 0, ignoredGroups: outcome.ignoredGroups });
  const now = new Date();
  const tests = await transaction(async (t) => {
    const locations = new Map(existing.map((l) => [l.pitId, l]));
    for (const [pitId, input] of toAdd) {
      const created = await TestLocation.create({ ...input, projectId: project.id }, { transaction: t });
      await audit(
        { userId: user.id, entity: 'location', entityId: created.id, action: 'created', after: { ...created.get({ plain: true }), source: 'AGS4 import' } },
        t,
      );
      locations.set(pitId, created);
    }
    const stored: Ags4ImportedTest[] = [];
    for (const [i, test] of outcome.tests.entries()) {
      const location = locations.get(test.locationId)!;
      const plan = await TestPlan.create({ locationId: location.id, ...planColumns(plans[i]!) }, { transaction: t });
      const run = await Run.create(
        {
          planId: plan.id,
          rigId: null,
          status: 'completed',
          state: importedRunState(test.record, now.getTime()),
          startedAt: null,
          finishedAt: now,
          createdBy: user.id,
        },
        { transaction: t },
      );
      const readings = readingCount(test.record);
      await RunEvent.create(
        {
          runId: run.id,
          at: now,
          kind: 'imported',
          userId: user.id,
          payload: { by: { id: user.id, name: user.name }, format: 'ags4', fileName, stages: test.record.stages.length, readings, reference: test.reference },
        },
        { transaction: t },
      );
      await RunRecord.create({ runId: run.id, source: 'import', record: test.record }, { transaction: t });
      const result = {
        runId: run.id,
        planId: plan.id,
        planName: plan.name,
        locationId: location.id,
        pitId: location.pitId,
        reference: test.reference,
        stages: test.record.stages.length,
        readings,
      };
      await audit({ userId: user.id, entity: 'run', entityId: run.id, action: 'imported', after: { ...result, format: 'ags4', fileName } }, t);
      stored.push(result);
    }
    return stored;
  });
  return { tests, addedLocations: [...toAdd.keys()], ignoredGroups: outcome.ignoredGroups };
}
