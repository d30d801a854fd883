import type { Metadata } from 'next';
import { ProcessingView } from '@/components/admin/processing-view';

export const metadata: Metadata = { title: 'Processing' };

export default function AdminProcessingPage() {
  return <ProcessingView />;
}
