// The local stand-in mail server: an SMTP server on 127.0.0.1 (smtp-server) that parses every message it receives
// (mailparser) and stores it in the database, so that without a real mail service the mails can still be read,
// and their links followed, on the admins' Outbox page.
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { db } from '../db/connection';

/** Messages larger than this are refused (ours are a few kB). */
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

export interface LocalMailServer {
  port: number;
  close(): Promise<void>;
}

function addressesOf(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return list.flatMap((object) => object.value.map((address) => address.address ?? '')).filter((address) => address !== '');
}

async function storeMessage(raw: Buffer, envelopeTo: string[]): Promise<void> {
  const parsed = await simpleParser(raw);
  const { models, write } = db();
  await write((transaction) =>
    models.ReceivedMail.create(
      {
        messageId: parsed.messageId ?? null,
        sender: addressesOf(parsed.from)[0] ?? '(unknown)',
        recipients: envelopeTo.length > 0 ? envelopeTo : addressesOf(parsed.to),
        subject: parsed.subject ?? '(no subject)',
        textBody: parsed.text ?? '',
        htmlBody: typeof parsed.html === 'string' ? parsed.html : null,
        size: raw.length,
      },
      { transaction },
    ),
  );
}

export function startLocalMailServer(port: number): Promise<LocalMailServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Splitfield local mail server',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const envelopeTo = session.envelope.rcptTo.map((recipient) => recipient.address);
        storeMessage(Buffer.concat(chunks), envelopeTo).then(
          () => callback(),
          (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
        );
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      server.on('error', (error) => console.error('[mail] local mail server:', error));
      resolve({
        port: (server.server.address() as AddressInfo).port,
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}
