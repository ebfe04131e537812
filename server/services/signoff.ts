/**
 * Review and sign-off of a run (target S7): an engineer submits an interpretation version for review,
 * a second person re-enters the password and signs with a meaning. Signing seals the report: everything it
 * shows is stored as canonical JSON (the signature's hash is its SHA-256) and the signed PDF is rendered
 * from it once and kept with its own hash, so nothing changed later reaches a signed revision. A signed
 * run is locked; reopening it starts a new revision with a reason, and earlier signatures stay on record.
 * One signature per revision.
 */
import { createHash } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import type { TestRecord } from '../../shared/records/schema';
import type { SignatureCheck, SignatureMeaning, SignoffView, Verification } from '../../shared/schemas/signoff';
import { verifyPassword } from '../auth/passwords';
import { HttpError, notFound } from '../http/errors';
import { Interpretation } from '../models/interpretation';
import { Run } from '../models/run';
import { Signature, SignedReport, Signoff } from '../models/signoff';
import { User } from '../models/user';
import { audit, audited } from './audit';
import { canonicalJson, sha256Canonical } from './canonical-json';
import { loadReportData, type SealedContent, sealedContent } from './report-data';
import { renderReportPdf } from './report-pdf';
import { loadRunRecord } from './run-record';

const sha256 = (data: string | Buffer) => createHash('sha256').update(data).digest('hex');

/** 409 for any change to a signed run's data or interpretation. */
export const runSigned = (runId: number) =>
  new HttpError(409, 'run_signed', `Run ${runId} is signed and locked; reopen it as a new revision (with a reason) to change it.`);

/** What a signature's hash covered before sealed snapshots: the run's record and the interpretation version. */
function legacySignedContent(record: TestRecord, interpretation: Interpretation) {
  return {
    record,
    interpretation: {
      version: interpretation.version,
      options: interpretation.options,
      result: interpretation.result,
      chosenMethod: interpretation.chosenMethod,
      reason: interpretation.reason,
    },
  };
}

/** The legacy hash (record + interpretation version) of a signature made before sealed snapshots. */
async function legacyDataHash(runId: number, interpretationVersion: number): Promise<string> {
  const interpretation = await Interpretation.findOne({ where: { runId, version: interpretationVersion } });
  if (!interpretation) throw notFound(`Interpretation version ${interpretationVersion}`);
  return sha256Canonical(legacySignedContent(await loadRunRecord(runId), interpretation));
}

