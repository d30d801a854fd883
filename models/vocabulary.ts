// Words shared by the database, the API and the pages. Kept free of server imports so client code can use them.

/** Study roles, weakest first: each role may do everything the roles before it may. */
export const STUDY_ROLES = ['viewer', 'commenter', 'editor', 'owner'] as const;
export type StudyRole = (typeof STUDY_ROLES)[number];

export const SITE_ROLES = ['member', 'admin'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

export const ENTRY_KINDS = ['note', 'map', 'contrast', 'separation'] as const;
export type EntryKind = (typeof ENTRY_KINDS)[number];

export const STUDY_TITLE_MAX = 200;
export const STUDY_DESCRIPTION_MAX = 5000;
export const ENTRY_TITLE_MAX = 200;
export const NOTE_BODY_MAX = 200_000;
export const USER_NAME_MAX = 100;
export const PASSWORD_MIN = 8;
// bcrypt only reads the first 72 bytes; a longer password would pass with any tail.
export const PASSWORD_MAX = 72;

/** A sample's processing states: queued → running → done | failed | cancelled. */
export const SAMPLE_STATES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type SampleState = (typeof SAMPLE_STATES)[number];
/** States in which a sample's job is still to finish. */
export const UNFINISHED_SAMPLE_STATES = ['queued', 'running'] as const satisfies readonly SampleState[];

export const SAMPLE_NAME_MAX = 200;
export const SAMPLE_LABEL_MAX = 60;
export const SAMPLE_DESCRIPTION_MAX = 5000;
export const SAMPLE_TAG_MAX = 40;
export const SAMPLE_TAGS_MAX = 20;
export const API_TOKEN_NAME_MAX = 100;

/**
 * What a notification is about. Each becomes a mail (or a digest line) for a person who has that kind turned on:
 * someone mentioned them, someone replied in a thread they take part in, a sample they uploaded finished or failed.
 */
export const NOTIFICATION_KINDS = ['mention', 'reply', 'sample-finished', 'sample-failed'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];
export const NOTIFICATION_SUMMARY_MAX = 500;

/** Why a mail was sent: an invitation, a password reset, one notification, or a day's notifications together. */
export const MAIL_PURPOSES = ['invitation', 'password-reset', 'notification', 'digest'] as const;
export type MailPurpose = (typeof MAIL_PURPOSES)[number];
/** An outgoing mail waits (queued, also between retries), was handed to the mail server (sent), or gave up (failed). */
export const OUTGOING_MAIL_STATES = ['queued', 'sent', 'failed'] as const;
export type OutgoingMailState = (typeof OUTGOING_MAIL_STATES)[number];

/** What each notification kind's mails are about, in the words of the profile page and of the mails. */
export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  mention: 'someone mentions you',
  reply: 'a reply in a thread you take part in',
  'sample-finished': 'a sample you uploaded finished processing',
  'sample-failed': 'a sample you uploaded failed',
};

/** How long an invitation link works. */
export const INVITATION_DAYS = 7;

/** A region's states: open while it is discussed, resolved when settled; a resolved region can be reopened. */
export const REGION_STATES = ['open', 'resolved'] as const;
export type RegionState = (typeof REGION_STATES)[number];
export const REGION_TITLE_MAX = 200;
export const REGION_CATEGORY_NAME_MAX = 60;
export const REGION_POLYGON_POINTS_MAX = 200;
export const COMMENT_BODY_MAX = 20_000;
