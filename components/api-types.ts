// Shapes of the API responses the pages read (see the API contract of issue 2).

import type { SiteRole, StudyRole } from '@/models/vocabulary';

export type { SiteRole, StudyRole };

export interface Me {
  id: number;
  name: string;
  email: string;
  siteRole: SiteRole;
}

export interface StudySummary {
  id: number;
  title: string;
  description: string | null;
  myRole: StudyRole | null;
  memberCount: number;
  entryCount: number;
  updatedAt: string;
}

export interface Author {
  id: number;
  name: string;
}

export interface Entry {
  id: number;
  kind: string;
  position: number;
  title: string;
  body: string;
  /** A Map's or Contrast's settings (lib/maps/entry-settings.ts); empty for a Note. */
  settings: Record<string, unknown>;
  /** null once the author's account is gone. */
  createdBy: Author | null;
  updatedBy: Author | null;
  createdAt: string;
  updatedAt: string;
}

export interface Member {
  userId: number;
  name: string;
  email: string;
  role: StudyRole;
}

export interface StudyDetail {
  study: { id: number; title: string; description: string | null; createdAt: string; updatedAt: string };
  myRole: StudyRole | null;
  entries: Entry[];
  members: Member[];
}

export interface AdminUser {
  id: number;
  name: string;
  email: string;
  siteRole: SiteRole;
  disabled: boolean;
  createdAt: string;
}

export interface PendingInvitation {
  id: number;
  email: string;
  role: StudyRole;
  invitedBy: Author | null;
  createdAt: string;
  expiresAt: string;
  expired: boolean;
}
