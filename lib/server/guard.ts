import 'server-only';
import { redirect } from 'next/navigation';
import { getLiveSessionUser } from '@/db/sessions';
import type { UserWithCompany } from '@/db/users';
import { AppError } from '@/lib/errors';
import { mayOpen, type PagePath } from '@/lib/policy';
import { readSessionId } from '@/lib/server/session';

export type CurrentUser = UserWithCompany;

/**
 * The session check behind every operation and page: a live session row (not signed out, not
 * expired, not ended everywhere) of an active user. What the user may then do is the policy's
 * (lib/policy.ts, applied by lib/server/operation.ts).
 */
export async function requireUser(): Promise<CurrentUser> {
  const sid = await readSessionId();
  if (!sid) throw new AppError('unauthorized', 'Sign in to continue.');
  const user = await getLiveSessionUser({ sessionId: sid });
  if (!user) throw new AppError('unauthorized', 'Your session has ended. Sign in again.');
  return user;
}

/**
 * For the signed-in layout and pages that show no records yet: a visitor without a session goes to
 * sign in; with `page`, a role the policy does not let open it goes home.
 */
export async function requirePageUser({ page }: { page?: PagePath } = {}): Promise<CurrentUser> {
  let user: CurrentUser;
  try {
    user = await requireUser();
  } catch (error) {
    if (error instanceof AppError && error.code === 'unauthorized') redirect('/sign-in');
    throw error;
  }
  if (page && !mayOpen(user.role, page)) redirect('/?refused=1');
  return user;
}
