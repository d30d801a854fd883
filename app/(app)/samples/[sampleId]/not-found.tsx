import Link from 'next/link';
import { buttonClass } from '@/components/button';
import { EmptyState } from '@/components/empty-state';

/** An unknown sample, or one in a study the visitor cannot open (not told apart). Answered with HTTP 404. */
export default function SampleNotFound() {
  return (
    <EmptyState title="Sample not found" action={<Link href="/samples" className={buttonClass('primary')}>Go to the samples</Link>}>
      There is no sample at this address that you can open. The link may be mistyped, the sample deleted, or it
      belongs to a study you are not a member of.
    </EmptyState>
  );
}
