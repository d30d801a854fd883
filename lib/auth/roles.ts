// What each study role and site role may do: pure rules, no database.
import { STUDY_ROLES, type SiteRole, type StudyRole } from '@/models/vocabulary';

export function roleAtLeast(role: StudyRole | null, minimum: StudyRole): boolean {
  return role !== null && STUDY_ROLES.indexOf(role) >= STUDY_ROLES.indexOf(minimum);
}

/** Whether someone may see a study at all: any member, and every site admin. */
export function canSeeStudy(siteRole: SiteRole, myRole: StudyRole | null): boolean {
  return siteRole === 'admin' || myRole !== null;
}

/** Whether someone may act with the given minimum role; a site admin may do everything. */
export function mayActAs(siteRole: SiteRole, myRole: StudyRole | null, minimum: StudyRole): boolean {
  return siteRole === 'admin' || roleAtLeast(myRole, minimum);
}

/** How many owners a study keeps after one member's role changes (null role: the member leaves). */
export function ownersAfterChange(ownerCount: number, currentRole: StudyRole, nextRole: StudyRole | null): number {
  return ownerCount - (currentRole === 'owner' ? 1 : 0) + (nextRole === 'owner' ? 1 : 0);
}
