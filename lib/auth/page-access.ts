// Pages of one study or sample answer HTTP 404 (with the not-found page) when it does not exist or the visitor may
// not see it, exactly as the API does; the page itself then loads its data through the API.
import { notFound, redirect } from 'next/navigation';
import type { User } from '@/models/user';
import { ApiError } from '../api/errors';
import { idParam } from '../api/schemas';
import { SIGN_IN_PATH } from './paths';
import { currentUser } from './session';

export async function requireVisible(rawId: string, check: (user: User, id: number) => Promise<unknown>): Promise<void> {
  const user = await currentUser();
  if (!user) redirect(SIGN_IN_PATH);
  const id = idParam.safeParse(rawId);
  if (!id.success) notFound();
  try {
    await check(user, id.data);
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) notFound();
    throw error;
  }
}
