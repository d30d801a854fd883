import type { Metadata } from 'next';
import { StudyView } from '@/components/study/study-view';
import { requireVisible } from '@/lib/auth/page-access';
import { studyAccess } from '@/lib/auth/study-access';

export const metadata: Metadata = { title: 'Study' };

export default async function StudyPage({ params }: { params: Promise<{ studyId: string }> }) {
  const { studyId } = await params;
  await requireVisible(studyId, (user, id) => studyAccess(user, id, 'viewer'));
  return <StudyView studyId={studyId} />;
}
