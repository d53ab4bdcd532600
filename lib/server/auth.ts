import 'server-only';
import { getUserForSignIn, type UserWithCompany } from '@/db/users';
import { AppError } from '@/lib/errors';
import { burnVerify, verifyPassword } from '@/lib/server/password';
import { assertSignInAllowed, recordSignInFailure } from '@/lib/server/rate-limit';
import { getSession } from '@/lib/server/session';

// The same words for an unknown e-mail, a wrong password and a deactivated account.
export const SIGN_IN_REFUSED = 'That e-mail and password do not match an active account.';

/** Checks the rate limit and the password, then writes the session cookie. */
export async function signIn({ email, password, address }: { email: string; password: string; address: string }): Promise<UserWithCompany> {
  await assertSignInAllowed({ email, address });
  const user = await getUserForSignIn({ email });
  const ok = user ? await verifyPassword(user.passwordHash, password) : (await burnVerify(password), false);
  if (!user || !ok || !user.active) {
    await recordSignInFailure({ email, address });
    throw new AppError('unauthorized', SIGN_IN_REFUSED);
  }
  const session = await getSession();
  session.userId = user.id;
  session.version = user.sessionVersion;
  await session.save();
  const { passwordHash: _omit, ...safe } = user;
  return safe;
}

export async function signOut(): Promise<void> {
  const session = await getSession();
  session.destroy();
}

export function publicUser(user: UserWithCompany) {
  return { id: user.id, email: user.email, name: user.name, role: user.role, company: { id: user.companyId, name: user.companyName } };
}
