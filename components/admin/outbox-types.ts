import type { MailPurpose, OutgoingMailState } from '@/models/vocabulary';

export interface MailerStatus {
  mode: 'smtp' | 'local';
  server: string | null;
  problem: string | null;
}

export interface OutgoingMailRow {
  id: number;
  to: string;
  purpose: MailPurpose;
  subject: string;
  state: OutgoingMailState;
  attempts: number;
  nextAttemptAt: string | null;
  lastError: string | null;
  sentAt: string | null;
  createdAt: string;
}

export interface ReceivedMailRow {
  id: number;
  from: string;
  to: string[];
  subject: string;
  receivedAt: string;
}

export interface ReceivedMailDetail extends ReceivedMailRow {
  messageId: string | null;
  size: number;
  text: string;
  /** Sanitised on the server (lib/mail/sanitize-html.ts). */
  html: string | null;
}
