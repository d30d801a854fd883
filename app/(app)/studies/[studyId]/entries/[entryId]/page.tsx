import type { Metadata } from 'next';
import { EntryViewPage } from '@/components/maps/entry-view-page';

export const metadata: Metadata = { title: 'View' };

export default async function EntryPage({
  params,
  searchParams,
}: {
  params: Promise<{ studyId: string; entryId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { studyId, entryId } = await params;
  const { settings } = await searchParams;
  return <EntryViewPage studyId={studyId} entryId={entryId} settingsText={typeof settings === 'string' ? settings : null} />;
}
