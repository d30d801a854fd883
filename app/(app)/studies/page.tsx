import type { Metadata } from 'next';
import { StudiesView } from '@/components/studies/studies-view';

export const metadata: Metadata = { title: 'Studies' };

export default function StudiesPage() {
  return <StudiesView />;
}
