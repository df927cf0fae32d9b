/**
 * The local mail catcher for development and tests: an SMTP server on loopback that accepts every
 * message, parses it, and keeps it as a JSON file in a folder, where the Outbox page reads it. It
 * stands in for a real mail service, which this product reaches through SMTP_URL in production.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerSession } from 'smtp-server';
import type { CaughtMail } from './outbox-store';

/** A running catcher. */
export interface MailCatcher {
  port: number;
  smtpUrl: string;
  stop(): Promise<void>;
}

/** Starts the catcher on 127.0.0.1 (port 0 picks a free one), storing messages under `folder`. */
export async function startMailCatcher(folder: string, port = 0): Promise<MailCatcher> {
  mkdirSync(folder, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Loadwright local mail catcher',
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      storeMessage(folder, stream, session).then(
        () => callback(),
        (error: unknown) => callback(error as Error),
      );
    },
  });
  server.on('error', () => {}); // a client dropping its connection must not stop the catcher
  await new Promise<void>((done, fail) => {
    server.server.once('error', fail);
    server.listen(port, '127.0.0.1', () => done());
  });
  const actual = (server.server.address() as AddressInfo).port;
  return {
    port: actual,
    smtpUrl: `smtp://127.0.0.1:${actual}`,
    stop: () => new Promise<void>((done) => server.close(() => done())),
  };
}

/** Parses one received message and writes it to `folder` as JSON named by its arrival time. */
async function storeMessage(folder: string, stream: Readable, session: SMTPServerSession): Promise<void> {
  const parsed = await simpleParser(stream);
  const receivedAt = new Date();
  const id = `${receivedAt.getTime().toString().padStart(14, '0')}-${randomBytes(4).toString('hex')}`;
  const mail: CaughtMail = {
    id,
    receivedAt: receivedAt.toISOString(),
    from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
    to: session.envelope.rcptTo.map((r) => r.address),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : '',
  };
  writeFileSync(join(folder, `${id}.json`), JSON.stringify(mail));
}
