// Shapes of the API responses the pages read (see the API contract of issue 2).

export type SiteRole = 'admin' | 'member';
export type StudyRole = 'owner' | 'editor' | 'commenter' | 'viewer';
export const STUDY_ROLES: StudyRole[] = ['owner', 'editor', 'commenter', 'viewer'];

export interface Me {
  id: string;
  name: string;
  email: string;
  siteRole: SiteRole;
}

export interface StudySummary {
  id: string;
  title: string;
  description: string | null;
  myRole: StudyRole | null;
  memberCount: number;
  entryCount: number;
  updatedAt: string;
}

export interface Entry {
  id: string;
  kind: string;
  position: number;
  title: string | null;
  body: string;
  createdBy: unknown;
  updatedAt: string;
}

export interface Member {
  userId: string;
  name: string;
  email: string;
  role: StudyRole;
}

export interface StudyDetail {
  study: { id: string; title: string; description: string | null; createdAt: string; updatedAt: string };
  myRole: StudyRole | null;
  entries: Entry[];
  members: Member[];
}

export interface AdminUser {
  id: string;
  name: string;
  email: string;
  siteRole: SiteRole;
  disabled: boolean;
  createdAt: string;
}
