'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { postJson } from '@/lib/http';

/**
 * Ends this session on the server, then goes to sign-in. When the server does not confirm it, the
 * button says so and stays: leaving would look signed out while the session is still open.
 */
export function SignOutButton() {
  const router = useRouter();
  const [state, setState] = useState<'idle' | 'busy' | 'failed'>('idle');
  async function signOut() {
    setState('busy');
    const result = await postJson('/api/auth/sign-out');
    // 401: the session had already ended, which is what was asked for.
    if (result.kind === 'ok' || (result.kind === 'refused' && result.status === 401)) {
      router.replace('/sign-in');
      router.refresh();
      return;
    }
    setState('failed');
  }
  return (
    <>
      <button type="button" className="btn-secondary px-4 text-sm" onClick={signOut} disabled={state === 'busy'}>
        {state === 'busy' ? 'Signing out…' : state === 'failed' ? 'Sign out again' : 'Sign out'}
      </button>
      {/* Only while it matters: an empty alert on every page would crowd the pages' own. */}
      {state === 'failed' && (
        <span role="alert" className="sr-only">
          The server did not confirm the sign-out, so you are still signed in. Try again.
        </span>
      )}
    </>
  );
}
