import type { Metadata } from 'next';
import { UploadView } from '@/components/samples/upload-view';

export const metadata: Metadata = { title: 'Upload a sample' };

export default async function UploadPage({ searchParams }: { searchParams: Promise<{ studyId?: string }> }) {
  const { studyId } = await searchParams;
  return <UploadView studyId={studyId} />;
}
