// @vitest-environment node
// The session id read from the cookie: unsealed once per seal, never past the seal's expiry, and a
// seal that is not ours is no session. (That a revoked session is refused is the sessions row's
// business: tests/e2e/api/sessions.test.ts.)
import { sealData } from 'iron-session';
import { afterEach, describe, expect, it, vi } from 'vitest';

const jar = vi.hoisted(() => ({ value: undefined as string | undefined }));
vi.mock('next/headers', () => ({
  cookies: async () => ({ get: (name: string) => (name === 'pg_session' && jar.value ? { name, value: jar.value } : undefined) }),
}));

const password = 'test-secret-test-secret-test-secret-test';
process.env.SESSION_SECRET = password;
const { readSessionId } = await import('@/lib/server/session');

afterEach(() => {
  vi.useRealTimers();
  jar.value = undefined;
});

describe('readSessionId', () => {
  it('reads the session id of a seal, again from the cache', async () => {
    jar.value = await sealData({ sid: 'row-1' }, { password, ttl: 3600 });
    expect(await readSessionId()).toBe('row-1');
    expect(await readSessionId()).toBe('row-1');
  });

  it('is undefined without a cookie, and for a cookie that is not one of our seals', async () => {
    expect(await readSessionId()).toBeUndefined();
    jar.value = 'Fe26.2*1*not-a-seal';
    expect(await readSessionId()).toBeUndefined();
    const other = await sealData({ sid: 'row-2' }, { password: 'another-secret-another-secret-another', ttl: 3600 });
    jar.value = other;
    expect(await readSessionId()).toBeUndefined();
  });

  it('stops reading a seal once it has expired, cached or not', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-02T08:00:00Z'));
    jar.value = await sealData({ sid: 'row-3' }, { password, ttl: 60 });
    expect(await readSessionId()).toBe('row-3');
    // iron allows 60 s of clock skew past the ttl; two hours later the seal is dead.
    vi.setSystemTime(new Date('2026-12-02T10:00:00Z'));
    expect(await readSessionId()).toBeUndefined();
  });
});
