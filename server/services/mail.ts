/**
 * Outgoing e-mail through nodemailer: the signed report to the client's contacts, and notices to staff
 * when a run finishes or is submitted for review. The SMTP server is set once at start-up ({@link configureMailer}).
 */
import nodemailer, { type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import { Op } from 'sequelize';
import { recordToReadingsCsv } from '../../shared/records/csv';
import type { SmtpServer } from '../config';
import { HttpError } from '../http/errors';
import { Run } from '../models/run';
import { User } from '../models/user';
import { audit } from './audit';
import type { DomainEvents } from './domain-events';
import { clientContacts } from './report-access';
import { loadReportData } from './report-data';
import { renderReportPdf } from './report-pdf';
import { loadRunRecord } from './run-record';
import { sealedReport } from './signoff';

/** Where mail goes: the SMTP server and the sender (from `ServerConfig.mail`). */
export interface MailerOptions extends SmtpServer {
  /** Sender address. */
  from: string;
}

let transport: Transporter | null = null;
let sender = 'reports@settlescope.local';

/** nodemailer's connection options for a server: implicit TLS, STARTTLS required (never plain after a failed upgrade), or plain. */
export function transportOptions(server: SmtpServer): SMTPTransport.Options {
  return {
    host: server.host,
    port: server.port,
    secure: server.security === 'tls',
    requireTLS: server.security === 'starttls',
    ignoreTLS: server.security === 'none',
    ...(server.auth ? { auth: { user: server.auth.user, pass: server.auth.password } } : {}),
    ...(server.ca ? { tls: { ca: server.ca } } : {}),
    // Fail a send in seconds, not the library's minutes, so the person sending hears why.
    connectionTimeout: 15_000,
    greetingTimeout: 15_000,
    socketTimeout: 60_000,
  };
}

/**
 * Points outgoing mail at an SMTP server. Returns a release that turns mail off again unless someone
 * configured another server since (tests run several servers in turn).
 */
export function configureMailer(options: MailerOptions): () => void {
  transport?.close();
  const mine = nodemailer.createTransport(transportOptions(options));
  transport = mine;
  sender = options.from;
  return () => {
    mine.close();
    if (transport === mine) transport = null;
  };
}

const mailUnavailable = () => new HttpError(503, 'mail_unavailable', 'No mail server is configured on this server.');

/**
 * 502 with the mail server's reason (wrong credentials, untrusted certificate, unreachable…) for the
 * person who sent, instead of an internal error; the server's own words are kept, the password never is.
 */
function mailRefused(err: Error & { code?: string }): HttpError {
  const why: Record<string, string> = {
    EAUTH: 'the mail server refused the sign-in (check SSCOPE_SMTP_USER and SSCOPE_SMTP_PASSWORD)',
    ETLS: 'the secure connection to the mail server failed (check SSCOPE_SMTP_SECURITY and SSCOPE_SMTP_CA_FILE)',
    ECONNECTION: 'the mail server could not be reached or closed the connection (check SSCOPE_SMTP_HOST, SSCOPE_SMTP_PORT and SSCOPE_SMTP_SECURITY)',
    ESOCKET: 'the connection to the mail server failed (check SSCOPE_SMTP_HOST, SSCOPE_SMTP_PORT, SSCOPE_SMTP_SECURITY and SSCOPE_SMTP_CA_FILE)',
    ETIMEDOUT: 'the mail server did not answer in time',
    EENVELOPE: 'the mail server refused a sender or recipient address',
    EMESSAGE: 'the mail server refused the message',
  };
  const reason = why[err.code ?? ''] ?? 'the mail server did not take the message';
  return new HttpError(502, 'mail_failed', `Not sent: ${reason}. The server said: ${err.message}`);
}

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  attachments?: { filename: string; content: Buffer | string; contentType: string }[];
}

export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string; accepted: string[] }> {
  if (!transport) throw mailUnavailable();
  const info = await transport.sendMail({ from: sender, ...mail }).catch((err: Error & { code?: string }) => {
    throw mailRefused(err);
  });
  return { messageId: info.messageId, accepted: (info.accepted ?? []).map(String) };
}

