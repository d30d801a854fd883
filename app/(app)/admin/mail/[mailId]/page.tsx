import type { Metadata } from 'next';
import { ReceivedMailView } from '@/components/admin/received-mail-view';

export const metadata: Metadata = { title: 'Mail' };

export default async function ReceivedMailPage({ params }: { params: Promise<{ mailId: string }> }) {
  const { mailId } = await params;
  return <ReceivedMailView mailId={mailId} />;
}
