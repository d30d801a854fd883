// The process's mailer, started by instrumentation.ts with the server: it starts the local stand-in mail server
// when no real SMTP host is configured, then, on every wake-up (a mail queued) and every few seconds, turns
// pending notifications into mails and sends the queued mails that are due. A failed send is retried with
// back-off (config.ts) and, after the last attempt, marked failed for the admins' Outbox.
import nodemailer, { type Transporter } from 'nodemailer';
import { Op } from 'sequelize';
import { db } from '../db/connection';
import type { OutgoingMail } from '@/models/outgoing-mail';
import { readMailConfig, retryDelayMs, type MailConfig } from './config';
import { startLocalMailServer, type LocalMailServer } from './local-server';
import { mailPendingNotifications } from './notification-mails';
import { onMailQueued } from './queue';

/** Mails sent per round; the rest follow in the next. */
const SEND_BATCH = 20;

/** Where mail goes, for the Outbox page. */
export interface MailerStatus {
  mode: 'smtp' | 'local';
  /** host:port of the mail server the mails are handed to; null when the local one could not start. */
  server: string | null;
  /** Why the local mail server is not running. */
  problem: string | null;
}

function logFailure(what: string, error: unknown): void {
  console.error(`[mail] ${what}:`, error);
}

export class Mailer {
  private transport: Transporter | null = null;
  private local: LocalMailServer | null = null;
  private problem: string | null = null;
  private timer: NodeJS.Timeout | null = null;
  private round: Promise<void> | null = null;
  private again = false;

  constructor(readonly config: MailConfig) {}

  async start(): Promise<void> {
    const { smtp } = this.config;
    if (smtp) {
      this.transport = nodemailer.createTransport({
        host: smtp.host,
        port: smtp.port,
        secure: smtp.secure,
        auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
        connectionTimeout: 10_000,
        greetingTimeout: 10_000,
        socketTimeout: 30_000,
      });
    } else {
      try {
        this.local = await startLocalMailServer(this.config.localPort);
        this.transport = nodemailer.createTransport({ host: '127.0.0.1', port: this.local.port, secure: false, ignoreTLS: true });
        console.log(`[mail] local mail server on 127.0.0.1:${this.local.port}; read its mail on the admins' Outbox page`);
      } catch (error) {
        // Mails stay queued (and visible on the Outbox) rather than the server failing to start.
        this.problem = `The local mail server could not start: ${error instanceof Error ? error.message : String(error)}`;
        logFailure('local mail server', error);
      }
    }
    onMailQueued(() => this.wake());
    this.wake();
  }

  status(): MailerStatus {
    const { smtp } = this.config;
    if (smtp) return { mode: 'smtp', server: `${smtp.host}:${smtp.port}`, problem: null };
    return { mode: 'local', server: this.local ? `127.0.0.1:${this.local.port}` : null, problem: this.problem };
  }

  /** Runs a round now (or right after the one running), then keeps polling. */
  wake(): void {
    if (this.round) {
      this.again = true;
      return;
    }
    if (this.timer) clearTimeout(this.timer);
    this.round = this.runRound()
      .catch((error) => logFailure('round', error))
      .finally(() => {
        this.round = null;
        if (this.again) {
          this.again = false;
          this.wake();
        } else {
          this.timer = setTimeout(() => this.wake(), this.config.pollSeconds * 1000);
          this.timer.unref();
        }
      });
  }

  private async runRound(): Promise<void> {
    await mailPendingNotifications(this.config);
    if (!this.transport) return;
    const due = await db().models.OutgoingMail.findAll({
      where: { state: 'queued', nextAttemptAt: { [Op.lte]: new Date() } },
      order: [['nextAttemptAt', 'ASC'], ['id', 'ASC']],
      limit: SEND_BATCH,
    });
    for (const mail of due) await this.send(mail, this.transport);
  }

  private async send(mail: OutgoingMail, transport: Transporter): Promise<void> {
    const { write } = db();
    try {
      await transport.sendMail({ from: this.config.from, to: mail.toAddress, subject: mail.subject, text: mail.textBody, html: mail.htmlBody });
      await write((transaction) =>
        mail.update({ state: 'sent', attempts: mail.attempts + 1, sentAt: new Date(), nextAttemptAt: null, lastError: null }, { transaction }),
      );
    } catch (error) {
      const attempts = mail.attempts + 1;
      const givenUp = attempts >= this.config.maxAttempts;
      const message = error instanceof Error ? error.message : String(error);
      await write((transaction) =>
        mail.update(
          {
            state: givenUp ? 'failed' : 'queued',
            attempts,
            lastError: message,
            nextAttemptAt: givenUp ? null : new Date(Date.now() + retryDelayMs(this.config, attempts)),
          },
          { transaction },
        ),
      );
    }
  }
}

const processWideKey = Symbol.for('splitfield.mailer');
type ProcessWide = typeof globalThis & { [processWideKey]?: Promise<Mailer> };

/** The process's mailer, started on first use; kept on globalThis because each route bundle may load this module. */
export function mailer(): Promise<Mailer> {
  const holder = globalThis as ProcessWide;
  holder[processWideKey] ??= (async () => {
    const started = new Mailer(readMailConfig());
    await started.start();
    return started;
  })().catch((error: unknown) => {
    delete holder[processWideKey];
    throw error;
  });
  return holder[processWideKey];
}

/** The running mailer's status, or null when this process has none (only the server runs one). */
export async function mailerStatus(): Promise<MailerStatus | null> {
  const running = (globalThis as ProcessWide)[processWideKey];
  return running ? (await running).status() : null;
}
