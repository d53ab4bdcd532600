'use client';

import { useRouter } from 'next/navigation';
import { useMemo, useState } from 'react';
import { httpBenchClient } from '@/components/bench/bench-client';
import { BenchScreen } from '@/components/bench/bench-screen';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { FormMessage, Select } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { finishAttemptSchema, type AttemptOutput } from '@/lib/validations/practice';

interface Props {
  attempt: Pick<AttemptOutput, 'id' | 'unit' | 'findings'>;
  finish: (input: unknown) => Promise<ActionResult<AttemptOutput>>;
}

/** An apprentice's running attempt: the bench, then the finding the walk reached, sent once for scoring. */
export function AttemptRunner({ attempt, finish }: Props) {
  const router = useRouter();
  // The attempt's own bench: only its apprentice works it, and it closes when the attempt is scored.
  const client = useMemo(() => httpBenchClient(`/api/practice/attempts/${encodeURIComponent(attempt.id)}/bench`), [attempt.id]);
  const [findingStepId, setFinding] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [busy, setBusy] = useState(false);
  const [taken, setTaken] = useState(0);
  const findings = useMemo(() => [...attempt.findings].sort((a, b) => a.title.localeCompare(b.title)), [attempt.findings]);
  const chosen = findings.find((f) => f.id === findingStepId);

  function ask(e: React.FormEvent) {
    e.preventDefault();
    const parsed = finishAttemptSchema.safeParse({ findingStepId });
    if (!parsed.success) {
      setError(parsed.error.issues[0].message);
      return;
    }
    setError(null);
    setConfirming(true);
  }

  async function send() {
    setBusy(true);
    const result = await finish({ id: attempt.id, finding: { findingStepId } });
    setBusy(false);
    if (!result.ok) {
      setConfirming(false);
      setError(result.message);
      return;
    }
    setConfirming(false);
    router.refresh();
  }

  return (
    <div className="space-y-6">
      <BenchScreen client={client} unit={attempt.unit} onActivity={setTaken} />
      <form onSubmit={ask} className="card space-y-3" aria-labelledby="finding-title">
        <h2 id="finding-title" className="text-lg font-bold">
          The finding
        </h2>
        <p className="text-base text-muted">
          When your readings isolate the fault, choose the finding they point to. It is scored once: the finding, the readings beyond the
          shortest path ({taken} taken so far), the safety actions and the time.
        </p>
        <label htmlFor="finding" className="label">
          Finding reached
        </label>
        <Select id="finding" value={findingStepId} onChange={(e) => setFinding(e.target.value)} aria-invalid={Boolean(error)}>
          <option value="">Choose the finding…</option>
          {findings.map((f) => (
            <option key={f.id} value={f.id}>
              {f.title}
            </option>
          ))}
        </Select>
        <FormMessage message={error} />
        <button type="submit" className="btn-primary w-full sm:w-auto">
          Report this finding
        </button>
      </form>
      <ConfirmDialog
        open={confirming}
        title="Report this finding?"
        description={
          <>
            <span className="font-semibold">{chosen?.title}</span>. The attempt is then scored and closed: no more readings on this bench.
          </>
        }
        confirmLabel="Report and score"
        busy={busy}
        busyLabel="Scoring…"
        onCancel={() => setConfirming(false)}
        onConfirm={send}
      />
    </div>
  );
}
