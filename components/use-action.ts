'use client';

import { useCallback, useState } from 'react';
import { messageOf } from '@/lib/api/client';

/**
 * Runs an async action (usually an API call) and keeps its pending state and the error message to show.
 * `run` resolves to true when the action succeeded.
 */
export function useAction<A extends unknown[]>(action: (...args: A) => Promise<unknown>) {
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const run = useCallback(
    async (...args: A): Promise<boolean> => {
      setPending(true);
      setError(null);
      try {
        await action(...args);
        return true;
      } catch (caught) {
        setError(messageOf(caught));
        return false;
      } finally {
        setPending(false);
      }
    },
    [action],
  );

  return { run, pending, error, clearError: () => setError(null) };
}
