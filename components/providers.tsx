'use client';

import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import { fetcher } from '@/lib/api/client';

/** Client-side context for every page: swr reads the JSON API and shows errors instead of retrying. */
export function Providers({ children }: { children: ReactNode }) {
  return <SWRConfig value={{ fetcher, shouldRetryOnError: false }}>{children}</SWRConfig>;
}
