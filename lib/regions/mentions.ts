// Mentions inside a comment's Markdown: `@[Name](user:12)`, as the comment box's completion writes them. The name is
// only what the writer typed; who is told is decided by the id, and only members of the study are.

/** The Markdown that mentions a person. Brackets in a name are left out so the link stays whole. */
export function mentionText(person: { id: number; name: string }): string {
  return `@[${person.name.replace(/[[\]\n]/g, '')}](user:${person.id})`;
}

const MENTION = /@\[[^\]\n]{1,200}\]\(user:([1-9]\d{0,14})\)/g;

/** Ids of everyone mentioned, each once, in order of appearance. */
export function mentionedIds(body: string): number[] {
  return [...new Set([...body.matchAll(MENTION)].map((match) => Number(match[1])))];
}

/** The user id a mention link points at, or null when the address is not a mention. */
export function mentionTarget(href: string): number | null {
  const match = /^user:([1-9]\d{0,14})$/.exec(href);
  return match ? Number(match[1]) : null;
}
