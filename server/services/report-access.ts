/**
 * Who may see which report (target S2): staff see any run's report; a client sees only signed runs
 * of projects of their own organisation, and anything else answers 404 so it is not even revealed.
 */
import { QueryTypes } from 'sequelize';
import type { ReportListItem } from '../../shared/schemas/signoff';
import { notFound } from '../http/errors';
import { Run } from '../models/run';
import type { User } from '../models/user';

interface Row {
  runId: number;
  projectId: number;
  projectCode: string;
  projectName: string;
  organizationName: string;
  organizationId: number;
  pitId: string;
  planName: string;
  startedAt: Date | string | null;
  revision: number;
  signedAt: Date | string | null;
}

const SIGNED_RUNS = `
  SELECT r.id AS runId, p.id AS projectId, p.code AS projectCode, p.name AS projectName, o.name AS organizationName, o.id AS organizationId,
         l.pit_id AS pitId, tp.name AS planName, r.started_at AS startedAt, s.revision AS revision,
         (SELECT MAX(g.signed_at) FROM signatures g WHERE g.run_id = r.id AND g.revision = s.revision) AS signedAt
  FROM signoffs s
  JOIN runs r ON r.id = s.run_id
  JOIN test_plans tp ON tp.id = r.plan_id
  JOIN test_locations l ON l.id = tp.location_id
  JOIN projects p ON p.id = l.project_id
  JOIN organizations o ON o.id = p.organization_id
  WHERE s.state = 'signed'`;

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());

async function signedRuns(filter: string, replacements: Record<string, unknown>): Promise<Row[]> {
  return (await Run.sequelize!.query(`${SIGNED_RUNS} ${filter} ORDER BY signedAt DESC, r.id DESC`, { replacements, type: QueryTypes.SELECT })) as Row[];
}

/** Signed reports the user may see: a client's organisation's only, every one for staff. */
export async function listReports(user: User): Promise<ReportListItem[]> {
  const rows = user.role === 'client' ? await signedRuns('AND p.organization_id = :org', { org: user.organizationId ?? -1 }) : await signedRuns('', {});
  return rows.map((r) => ({
    runId: r.runId,
    projectId: r.projectId,
    projectCode: r.projectCode,
    projectName: r.projectName,
    organizationName: r.organizationName,
    pitId: r.pitId,
    planName: r.planName,
    testDate: iso(r.startedAt)?.slice(0, 10) ?? null,
    revision: r.revision,
    signedAt: iso(r.signedAt),
  }));
}

/** The run, when the user may have its report; 404 otherwise (also for a client asking for another organisation's run). */
export async function reportRunFor(user: User, runId: number): Promise<Run> {
  if (user.role === 'client') {
    const [row] = await signedRuns('AND r.id = :runId AND p.organization_id = :org', { runId, org: user.organizationId ?? -1 });
    if (!row) throw notFound('Report');
  }
  const run = await Run.findByPk(runId);
  if (!run) throw notFound(user.role === 'client' ? 'Report' : 'Run');
  return run;
}

/** The contact e-mail addresses of the organisation that owns the run's project. */
export async function clientContacts(runId: number): Promise<{ organizationName: string; emails: string[]; projectCode: string; pitId: string }> {
  const rows = (await Run.sequelize!.query(
    `SELECT o.name AS organizationName, o.contact_emails AS emails, p.code AS projectCode, l.pit_id AS pitId
     FROM runs r JOIN test_plans tp ON tp.id = r.plan_id JOIN test_locations l ON l.id = tp.location_id
     JOIN projects p ON p.id = l.project_id JOIN organizations o ON o.id = p.organization_id WHERE r.id = :runId`,
    { replacements: { runId }, type: QueryTypes.SELECT },
  )) as { organizationName: string; emails: string | string[]; projectCode: string; pitId: string }[];
  const row = rows[0];
  if (!row) throw notFound('Run');
  const emails = typeof row.emails === 'string' ? (JSON.parse(row.emails) as string[]) : row.emails;
  return { organizationName: row.organizationName, emails, projectCode: row.projectCode, pitId: row.pitId };
}
