import 'server-only';
import argon2 from 'argon2';

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

// Verifying against a fixed hash when the e-mail is unknown keeps the answer time the same as
// for a wrong password, so timing does not tell which addresses exist.
let dummyHash: Promise<string> | undefined;
export async function burnVerify(password: string): Promise<void> {
  dummyHash ??= hashPassword('no-such-user-placeholder');
  await verifyPassword(await dummyHash, password);
}
