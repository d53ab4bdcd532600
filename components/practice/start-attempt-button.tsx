'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { ActionResult } from '@/lib/validations/api';

interface Props {
  assignmentId: string;
  resume: boolean;
  start: (input: unknown) => Promise<ActionResult<{ id: string; benchSessionId: string }>>;
}

/** Start (or go back to) the attempt of an assignment: the server opens a bench session with the scenario's fault. */
export function StartAttemptButton({ assignmentId, resume, start }: Props) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-1">
      <button
        type="button"
        className={resume ? 'btn-secondary w-full sm:w-auto' : 'btn-primary w-full sm:w-auto'}
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          const result = await start({ id: assignmentId });
          if (!result.ok) {
            setBusy(false);
            setError(result.message);
            return;
          }
          router.push(`/practice/attempts/${result.data.id}`);
        }}
      >
        {busy ? 'Opening the bench…' : resume ? 'Continue on the bench' : 'Start on the bench'}
      </button>
      {error && (
        <p role="alert" className="field-error">
          <span aria-hidden>⚠</span> {error}
        </p>
      )}
    </div>
  );
}
