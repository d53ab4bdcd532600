import 'server-only';
import { createSession, deleteOldSessions, revokeSession, revokeUserSessions } from '@/db/sessions';
import { getUserForSignIn, type UserWithCompany } from '@/db/users';
import { AppError } from '@/lib/errors';
import { burnVerify, verifyPassword } from '@/lib/server/password';
import { assertSignInAllowed, recordSignInFailure } from '@/lib/server/rate-limit';
import { getSession, SESSION_TTL_SECONDS } from '@/lib/server/session';

// The same words for an unknown e-mail, a wrong password and a deactivated account.
export const SIGN_IN_REFUSED = 'That e-mail and password do not match an active account.';

/** Checks the rate limit and the password, then starts a session and writes its cookie. */
export async function signIn({
  email,
  password,
  address,
  userAgent = null,
}: {
  email: string;
  password: string;
  address: string;
  userAgent?: string | null;
}): Promise<UserWithCompany> {
  await assertSignInAllowed({ email, address });
  const user = await getUserForSignIn({ email });
  const ok = user ? await verifyPassword(user.passwordHash, password) : (await burnVerify(password), false);
  if (!user || !ok || !user.active) {
    await recordSignInFailure({ email, address });
    throw new AppError('unauthorized', SIGN_IN_REFUSED);
  }
  await deleteOldSessions();
  const session = await getSession();
  // A sign-in over a session that is still open (another account on a shared tablet) ends that one.
  if (session.sid) await revokeSession({ sessionId: session.sid });
  session.sid = await createSession({ userId: user.id, companyId: user.companyId, userAgent, ttlSeconds: SESSION_TTL_SECONDS });
  await session.save();
  const { passwordHash: _omit, ...safe } = user;
  return safe;
}

/** Ends this session on the server (a copy of the cookie stops working too) and clears the cookie. */
export async function signOut(): Promise<void> {
  const session = await getSession();
  if (session.sid) await revokeSession({ sessionId: session.sid });
  session.destroy();
}

/** Ends every session of the user, on every device, this one included. */
export async function signOutEverywhere({ userId }: { userId: string }): Promise<void> {
  await revokeUserSessions({ userId });
  (await getSession()).destroy();
}

export function publicUser(user: UserWithCompany) {
  return { id: user.id, email: user.email, name: user.name, role: user.role, company: { id: user.companyId, name: user.companyName } };
}
