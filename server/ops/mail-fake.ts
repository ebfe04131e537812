/**
 * A local SMTP catcher (the `smtp-server` package) on 127.0.0.1: it accepts every message, delivers
 * nothing further, and stores what it received in `mail_messages` so an admin can read it in the app.
 * It starts only when no real SMTP server is configured. Tests can also run it as if it were remote:
 * with a certificate (implicit TLS or STARTTLS) and a user and password to sign in with.
 */
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerOptions } from 'smtp-server';
import type { MailConfig, SmtpServer } from '../config';
import { type MailAttachmentInfo, MailMessage } from '../models/mail-message';

export interface MailFake {
  host: string;
  port: number;
  close(): Promise<void>;
}

export interface MailFakeOptions {
  /** 0 = any free port. */
  port?: number;
  /** A certificate to serve: TLS from the first byte (`implicit`) or offered through STARTTLS. */
  tls?: { key: string; cert: string; implicit: boolean };
  /** Accept mail only after AUTH with this user and password (over TLS only). */
  auth?: { user: string; password: string };
}

/** What the mailbox shows of a message. */
export interface MessageSummary {
  subject: string;
  text: string;
  attachments: MailAttachmentInfo[];
}

/** Largest message accepted, bytes (the report PDF with its CSV is well under this). */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

/** Subject, plain text and each attachment's name, type and decoded size, read by mailparser. */
export async function summarizeMessage(raw: Buffer): Promise<MessageSummary> {
  const mail = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipTextLinks: true, skipImageLinks: true });
  return {
    subject: mail.subject ?? '',
    text: (mail.text ?? '').replace(/\r\n/g, '\n').trimEnd(),
    attachments: mail.attachments.map((a) => ({ fileName: a.filename ?? 'unnamed', contentType: a.contentType, sizeBytes: a.size })),
  };
}

/** Starts the catcher on 127.0.0.1 (plain SMTP with no sign-in unless `tls`/`auth` say otherwise). */
export async function startMailFake(options: MailFakeOptions = {}): Promise<MailFake> {
  const host = '127.0.0.1';
  const { tls, auth } = options;
  const security: SMTPServerOptions = tls
    ? { secure: tls.implicit, key: tls.key, cert: tls.cert, disabledCommands: auth ? [] : ['AUTH'] }
    : { disabledCommands: ['AUTH', 'STARTTLS'] };
  const server = new SMTPServer({
    ...security,
    authOptional: !auth,
    authMethods: ['PLAIN', 'LOGIN'],
    onAuth(login, _session, callback) {
      if (auth && login.username === auth.user && login.password === auth.password) return callback(null, { user: login.username });
      callback(new Error('Invalid username or password'));
    },
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) return callback(new Error('Message too large'));
        summarizeMessage(raw)
          .then((summary) =>
            MailMessage.create({
              receivedAt: new Date(),
              envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
              envelopeTo: session.envelope.rcptTo.map((r) => r.address),
              subject: summary.subject.slice(0, 500),
              text: summary.text.slice(0, 60_000),
              attachments: summary.attachments,
              sizeBytes: raw.length,
            }),
          )
          .then(
            () => callback(),
            (err: Error) => callback(err),
          );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const actual = (server.server.address() as AddressInfo).port;
  return { host, port: actual, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

/** The configured SMTP server, or (none configured) a catcher started for the purpose, plain SMTP on 127.0.0.1. */
export async function mailTarget(mail: MailConfig): Promise<{ smtp: SmtpServer; catcher: MailFake | null }> {
  if (mail.smtp) return { smtp: mail.smtp, catcher: null };
  const catcher = await startMailFake({ port: mail.catcherPort });
  return { smtp: { host: catcher.host, port: catcher.port, security: 'none', auth: null, ca: null }, catcher };
}
