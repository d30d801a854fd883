'use client';

import { useEffect } from 'react';
import { Button } from '@/components/button';
import { Notice } from '@/components/notice';
import { StatusPage } from '@/components/status-page';
import { messageOf } from '@/lib/api/client';

/** Shown when a page fails unexpectedly while rendering. */
export default function PageError({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => console.error(error), [error]);
  return (
    <StatusPage title="This page failed to load">
      <Notice tone="error">{messageOf(error)}</Notice>
      <div>
        <Button variant="primary" onClick={retry}>
          Try again
        </Button>
      </div>
    </StatusPage>
  );
}
