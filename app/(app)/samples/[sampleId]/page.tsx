import type { Metadata } from 'next';
import { SampleView } from '@/components/samples/sample-view';
import { requireVisible } from '@/lib/auth/page-access';
import { sampleAccess } from '@/lib/samples/access';

export const metadata: Metadata = { title: 'Sample' };

export default async function SamplePage({ params }: { params: Promise<{ sampleId: string }> }) {
  const { sampleId } = await params;
  await requireVisible(sampleId, (user, id) => sampleAccess(user, id, 'viewer'));
  return <SampleView sampleId={sampleId} />;
}
