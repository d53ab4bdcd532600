'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { FormMessage } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { assignScenarioSchema, type ApprenticeOutput } from '@/lib/validations/practice';

interface Props {
  scenarioId: string;
  apprentices: readonly ApprenticeOutput[];
  /** Apprentices who already have it. */
  assignedIds: readonly string[];
  assign: (input: unknown) => Promise<ActionResult<{ added: number }>>;
}

/** Assign a scenario to one or many apprentices at once. */
export function AssignForm({ scenarioId, apprentices, assignedIds, assign }: Props) {
  const router = useRouter();
  const [picked, setPicked] = useState<string[]>([]);
  const [message, setMessage] = useState<{ text: string; tone: 'error' | 'ok' } | null>(null);
  const [busy, setBusy] = useState(false);
  const open = apprentices.filter((a) => !assignedIds.includes(a.id));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const parsed = assignScenarioSchema.safeParse({ apprenticeIds: picked });
    if (!parsed.success) {
      setMessage({ text: parsed.error.issues[0].message, tone: 'error' });
      return;
    }
    setBusy(true);
    setMessage(null);
    const result = await assign({ id: scenarioId, assignment: parsed.data });
    setBusy(false);
    if (!result.ok) {
      setMessage({ text: result.message, tone: 'error' });
      return;
    }
    setPicked([]);
    setMessage({ text: `Assigned to ${result.data.added} apprentice${result.data.added === 1 ? '' : 's'}.`, tone: 'ok' });
    router.refresh();
  }

  if (apprentices.length === 0)
    return <p className="text-muted">Your company has no active apprentices yet. An admin adds them under Users.</p>;
  // The last apprentice assigned: the form goes, the confirmation stays.
  if (open.length === 0)
    return (
      <div className="space-y-2">
        <FormMessage message={message?.text} tone={message?.tone} />
        <p className="text-muted">Every apprentice of the company has this scenario.</p>
      </div>
    );

  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Assign to apprentices">
      <fieldset>
        <legend className="label">Apprentices</legend>
        <div className="mb-2 flex gap-2">
          <button type="button" className="btn-quiet border border-line" onClick={() => setPicked(open.map((a) => a.id))}>
            All {open.length}
          </button>
          <button type="button" className="btn-quiet border border-line" onClick={() => setPicked([])}>
            None
          </button>
        </div>
        <ul className="grid gap-2 sm:grid-cols-2">
          {open.map((a) => (
            <li key={a.id}>
              <label className="flex min-h-touch cursor-pointer items-center gap-3 rounded-lg border border-line bg-surface px-3 py-2 has-[:checked]:border-copper">
                <input
                  type="checkbox"
                  className="h-6 w-6 accent-copper"
                  checked={picked.includes(a.id)}
                  onChange={(e) => setPicked((p) => (e.target.checked ? [...p, a.id] : p.filter((x) => x !== a.id)))}
                />
                <span>
                  <span className="font-semibold">{a.name}</span>
                  <span className="block text-sm text-muted">{a.email}</span>
                </span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <FormMessage message={message?.text} tone={message?.tone} />
      <button type="submit" className="btn-primary" disabled={busy || picked.length === 0}>
        {busy ? 'Assigning…' : `Assign to ${picked.length || 'the chosen'} apprentice${picked.length === 1 ? '' : 's'}`}
      </button>
    </form>
  );
}
