import 'server-only';
import { countRecentFailures, recordFailures } from '@/db/sign-in-failures';
import { AppError } from '@/lib/errors';

const WINDOW_MS = 15 * 60_000;
const PER_EMAIL = Number(process.env.SIGN_IN_LIMIT_PER_EMAIL ?? 5);
const PER_ADDRESS = Number(process.env.SIGN_IN_LIMIT_PER_ADDRESS ?? 50);

const keys = (email: string, address: string) => ({ email: `email:${email.toLowerCase()}`, address: `ip:${address}` });

/** Throws 429 with Retry-After when either the e-mail or the client address has failed too often. */
export async function assertSignInAllowed({ email, address }: { email: string; address: string }): Promise<void> {
  const k = keys(email, address);
  for (const [key, limit] of [
    [k.email, PER_EMAIL],
    [k.address, PER_ADDRESS],
  ] as const) {
    const { count, oldest } = await countRecentFailures({ key, windowMs: WINDOW_MS });
    if (count >= limit) {
      const retryAfter = oldest ? Math.max(1, Math.ceil((oldest.getTime() + WINDOW_MS - Date.now()) / 1000)) : WINDOW_MS / 1000;
      throw new AppError('rate_limited', `Too many failed sign-ins. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`, {
        headers: { 'Retry-After': String(retryAfter) },
      });
    }
  }
}

export async function recordSignInFailure({ email, address }: { email: string; address: string }): Promise<void> {
  const k = keys(email, address);
  await recordFailures({ keys: [k.email, k.address] });
}
