'use client';

import type { Member } from '../api-types';
import { countOf } from '../format';
import { Panel } from '../panel';
import { AddMemberForm } from './add-member-form';
import { Invitations } from './invitations';
import { MemberRow } from './member-row';

interface MembersPanelProps {
  studyId: string;
  members: Member[];
  myId: number;
  canManage: boolean;
  onChanged: () => Promise<unknown>;
}

/** Who belongs to the study and with which role (every member sees it); owners invite and manage members here. */
export function MembersPanel({ studyId, members, myId, canManage, onChanged }: MembersPanelProps) {
  return (
    <Panel title="Members" aside={countOf(members.length, 'person', 'people')}>
      <ul className="-mt-2 divide-y divide-ink/10">
        {members.map((member) => (
          <MemberRow
            key={member.userId}
            studyId={studyId}
            member={member}
            isMe={member.userId === myId}
            canManage={canManage}
            onChanged={onChanged}
          />
        ))}
      </ul>
      {canManage && (
        <>
          <div className="mt-2 border-t border-ink/10 pt-4">
            <Invitations studyId={studyId} />
          </div>
          <div className="mt-4 border-t border-ink/10 pt-4">
            <h3 className="mb-3 text-sm font-semibold">Add someone who has an account</h3>
            <AddMemberForm studyId={studyId} onAdded={onChanged} />
          </div>
        </>
      )}
    </Panel>
  );
}