/** The run's review state; a run never submitted is a draft of revision 1. */
async function currentSignoff(runId: number, transaction?: Transaction): Promise<Signoff | null> {
  return Signoff.findByPk(runId, { transaction, ...(transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
}

/** 409 for a change to a run while a version of it is under review. */
export const runInReview = (runId: number) =>
  new HttpError(409, 'run_in_review', `Run ${runId} is in review; withdraw it to draft (reopen) before changing its readings, notes or interpretation.`);

/**
 * Refuses (409) when the run is signed, or in review (what the reviewer reads must not move under them).
 * Call it inside the writing transaction, before the write.
 */
export async function assertRunUnlocked(runId: number, transaction?: Transaction): Promise<void> {
  const s = await currentSignoff(runId, transaction);
  if (s?.state === 'signed') throw runSigned(runId);
  if (s?.state === 'in-review') throw runInReview(runId);
}

/** Where a signed run's record comes from: its plan, its test location, or its project. */
export type SignedRunSource = { planId: number } | { locationId: number } | { projectId: number };

/**
 * Refuses (409) a change to a plan, test location or project that a signed run is built from: a recorded
 * run's record is rebuilt from them, so changing them would change signed data. Call it before the write.
 */
export async function assertNoSignedRunFrom(source: SignedRunSource, transaction?: Transaction): Promise<void> {
  const [column, id] =
    'planId' in source ? ['tp.id', source.planId] : 'locationId' in source ? ['tp.location_id', source.locationId] : ['l.project_id', source.projectId];
  const rows = (await Run.sequelize!.query(
    `SELECT s.run_id AS runId FROM signoffs s JOIN runs r ON r.id = s.run_id JOIN test_plans tp ON tp.id = r.plan_id
     JOIN test_locations l ON l.id = tp.location_id WHERE s.state = 'signed' AND ${column} = :id LIMIT 1`,
    { replacements: { id }, type: QueryTypes.SELECT, transaction },
  )) as { runId: number }[];
  if (rows.length) throw runSigned(rows[0].runId);
}

/** True when the run is signed (its current revision carries a signature and has not been reopened). */
export async function isRunSigned(runId: number): Promise<boolean> {
  return (await Signoff.findByPk(runId))?.state === 'signed';
}

async function requireRun(runId: number): Promise<Run> {
  const run = await Run.findByPk(runId);
  if (!run) throw notFound('Run');
  return run;
}

const wrongState = (message: string) => new HttpError(409, 'signoff_state', message);

export async function signoffView(runId: number): Promise<SignoffView> {
  await requireRun(runId);
  const s = await Signoff.findByPk(runId);
  const signatures = await Signature.findAll({ where: { runId }, order: [['id', 'ASC']] });
  const submitter = s?.submittedBy ? await User.findByPk(s.submittedBy) : null;
  return {
    runId,
    state: s?.state ?? 'draft',
    revision: s?.revision ?? 1,
    interpretationVersion: s?.interpretationVersion ?? null,
    submittedBy: submitter ? { id: submitter.id, name: submitter.name } : null,
    submittedAt: s?.submittedAt?.toISOString() ?? null,
    signatures: signatures.map((x) => x.toDto()),
    revisions: s?.revisions ?? [],
  };
}

/** Submits the run's newest interpretation version for review (again, when already in review). */
export async function submitForReview(user: User, runId: number): Promise<SignoffView> {
  await requireRun(runId);
  await audited(
    async (transaction) => {
      await Run.findByPk(runId, { transaction, lock: transaction.LOCK.UPDATE });
      const s = await currentSignoff(runId, transaction);
      if (s?.state === 'signed') throw wrongState('The run is signed; reopen it as a new revision before submitting again.');
      const version = (await Interpretation.max('version', { where: { runId }, transaction })) as number | null;
      if (!version) throw wrongState('Save an interpretation of the run before submitting it for review.');
      const fields = { state: 'in-review' as const, interpretationVersion: version, submittedBy: user.id, submittedAt: new Date() };
      if (s) await s.update(fields, { transaction });
      else await Signoff.create({ runId, revision: 1, revisions: [], ...fields }, { transaction });
      return { before: s?.state ?? 'draft', version, revision: s?.revision ?? 1 };
    },
    (r) => ({
      userId: user.id,
      entity: 'signoff',
      entityId: runId,
      action: 'submitted',
      before: { state: r.before },
      after: { state: 'in-review', interpretationVersion: r.version, revision: r.revision },
    }),
  );
  return signoffView(runId);
}

export interface SignInput {
  /** The signer's password, asked again at the moment of signing. */
  password: string;
  meaning: SignatureMeaning;
}

/** How signing is set up on this server. */
export interface SignSettings {
  /** Uploads: the site plan and photos printed in the sealed report. */
  dataDir: string;
  /** The signer must be someone other than the submitter (default on); when off, such a signature is audited as an exception. */
  secondSigner: boolean;
}

/**
 * Signs the version under review: the password is checked first (a wrong one is refused with 403 and
 * audited); the signer must not be the submitter unless the server allows it (then it is audited); a
 * signed revision is not signed again. The report is sealed in the same transaction as the signature:
 * its snapshot (hashed) and the PDF rendered from it (hashed), both stored.
 */
export async function signRun(user: User, runId: number, input: SignInput, settings: SignSettings): Promise<SignoffView> {
  await requireRun(runId);
  const fresh = await User.findByPk(user.id);
  if (!fresh || !(await verifyPassword(fresh.passwordHash, input.password))) {
    await audit({ userId: user.id, entity: 'signoff', entityId: runId, action: 'sign-refused', reason: 'password did not match' });
    throw new HttpError(403, 'reauthentication_failed', 'password: does not match; signing needs your own password.', 'password');
  }
  const before = await Signoff.findByPk(runId);
  if (before?.state === 'signed') throw wrongState(`Revision ${before.revision} is already signed; reopen it as a new revision to sign again.`);
  if (!before || before.state === 'draft' || before.interpretationVersion === null) throw wrongState('Submit the run for review before signing.');
  const ownSubmission = before.submittedBy === user.id;
  if (ownSubmission && settings.secondSigner) {
    await audit({ userId: user.id, entity: 'signoff', entityId: runId, action: 'sign-refused', reason: 'the signer submitted the run' });
    throw new HttpError(403, 'signer_is_submitter', 'You submitted this run for review; someone else must sign it.');
  }
  const version = before.interpretationVersion;
  const report = await loadReportData(runId, settings.dataDir);
  const snapshot = canonicalJson(sealedContent(report, before.revision));
  const hash = sha256(snapshot);
  await audited(
    async (transaction) => {
      const s = await currentSignoff(runId, transaction);
      // Someone may have reopened, resubmitted or signed while the report was being gathered.
      if (s?.state !== 'in-review' || s.interpretationVersion !== version || s.revision !== before.revision)
        throw wrongState('The review changed while signing; reload and sign again.');
      const newest = (await Interpretation.max('version', { where: { runId }, transaction })) as number | null;
      if (newest !== version)
        throw wrongState(`Interpretation version ${newest} was saved after version ${version} was submitted; submit again before signing.`);
      await s.update({ state: 'signed' }, { transaction });
      const signedAt = new Date();
      const sig = await Signature.create(
        { runId, revision: s.revision, interpretationVersion: version, userId: user.id, signerName: fresh.name, meaning: input.meaning, dataHash: hash, signedAt },
        { transaction },
      );
      // The PDF shows this signature: the sign-off block as it stands once the signature is in.
      const signoff: SignoffView = { ...report.signoff, state: 'signed', signatures: [...report.signoff.signatures, sig.toDto()] };
      const pdf = await renderReportPdf({ ...report, generatedAt: signedAt, signoff });
      await SignedReport.create({ signatureId: sig.id, runId, snapshot, snapshotHash: hash, pdf, pdfHash: sha256(pdf) }, { transaction });
      return sig;
    },
    (sig) => ({
      userId: user.id,
      entity: 'signoff',
      entityId: runId,
      action: ownSubmission ? 'signed-own-submission' : 'signed',
      before: { state: before.state },
      after: { state: 'signed', revision: sig.revision, meaning: sig.meaning, interpretationVersion: sig.interpretationVersion, dataHash: sig.dataHash },
      ...(ownSubmission ? { reason: 'second-signer rule turned off on this server' } : {}),
    }),
  );
  return signoffView(runId);
}

/**
 * The sealed report of the run's current revision when it is signed: its PDF, its record as signed and the
 * snapshot text itself (what the signature's hash is the SHA-256 of); else null.
 */
export async function sealedReport(runId: number): Promise<{ revision: number; pdf: Buffer; record: SealedContent['record']; snapshot: string } | null> {
  const s = await Signoff.findByPk(runId);
  if (s?.state !== 'signed') return null;
  const sig = await Signature.findOne({ where: { runId, revision: s.revision }, order: [['id', 'DESC']] });
  const sealed = sig && (await SignedReport.findByPk(sig.id));
  if (!sealed) return null;
  return { revision: s.revision, pdf: sealed.pdf, record: (JSON.parse(sealed.snapshot) as SealedContent).record, snapshot: sealed.snapshot };
}

/**
 * Opens a run for changes: a signed run as the next revision (the reason is kept and earlier signatures
 * stay); a run in review goes back to draft in the same revision (withdrawn, the reason audited).
 */
export async function reopenRun(user: User, runId: number, reason: string): Promise<SignoffView> {
  await requireRun(runId);
  await audited(
    async (transaction) => {
      const s = await currentSignoff(runId, transaction);
      if (s?.state === 'in-review') {
        await s.update({ state: 'draft', submittedBy: null, submittedAt: null }, { transaction });
        return { from: 'in-review' as const, revision: s.revision };
      }
      if (s?.state !== 'signed') throw wrongState('Only a signed run or one in review can be reopened.');
      const revision = s.revision + 1;
      await s.update(
        {
          state: 'draft',
          revision,
          submittedBy: null,
          submittedAt: null,
          revisions: [...s.revisions, { revision, reason, userId: user.id, at: new Date().toISOString() }],
        },
        { transaction },
      );
      return { from: 'signed' as const, revision };
    },
    ({ from, revision }) => ({
      userId: user.id,
      entity: 'signoff',
      entityId: runId,
      action: from === 'signed' ? 'reopened' : 'withdrawn',
      before: { state: from, revision: from === 'signed' ? revision - 1 : revision },
      after: { state: 'draft', revision },
      reason,
    }),
  );
  return signoffView(runId);
}

/** One signature against its sealed report as stored (or, before sealed snapshots, the legacy hash of today's data). */
async function checkSignature(sig: Signature): Promise<SignatureCheck & { snapshot: string | null }> {
  const sealed = await SignedReport.findByPk(sig.id);
  const snapshotHash = sealed ? sha256(sealed.snapshot) : await legacyDataHash(sig.runId, sig.interpretationVersion);
  return {
    signatureId: sig.id,
    revision: sig.revision,
    interpretationVersion: sig.interpretationVersion,
    signerName: sig.signerName,
    recordedHash: sig.dataHash,
    snapshotHash: sealed ? snapshotHash : null,
    matches: snapshotHash === sig.dataHash && (!sealed || sealed.snapshotHash === sig.dataHash),
    pdfMatches: sealed ? sha256(sealed.pdf) === sealed.pdfHash : null,
    snapshot: sealed?.snapshot ?? null,
  };
}

/** Top-level parts of two snapshots that differ (project, location, instruments, sitePlan…). */
function changedParts(signed: Record<string, unknown>, live: Record<string, unknown>): string[] {
  const keys = [...new Set([...Object.keys(signed), ...Object.keys(live)])].sort();
  return keys.filter((k) => canonicalJson(signed[k]) !== canonicalJson(live[k]));
}

/**
 * Checks every signature of every revision against its sealed snapshot and PDF as stored, and says
 * separately whether today's live data still match the newest snapshot (drift never alters a signature).
 */
export async function verifyRun(runId: number, dataDir: string): Promise<Verification> {
  await requireRun(runId);
  const signatures = await Signature.findAll({ where: { runId }, order: [['id', 'ASC']] });
  if (signatures.length === 0) throw wrongState('The run has no signature to verify.');
  const checks = [];
  for (const sig of signatures) checks.push(await checkSignature(sig));
  const last = checks[checks.length - 1];
  const signed = last.snapshot === null ? null : (JSON.parse(last.snapshot) as Record<string, unknown>);
  const live = sealedContent(await loadReportData(runId, dataDir), last.revision) as unknown as Record<string, unknown>;
  const liveHash = sha256Canonical(live);
  const changed = signed ? changedParts(signed, JSON.parse(canonicalJson(live))) : [];
  const liveMatches = signed ? liveHash === last.snapshotHash : last.matches;
  return {
    runId,
    revision: last.revision,
    interpretationVersion: last.interpretationVersion,
    recordedHash: last.recordedHash,
    currentHash: last.snapshotHash ?? liveHash,
    matches: checks.every((c) => c.matches && c.pdfMatches !== false),
    signatures: checks.map(({ snapshot: _s, ...c }) => c),
    live: {
      matches: liveMatches,
      hash: liveHash,
      changed,
      message: liveMatches
        ? 'Today’s data match the signed report.'
        : `Changed since signing${changed.length ? ` (${changed.join(', ')})` : ''}: open a revision to sign the changes.`,
    },
  };
}
