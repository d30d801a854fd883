import Link from 'next/link';
import { buttonClass } from '@/components/button';
import { StatusPage } from '@/components/status-page';

export default function NotFound() {
  return (
    <StatusPage title="Page not found">
      <p className="text-sm text-ink-soft">There is nothing at this address. The link may be mistyped, or the page was removed.</p>
      <div>
        <Link href="/studies" className={buttonClass('primary')}>
          Go to your studies
        </Link>
      </div>
    </StatusPage>
  );
}
