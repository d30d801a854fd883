import type { Metadata } from 'next';
import { ExampleFilesPanel } from '@/components/samples/example-files-panel';
import { UploadView } from '@/components/samples/upload-view';
import { EXAMPLE_FILES } from '@/lib/demo/example-files';

export const metadata: Metadata = { title: 'Upload a sample' };

export default async function UploadPage({ searchParams }: { searchParams: Promise<{ studyId?: string }> }) {
  const { studyId } = await searchParams;
  const examples = EXAMPLE_FILES.map(({ name, holds, command }) => ({ name, holds, command }));
  return (
    <div className="space-y-6">
      <UploadView studyId={studyId} />
      <ExampleFilesPanel files={examples} />
    </div>
  );
}
