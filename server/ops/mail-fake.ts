/**
 * A local SMTP catcher (the `smtp-server` package) on 127.0.0.1: it accepts every message, delivers
 * nothing further, and stores what it received in `mail_messages` so an admin can read it in the app.
 */
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { MailMessage } from '../models/mail-message';
import { summarizeMime } from '../services/mime-summary';

export interface MailFake {
  host: string;
  port: number;
  close(): Promise<void>;
}

/** Largest message accepted, bytes (the report PDF with its CSV is well under this). */
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

/** Starts the catcher on 127.0.0.1:`port` (0 = any free port). */
export async function startMailFake(port = 0): Promise<MailFake> {
  const host = '127.0.0.1';
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) return callback(new Error('Message too large'));
        const summary = summarizeMime(raw.toString('utf8'));
        MailMessage.create({
          receivedAt: new Date(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          subject: summary.subject.slice(0, 500),
          text: summary.text.slice(0, 60_000),
          attachments: summary.attachments,
          sizeBytes: raw.length,
        }).then(
          () => callback(),
          (err: Error) => callback(err),
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const actual = (server.server.address() as AddressInfo).port;
  return { host, port: actual, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
