// Rules for names and titles shown in lists. Bidirectional control characters (embeddings and overrides
// U+202A–U+202E, isolates U+2066–U+2069, the marks U+200E, U+200F and U+061C) can make a name read differently
// from what it is ("invoice‮fdp.exe"), so names, titles, labels, tags and file names that hold one are refused.
// Free text (descriptions, notes) keeps them: right-to-left writing needs them there.

const BIDI_CONTROL = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;

/** The first bidirectional control character of `text` as "U+202E", or null when there is none. */
export function bidiControlIn(text: string): string | null {
  const match = BIDI_CONTROL.exec(text);
  return match ? `U+${match[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}` : null;
}

/** The message for a name that holds one. */
export function bidiControlMessage(what: string, text: string): string {
  return `${what} must not contain bidirectional control characters (found ${bidiControlIn(text)})`;
}
