import Link from 'next/link';
import { buttonClass } from '@/components/button';
import { EmptyState } from '@/components/empty-state';

/** An unknown study, or one the visitor is not a member of (the two are not told apart). Answered with HTTP 404. */
export default function StudyNotFound() {
  return (
    <EmptyState title="Study not found" action={<Link href="/studies" className={buttonClass('primary')}>Go to your studies</Link>}>
      There is no study at this address that you can open. The link may be mistyped, the study deleted, or you are
      not one of its members: ask its owner to add you.
    </EmptyState>
  );
}
