'use client';
import { useEffect } from 'react';

/** Names the browser tab after what a client page loaded (the static metadata only knows the kind of page). */
export function useDocumentTitle(title: string | undefined): void {
  useEffect(() => {
    if (title) document.title = `${title} · Splitfield`;
  }, [title]);
}
