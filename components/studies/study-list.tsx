import Link from 'next/link';
import type { StudySummary } from '../api-types';
import { countOf, formatDate } from '../format';
import { RoleBadge } from '../role-badge';

/** The studies the user belongs to, most recently changed first as the API sends them. */
export function StudyList({ studies }: { studies: StudySummary[] }) {
  return (
    <ul className="divide-y divide-ink/10 overflow-hidden rounded-lg border border-ink/10 bg-paper-raised">
      {studies.map((study) => (
        <li key={study.id}>
          <Link href={`/studies/${study.id}`} className="block px-5 py-4 hover:bg-paper-sunk/60">
            <div className="flex items-start justify-between gap-3">
              <h2 className="min-w-0 font-medium break-words text-ink">{study.title}</h2>
              {study.myRole && <RoleBadge role={study.myRole} />}
            </div>
            {study.description && <p className="mt-1 line-clamp-2 text-sm text-ink-soft">{study.description}</p>}
            <p className="mt-2 text-xs text-ink-faint">
              {countOf(study.entryCount, 'entry', 'entries')} · {countOf(study.memberCount, 'member')} ·
              updated {formatDate(study.updatedAt)}
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
