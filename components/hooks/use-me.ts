'use client';

import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { Me } from '../api-types';

/** The signed-in user, from GET /api/me (shared by every component through swr's cache). */
export function useMe() {
  const { data, error, isLoading, mutate } = useSWR<{ user: Me }, ApiError>('/api/me');
  return { me: data?.user, error, isLoading, mutate };
}
