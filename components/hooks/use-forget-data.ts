'use client';

import { useSWRConfig } from 'swr';

/** Drops every cached API answer, so that nothing of one session (user, studies, errors) shows in the next. */
export function useForgetData() {
  const { mutate } = useSWRConfig();
  return () => mutate(() => true, undefined, { revalidate: false });
}
