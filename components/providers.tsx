'use client';

import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import { z } from 'zod';
import { fetcher } from '@/lib/api/client';

// zod compiles object schemas with `new Function` when it can; the pages' Content-Security-Policy forbids that
// (no 'unsafe-eval'), and even zod's probe for it is reported as a violation, so in the browser it interprets.
z.config({ jitless: true });

/** Client-side context for every page: swr reads the JSON API and shows errors instead of retrying. */
export function Providers({ children }: { children: ReactNode }) {
  return <SWRConfig value={{ fetcher, shouldRetryOnError: false }}>{children}</SWRConfig>;
}