/** E-mails a signed run's PDF report and its readings CSV to the client organisation's contacts; audited. */
export async function sendRunReport(user: User, runId: number, dataDir: string): Promise<{ to: string[]; subject: string; attachments: string[] }> {
  const data = await loadReportData(runId, dataDir);
  const sealed = await sealedReport(runId);
  if (data.signoff.state !== 'signed') throw new HttpError(409, 'run_not_signed', 'Only a signed run’s report is sent; sign it first.');
  const contacts = await clientContacts(runId);
  if (contacts.emails.length === 0)
    throw new HttpError(409, 'no_contacts', `${contacts.organizationName} has no contact e-mail address; add one to the organisation first.`);
  const pdfName = `run-${runId}-report-rev${data.signoff.revision}.pdf`;
  const csvName = `run-${runId}-readings.csv`;
  const subject = `Plate load test report: ${contacts.projectCode}, pit ${contacts.pitId} (revision ${data.signoff.revision})`;
  const text = [
    `Dear ${contacts.organizationName},`,
    '',
    `Attached is the signed report of the plate load test at pit ${contacts.pitId} (${data.project.name}), revision ${data.signoff.revision}, with every reading as CSV.`,
    '',
    `Sent by ${user.name}.`,
  ].join('\n');
  const attachments = [
    // The sealed PDF and record, exactly as signed (a run signed before sealing existed is rendered as it is now).
    { filename: pdfName, content: sealed?.pdf ?? (await renderReportPdf(data)), contentType: 'application/pdf' },
    { filename: csvName, content: recordToReadingsCsv(sealed?.record ?? (await loadRunRecord(runId))), contentType: 'text/csv' },
  ];
  await sendMail({ to: contacts.emails, subject, text, attachments });
  await audit({
    userId: user.id,
    entity: 'report',
    entityId: runId,
    action: 'sent',
    after: { to: contacts.emails, revision: data.signoff.revision, attachments: [pdfName, csvName] },
  });
  return { to: contacts.emails, subject, attachments: [pdfName, csvName] };
}

/**
 * Sends a notice about a run to staff. Never throws (a mail failure must not disturb a run or a review)
 * and does nothing when no mail server is configured. Resolves to the addresses written to.
 */
async function notifyStaff(
  runId: number,
  what: string,
  recipients: () => Promise<User[]>,
  message: (c: Awaited<ReturnType<typeof clientContacts>>) => { subject: string; text: string },
): Promise<string[]> {
  if (!transport) return [];
  try {
    const to = (await recipients()).map((u) => u.email);
    if (!(await Run.findByPk(runId)) || to.length === 0) return [];
    await sendMail({ to, ...message(await clientContacts(runId)) });
    return to;
  } catch (err) {
    console.error(`run ${runId}: the ${what} was not sent: ${(err as Error).message}`);
    return [];
  }
}

/** Tells the engineers (active users with role engineer) that a run finished ('completed' or 'stopped'). */
export const notifyRunFinished = (runId: number, phase: 'completed' | 'stopped', reason?: string) =>
  notifyStaff(
    runId,
    'finish notice',
    () => User.findAll({ where: { role: 'engineer', active: true } }),
    (c) => ({
      subject: `Run ${runId} ${phase}: ${c.projectCode}, pit ${c.pitId}`,
      text: `Run ${runId} at pit ${c.pitId} (${c.projectCode}) ${phase === 'completed' ? 'completed' : 'was stopped'}${reason ? `: ${reason}` : ''}.\nIt is ready for interpretation and review.`,
    }),
  );

/** Tells the other engineers and admins (who may sign) that a run was submitted for review. */
export const notifyReviewRequested = (runId: number, submitter: { id: number; name: string }) =>
  notifyStaff(
    runId,
    'review request',
    () => User.findAll({ where: { role: ['engineer', 'admin'], active: true, id: { [Op.ne]: submitter.id } } }),
    (c) => ({
      subject: `Run ${runId} needs review: ${c.projectCode}, pit ${c.pitId}`,
      text: `${submitter.name} submitted run ${runId} at pit ${c.pitId} (${c.projectCode}) for review.\nOpen its review page in Settlescope to check the interpretation and sign it.`,
    }),
  );

/** The staff notices, heard from the run and sign-off events (subscribed once at start-up); returns the unsubscribe. */
export function subscribeMailNotices(events: DomainEvents): () => void {
  const off = [
    events.on('run-closed', (e) => notifyRunFinished(e.runId, e.phase, e.reason ?? undefined)),
    events.on('submitted-for-review', (e) => notifyReviewRequested(e.runId, e.submitter)),
  ];
  return () => {
    for (const f of off) f();
  };
}
