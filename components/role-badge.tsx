import type { SiteRole, StudyRole } from './api-types';

const studyRoles: Record<StudyRole, { style: string; meaning: string }> = {
  owner: { style: 'bg-accent text-white border-accent', meaning: 'Edits the study and manages its members' },
  editor: { style: 'bg-accent-soft text-accent-strong border-accent/30', meaning: 'Edits the title and entries' },
  commenter: { style: 'bg-warn-soft text-warn border-warn/30', meaning: 'Reads the study; adds regions and comments' },
  viewer: { style: 'bg-paper-sunk text-ink-soft border-ink/15', meaning: 'Reads the study; cannot edit it' },
};

/** The shape of every small status pill (roles, sample states). */
export const pill = 'inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-medium capitalize whitespace-nowrap';

/** A study role as a small coloured pill; the tooltip says what the role may do. */
export function RoleBadge({ role, prefix }: { role: StudyRole; prefix?: string }) {
  const { style, meaning } = studyRoles[role] ?? studyRoles.viewer;
  return (
    <span className={`${pill} ${style}`} title={meaning} data-role={role}>
      {prefix && <span className="mr-1 font-normal normal-case opacity-80">{prefix}</span>}
      {role}
    </span>
  );
}

export function SiteRoleBadge({ role }: { role: SiteRole }) {
  const style = role === 'admin' ? 'bg-ink text-paper border-ink' : 'bg-paper-raised text-ink-soft border-ink/15';
  return <span className={`${pill} ${style}`}>{role}</span>;
}
