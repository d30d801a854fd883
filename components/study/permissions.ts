import type { Me, StudyRole } from '../api-types';

export interface StudyPermissions {
  /** Edit the title, description and entries. */
  canEdit: boolean;
  /** Manage members and delete the study. */
  canManage: boolean;
}

/** What the signed-in user may do in a study; the API enforces the same rules. */
export function studyPermissions(me: Me, myRole: StudyRole | null): StudyPermissions {
  const admin = me.siteRole === 'admin';
  return {
    canEdit: admin || myRole === 'owner' || myRole === 'editor',
    canManage: admin || myRole === 'owner',
  };
}
