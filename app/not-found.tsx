import Link from 'next/link';
import { buttonClass } from '@/components/button';
import { StatusPage } from '@/components/status-page';

export default function NotFound() {
  return (
    <StatusPage title="Page not found">
      <p className="text-sm text-ink-soft">There is nothing at this address that you can open. The link may be mistyped, the page removed, or it belongs to a study you are not a member of.</p>
      <div>
        <Link href="/studies" className={buttonClass('primary')}>
          Go to your studies
        </Link>
      </div>
    </StatusPage>
  );
}
