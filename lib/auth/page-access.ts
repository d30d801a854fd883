// The page of one study or sample answers HTTP 404 (with the not-found page) when it does not exist or the visitor
// may not see it, exactly as the API does. The check runs in the signed-in pages' layout, before anything is sent:
// the page itself renders inside a client frame that waits for the user, so a 404 thrown there would come after
// the status 200 had gone out. proxy.ts tells the layout the requested path (PATHNAME_HEADER).
import { notFound, redirect } from 'next/navigation';
import type { User } from '@/models/user';
import { ApiError } from '../api/errors';
import { idParam } from '../api/schemas';
import { sampleAccess } from '../samples/access';
import { SIGN_IN_PATH } from './paths';
import { currentUser } from './session';
import { studyAccess } from './study-access';

const PAGES_OF_ONE: Array<{ pattern: RegExp; check: (user: User, id: number) => Promise<unknown> }> = [
  { pattern: /^\/studies\/([^/]+)\/?$/, check: (user, id) => studyAccess(user, id, 'viewer') },
  { pattern: /^\/samples\/(?!new\/?$)([^/]+)\/?$/, check: (user, id) => sampleAccess(user, id, 'viewer') },
];

/** Throws Next's notFound() when `pathname` is the page of a study or sample the visitor may not open. */
export async function requireVisiblePage(pathname: string): Promise<void> {
  const page = PAGES_OF_ONE.map(({ pattern, check }) => ({ match: pattern.exec(pathname), check })).find(({ match }) => match);
  if (!page?.match) return;
  const user = await currentUser();
  if (!user) redirect(SIGN_IN_PATH);
  const id = idParam.safeParse(decodeURIComponent(page.match[1]));
  if (!id.success) notFound();
  try {
    await page.check(user, id.data);
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) notFound();
    throw error;
  }
}
