/**
 * Review and sign-off of a run (QUALITY.md S7): an engineer submits an interpretation version for review,
 * a signer re-enters the password and signs with a meaning, and the signature records a SHA-256 hash of the
 * canonical run data (the run's test record plus the interpretation version signed). A signed run is locked;
 * reopening it starts a new revision with a reason, and earlier signatures stay on record.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { TestRecord } from '../../shared/records/schema';
import type { SignatureMeaning, SignoffView, Verification } from '../../shared/schemas/signoff';
import { verifyPassword } from '../auth/passwords';
import { HttpError, notFound } from '../http/errors';
import { Interpretation } from '../models/interpretation';
import { Run } from '../models/run';
import { Signature, Signoff } from '../models/signoff';
import { User } from '../models/user';
import { audit, audited } from './audit';
import { sha256Canonical } from './canonical-json';
import { loadRunRecord } from './run-record';

/** 409 for any change to a signed run's data or interpretation. */
export const runSigned = (runId: number) =>
  new HttpError(409, 'run_signed', `Run ${runId} is signed and locked; reopen it as a new revision (with a reason) to change it.`);

/** What a signature's hash covers: the run's record and the interpretation version as saved. */
export function signedContent(record: TestRecord, interpretation: Interpretation) {
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

/** The SHA-256 of a run's record and one of its interpretation versions, as it stands now. */
export async function runDataHash(runId: number, interpretationVersion: number): Promise<string> {
  const interpretation = await Interpretation.findOne({ where: { runId, version: interpretationVersion } });
  if (!interpretation) throw notFound(`Interpretation version ${interpretationVersion}`);
  return sha256Canonical(signedContent(await loadRunRecord(runId), interpretation));
}

/** The run's review state; a run never submitted is a draft of revision 1. */
async function currentSignoff(runId: number, transaction?: Transaction): Promise<Signoff | null> {
  return Signoff.findByPk(runId, { transaction, ...(transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
}

/** Refuses (409) when the run is signed. Call it inside the writing transaction, before the write. */
export async function assertRunUnlocked(runId: number, transaction?: Transaction): Promise<void> {
  const s = await currentSignoff(runId, transaction);
  if (s?.state === 'signed') throw runSigned(runId);
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

/**
 * Signs the version under review (or countersigns a signed revision). The password is checked first;
 * a wrong one is refused with 403 and audited. The hash is of the data as they are at this moment.
 */
export async function signRun(user: User, runId: number, input: SignInput): Promise<SignoffView> {
  await requireRun(runId);
  const fresh = await User.findByPk(user.id);
  if (!fresh || !(await verifyPassword(fresh.passwordHash, input.password))) {
    await audit({ userId: user.id, entity: 'signoff', entityId: runId, action: 'sign-refused', reason: 'password did not match' });
    throw new HttpError(403, 'reauthentication_failed', 'password: does not match; signing needs your own password.', 'password');
  }
  const before = await Signoff.findByPk(runId);
  if (!before || before.state === 'draft' || before.interpretationVersion === null) throw wrongState('Submit the run for review before signing.');
  const version = before.interpretationVersion;
  const hash = await runDataHash(runId, version);
  await audited(
    async (transaction) => {
      const s = await currentSignoff(runId, transaction);
      // Someone may have reopened or resubmitted while the hash was being computed.
      if (!s || s.state === 'draft' || s.interpretationVersion !== version || s.revision !== before.revision)
        throw wrongState('The review changed while signing; reload and sign again.');
      const newest = (await Interpretation.max('version', { where: { runId }, transaction })) as number | null;
      if (newest !== version)
        throw wrongState(`Interpretation version ${newest} was saved after version ${version} was submitted; submit again before signing.`);
      await s.update({ state: 'signed' }, { transaction });
      return Signature.create(
        {
          runId,
          revision: s.revision,
          interpretationVersion: version,
          userId: user.id,
          signerName: fresh.name,
          meaning: input.meaning,
          dataHash: hash,
          signedAt: new Date(),
        },
        { transaction },
      );
    },
    (sig) => ({
      userId: user.id,
      entity: 'signoff',
      entityId: runId,
      action: 'signed',
      before: { state: before.state },
      after: { state: 'signed', revision: sig.revision, meaning: sig.meaning, interpretationVersion: sig.interpretationVersion, dataHash: sig.dataHash },
    }),
  );
  return signoffView(runId);
}

/** Opens a signed run for changes as the next revision; the reason is kept and earlier signatures stay. */
export async function reopenRun(user: User, runId: number, reason: string): Promise<SignoffView> {
  await requireRun(runId);
  await audited(
    async (transaction) => {
      const s = await currentSignoff(runId, transaction);
      if (s?.state !== 'signed') throw wrongState('Only a signed run is reopened as a new revision.');
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
      return revision;
    },
    (revision) => ({
      userId: user.id,
      entity: 'signoff',
      entityId: runId,
      action: 'reopened',
      before: { state: 'signed', revision: revision - 1 },
      after: { state: 'draft', revision },
      reason,
    }),
  );
  return signoffView(runId);
}

/** Recomputes the hash of the latest signature's data and compares it with the one recorded. */
export async function verifyRun(runId: number): Promise<Verification> {
  await requireRun(runId);
  const last = await Signature.findOne({ where: { runId }, order: [['id', 'DESC']] });
  if (!last) throw wrongState('The run has no signature to verify.');
  const currentHash = await runDataHash(runId, last.interpretationVersion);
  return {
    runId,
    revision: last.revision,
    interpretationVersion: last.interpretationVersion,
    recordedHash: last.dataHash,
    currentHash,
    matches: currentHash === last.dataHash,
  };
}
