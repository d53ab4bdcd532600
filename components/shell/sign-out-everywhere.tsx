'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useId, useRef, useState } from 'react';
import { postJson } from '@/lib/http';

type State = { step: 'idle' } | { step: 'asking' } | { step: 'busy' } | { step: 'failed'; message: string };

/** Ends every session of the signed-in user, this one included, behind a confirmation. */
export function SignOutEverywhere({ className }: { className?: string }) {
  const router = useRouter();
  const [state, setState] = useState<State>({ step: 'idle' });
  const cancelRef = useRef<HTMLButtonElement>(null);
  const openerRef = useRef<HTMLButtonElement>(null);
  const returnFocus = useRef(false);
  const id = useId();
  const open = state.step !== 'idle';

  useEffect(() => {
    if (open) cancelRef.current?.focus();
    else if (returnFocus.current) {
      returnFocus.current = false;
      openerRef.current?.focus();
    }
  }, [open]);

  function cancel() {
    returnFocus.current = true;
    setState({ step: 'idle' });
  }

  async function confirm() {
    setState({ step: 'busy' });
    const result = await postJson('/api/auth/sign-out-everywhere');
    // 401: this session had already ended; the others may not have, so say so rather than leave.
    if (result.kind === 'ok') {
      router.replace('/sign-in');
      router.refresh();
      return;
    }
    let message = 'The server did not answer, so your other sessions may still be open. Try again.';
    if (result.kind === 'refused' && result.status === 401) {
      message = 'This session has already ended. Sign in again, then sign out everywhere.';
    } else if (result.kind === 'refused') {
      message = `${result.message ?? `The server answered ${result.status}.`} Your sessions were not ended.`;
    }
    setState({ step: 'failed', message });
  }

  if (!open) {
    return (
      <button
        ref={openerRef}
        type="button"
        className={`btn-quiet px-4 text-sm ${className ?? ''}`}
        onClick={() => setState({ step: 'asking' })}
      >
        Sign out everywhere
      </button>
    );
  }
  const busy = state.step === 'busy';
  return (
    <div
      role="alertdialog"
      aria-modal="false"
      aria-labelledby={`${id}-title`}
      aria-describedby={`${id}-desc`}
      className={`w-full rounded-lg border-2 border-ink bg-raised p-3 text-sm text-ink ${className ?? ''}`}
      onKeyDown={(e) => {
        if (e.key === 'Escape' && !busy) cancel();
      }}
    >
      <p id={`${id}-title`} className="font-semibold">
        Sign out on every device?
      </p>
      <p id={`${id}-desc`} className="mb-3 mt-1">
        Every session of yours ends: phones, tablets and this browser. Answers still waiting to be saved on another device stay on it until
        you sign in there again.
      </p>
      {state.step === 'failed' && (
        <p role="alert" className="mb-3 rounded-lg border-2 border-ink bg-sunken px-3 py-2 font-semibold">
          {state.message}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary px-4 text-sm" onClick={confirm} disabled={busy}>
          {busy ? 'Signing out…' : 'Sign out everywhere'}
        </button>
        <button ref={cancelRef} type="button" className="btn-secondary px-4 text-sm" onClick={cancel} disabled={busy}>
          Cancel
        </button>
      </div>
    </div>
  );
}
