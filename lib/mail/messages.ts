// The words of every mail the server sends (README "Mail" lists them). Each says why it was sent and how to stop it.
import { NOTIFICATION_KIND_LABELS, type NotificationKind, type StudyRole } from '@/models/vocabulary';
import { composeMail, type ComposedMail } from './compose';

const PRODUCT = 'Splitfield';

export function invitationMail(input: {
  inviterName: string;
  studyTitle: string;
  role: StudyRole;
  email: string;
  url: string;
  expiresAt: Date;
}): ComposedMail {
  return composeMail({
    subject: `${input.inviterName} invites you to the study “${input.studyTitle}”`,
    paragraphs: [
      `${input.inviterName} invites you to join the study “${input.studyTitle}” on ${PRODUCT} as ${input.role}.`,
      `Follow the link to accept. Without an account you can create one there with this address (${input.email}). The link works once and until ${input.expiresAt.toUTCString()}.`,
    ],
    action: { label: 'Accept the invitation', url: input.url },
    why: `an owner of the study “${input.studyTitle}” invited ${input.email}.`,
    stop: 'ignore this mail if you do not want to join; nothing more is sent about this invitation.',
  });
}

export function passwordResetMail(input: { email: string; url: string; expiresAt: Date }): ComposedMail {
  return composeMail({
    subject: `Reset your ${PRODUCT} password`,
    paragraphs: [
      `Someone asked to reset the password of the ${PRODUCT} account ${input.email}.`,
      `Follow the link to choose a new password. It works once and until ${input.expiresAt.toUTCString()}. Choosing a new password signs the account out everywhere.`,
    ],
    action: { label: 'Choose a new password', url: input.url },
    why: `a password reset was asked for the account ${input.email}.`,
    stop: 'if it was not you, ignore this mail: your password stays as it is.',
  });
}

function notificationStop(profileUrl: string, kinds: string): string {
  return `turn off mails about ${kinds} (or choose one daily digest) under "Mail" on your profile: ${profileUrl}`;
}

export function notificationMail(input: { kind: NotificationKind; summary: string; url: string; profileUrl: string }): ComposedMail {
  const label = NOTIFICATION_KIND_LABELS[input.kind];
  const subject = input.summary.length > 150 ? `${input.summary.slice(0, 149)}…` : input.summary;
  return composeMail({
    subject,
    paragraphs: [input.summary],
    action: { label: 'Open it', url: input.url },
    why: `you asked for a mail when ${label}.`,
    stop: notificationStop(input.profileUrl, `“${label}”`),
  });
}

export function digestMail(input: { items: Array<{ summary: string; url: string }>; profileUrl: string }): ComposedMail {
  const count = input.items.length;
  return composeMail({
    subject: `${PRODUCT}: ${count} ${count === 1 ? 'notification' : 'notifications'} of the day`,
    paragraphs: [`What happened since your last digest:`],
    items: input.items.map((item) => ({ text: item.summary, url: item.url })),
    why: 'you chose one daily digest instead of one mail per event.',
    stop: notificationStop(input.profileUrl, 'each kind'),
  });
}
