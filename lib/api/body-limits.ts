// How large a JSON request body may be, per kind of route (README "Configuration"). A body is refused with 413
// as soon as its Content-Length says it is larger, or while it is read once it grows past the limit, so the
// server never holds more than the limit of any one body.

const KiB = 1024;

export const BODY_LIMITS = {
  /** Sign-up, sign-in, the profile, tokens, admin changes: a few short fields. */
  account: 16 * KiB,
  /** Studies, members and other small documents: titles, descriptions up to 5000 characters. */
  standard: 64 * KiB,
  /** A note: up to 200 000 characters of Markdown, 4 bytes each at worst, plus JSON escaping. */
  note: 1024 * KiB,
  /** An imported tagger file: its ln-ratio table holds up to 400 × 400 numbers. */
  tagger: 4096 * KiB,
} as const;

export type BodyLimit = (typeof BODY_LIMITS)[keyof typeof BODY_LIMITS];
