'use client';

import Link from 'next/link';
import { useState } from 'react';
import type { StudyDetail, StudyRole } from '../api-types';
import { Button } from '../button';
import { formatDate } from '../format';
import { RoleBadge } from '../role-badge';
import { StudyDetailsForm } from './study-details-form';

interface StudyHeadingProps {
  studyId: string;
  study: StudyDetail['study'];
  myRole: StudyRole | null;
  canEdit: boolean;
  onChanged: () => Promise<unknown>;
}

/** Title, description and the reader's role; editors can rename the study here. */
export function StudyHeading({ studyId, study, myRole, canEdit, onChanged }: StudyHeadingProps) {
  const [editing, setEditing] = useState(false);

  return (
    <header className="mb-6 space-y-3">
      <Link href="/studies" className="text-sm text-ink-soft hover:text-ink">
        ← Studies
      </Link>
      {editing ? (
        <StudyDetailsForm
          studyId={studyId}
          title={study.title}
          description={study.description}
          onSaved={async () => {
            await onChanged();
            setEditing(false);
          }}
          onCancel={() => setEditing(false)}
        />
      ) : (
        <>
          <div className="flex flex-col gap-3 sm:flex-row sm:items-start sm:justify-between">
            <h1 className="min-w-0 text-2xl font-semibold tracking-tight break-words">{study.title}</h1>
            {canEdit && (
              <Button size="sm" onClick={() => setEditing(true)} className="self-start">
                Rename
              </Button>
            )}
          </div>
          {study.description && <p className="max-w-prose text-ink-soft">{study.description}</p>}
        </>
      )}
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-ink-faint">
        {myRole ? <RoleBadge role={myRole} prefix="You are" /> : <span>Not a member: open through your site admin role.</span>}
        {!canEdit && <span>Read only: you can read this study but not change it.</span>}
        <span>Created {formatDate(study.createdAt)}</span>
      </div>
    </header>
  );
}
