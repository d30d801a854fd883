import type { Metadata } from 'next';
import { SamplesView } from '@/components/samples/samples-view';

export const metadata: Metadata = { title: 'Samples' };

export default async function SamplesPage({ searchParams }: { searchParams: Promise<{ studyId?: string }> }) {
  const { studyId } = await searchParams;
  return <SamplesView initialStudyId={studyId} />;
}
