import { STUDY_ROLES } from '@/models/vocabulary';

/** The <option>s of a study-role select, weakest role first. */
export function RoleOptions() {
  return STUDY_ROLES.map((role) => (
    <option key={role} value={role}>
      {role[0].toUpperCase() + role.slice(1)}
    </option>
  ));
}
