'use client';

import { sendJson } from '@/lib/api/client';
import type { Member, StudyRole } from '../api-types';
import { ConfirmButton } from '../confirm-button';
import { inlineSelectClass } from '../fields';
import { Notice } from '../notice';
import { PersonLabel } from '../person-label';
import { RoleBadge } from '../role-badge';
import { useAction } from '../use-action';
import { RoleOptions } from './role-options';

interface MemberRowProps {
  studyId: string;
  member: Member;
  isMe: boolean;
  canManage: boolean;
  onChanged: () => Promise<unknown>;
}

/** A member with their role; owners can change the role or remove them. */
export function MemberRow({ studyId, member, isMe, canManage, onChanged }: MemberRowProps) {
  const url = `/api/studies/${studyId}/members/${member.userId}`;
  const changeRole = useAction(async (role: StudyRole) => {
    await sendJson('PATCH', url, { role });
    await onChanged();
  });

  async function remove() {
    await sendJson('DELETE', url);
    await onChanged();
  }

  return (
    <li className="space-y-2 py-3">
      <div className="flex items-start justify-between gap-2">
        <PersonLabel name={member.name} email={member.email} isMe={isMe} className="text-sm" />
        {!canManage && <RoleBadge role={member.role} />}
      </div>
      {canManage && (
        <div className="flex flex-wrap items-center gap-2">
          <select
            aria-label={`Role of ${member.name}`}
            value={member.role}
            disabled={changeRole.pending}
            onChange={(event) => changeRole.run(event.target.value as StudyRole)}
            className={inlineSelectClass}
          >
            <RoleOptions />
          </select>
          <ConfirmButton label="Remove" question={`Remove ${member.name}?`} confirmLabel="Remove" onConfirm={remove} />
        </div>
      )}
      {changeRole.error && <Notice tone="error">{changeRole.error}</Notice>}
    </li>
  );
}
