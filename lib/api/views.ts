// How records look in API responses: only what clients need, never password hashes or session versions.
import type { ApiToken } from '@/models/api-token';
import type { Entry } from '@/models/entry';
import type { Membership } from '@/models/membership';
import type { Study } from '@/models/study';
import type { User } from '@/models/user';

export function userView(user: User) {
  return { id: user.id, name: user.name, email: user.email, siteRole: user.siteRole };
}

export function adminUserView(user: User) {
  return { ...userView(user), disabled: user.disabled, createdAt: user.createdAt };
}

export function studyView(study: Study) {
  const { id, title, description, createdAt, updatedAt } = study;
  return { id, title, description, createdAt, updatedAt };
}

/** A membership loaded with its user. */
export function memberView(membership: Membership & { user: User }) {
  const { user, role } = membership;
  return { userId: user.id, name: user.name, email: user.email, role };
}

export function authorView(user: User | null | undefined) {
  return user ? { id: user.id, name: user.name } : null;
}

/** An entry loaded with its authors (null once that user is gone). */
export function entryView(entry: Entry) {
  const { id, studyId, kind, position, title, body, settings, createdAt, updatedAt } = entry;
  return {
    id,
    studyId,
    kind,
    position,
    title,
    body,
    settings,
    createdBy: authorView(entry.createdBy),
    updatedBy: authorView(entry.updatedBy),
    createdAt,
    updatedAt,
  };
}

/** A personal API token without its secret. */
export function apiTokenView(token: ApiToken) {
  const { id, name, prefix, createdAt } = token;
  return { id, name, prefix, createdAt, lastUsedAt: token.lastUsedAt ?? null };
}
