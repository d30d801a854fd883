import type { Metadata } from 'next';
import { StudyView } from '@/components/study/study-view';

export const metadata: Metadata = { title: 'Study' };

export default async function StudyPage({ params }: { params: Promise<{ studyId: string }> }) {
  const { studyId } = await params;
  return <StudyView studyId={studyId} />;
}
