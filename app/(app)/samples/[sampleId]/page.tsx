import type { Metadata } from 'next';
import { SampleView } from '@/components/samples/sample-view';

export const metadata: Metadata = { title: 'Sample' };

export default async function SamplePage({ params }: { params: Promise<{ sampleId: string }> }) {
  const { sampleId } = await params;
  return <SampleView sampleId={sampleId} />;
}
