'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Field, FormMessage, TextInput } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { repairSchema } from '@/lib/validations/field';

type Result<T> = ActionResult<T>;
type Act<T> = (input: unknown) => Promise<Result<T>>;

/** Starts a diagnosis on the default tree and goes to its first step. */
export function StartDiagnosisButton({
  callId,
  treeVersionId,
  disabledReason,
  startDiagnosis,
  secondary = false,
}: {
  callId: string;
  treeVersionId: string | null;
  disabledReason: string | null;
  startDiagnosis: Act<{ id: string }>;
  secondary?: boolean;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<string | null>(null);
  const reasonId = `start-reason-${callId}`;
  return (
    <div className="space-y-2">
      <button
        type="button"
        className={secondary ? 'btn-secondary' : 'btn-primary'}
        disabled={Boolean(disabledReason) || !treeVersionId || pending}
        aria-describedby={disabledReason ? reasonId : undefined}
        onClick={() =>
          startTransition(async () => {
            setMessage(null);
            const result = await startDiagnosis({ callId, treeVersionId });
            if (!result.ok) {
              setMessage(result.message);
              return;
            }
            router.push(`/calls/${callId}/diagnoses/${result.data.id}`);
          })
        }
      >
        {pending ? 'Starting…' : 'Start diagnosis'}
      </button>
      {disabledReason && (
        <p id={reasonId} className="text-sm text-muted">
          {disabledReason}
        </p>
      )}
      <FormMessage message={message} />
    </div>
  );
}

export function SignOffButton({ callId, diagnosisId, signOff }: { callId: string; diagnosisId: string; signOff: Act<unknown> }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div className="space-y-2">
      <button
        type="button"
        className="btn-secondary"
        disabled={pending}
        onClick={() =>
          startTransition(async () => {
            const result = await signOff({ callId, diagnosisId });
            if (!result.ok) setMessage(result.message);
            else router.refresh();
          })
        }
      >
        {pending ? 'Signing off…' : 'Sign off this finding'}
      </button>
      <FormMessage message={message} />
    </div>
  );
}

// The checklist is ticked as a list of texts and sent as { text, done } pairs.
const repairFormSchema = repairSchema.extend({ ticked: z.array(z.string()).default([]) });
type RepairIn = z.input<typeof repairFormSchema>;
type RepairOut = z.output<typeof repairFormSchema>;

export interface RepairRecord {
  repairNotes: string | null;
  verification: {
    cycles: number;
    flameSignal: { text: string; value: number } | null;
    checks: { text: string; done: boolean }[];
    notes?: string;
  } | null;
}

/** The repair and verification record: what was done, how many heat cycles it ran, the flame signal after, the finding's checks. */
export function RepairForm({
  callId,
  record,
  checks,
  readOnly,
  saveRepair,
}: {
  callId: string;
  record: RepairRecord;
  /** The verification checks of the call's findings. */
  checks: string[];
  readOnly: boolean;
  saveRepair: Act<{ status: string }>;
}) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const done = new Set(record.verification?.checks.filter((c) => c.done).map((c) => c.text) ?? []);
  const allChecks = [...new Set([...checks, ...(record.verification?.checks.map((c) => c.text) ?? [])])];
  const { register, handleSubmit, formState, setError } = useForm<RepairIn, unknown, RepairOut>({
    resolver: zodResolver(repairFormSchema),
    defaultValues: {
      repairNotes: record.repairNotes ?? '',
      cycles: record.verification?.cycles ?? 3,
      flameSignal: record.verification?.flameSignal?.text ?? '',
      notes: record.verification?.notes ?? '',
      ticked: allChecks.filter((c) => done.has(c)),
      checks: [],
    },
  });

  const onSubmit = handleSubmit(async ({ ticked, ...values }) => {
    setStatus(null);
    const result = await saveRepair({
      callId,
      ...values,
      flameSignal: values.flameSignal || undefined,
      notes: values.notes || undefined,
      checks: allChecks.map((text) => ({ text, done: ticked.includes(text) })),
    });
    if (!result.ok) {
      setStatus({ tone: 'error', text: result.message });
      for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
        if (['repairNotes', 'cycles', 'flameSignal', 'notes'].includes(field)) setError(field as 'repairNotes', { message: messages[0] });
      }
      return;
    }
    setStatus({ tone: 'ok', text: 'Repair and verification saved.' });
    router.refresh();
  });

  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-labelledby="repair-heading">
      <FormMessage message={status?.text} tone={status?.tone} />
      <fieldset disabled={readOnly} className="space-y-4">
        <Field label="Repair notes" error={e.repairNotes?.message} hint="What you found and what you did.">
          {(a11y) => <textarea {...a11y} rows={4} className="input py-2" {...register('repairNotes')} />}
        </Field>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Heat cycles run" error={e.cycles?.message} hint="Complete call-for-heat cycles watched after the repair.">
            {(a11y) => <TextInput {...a11y} inputMode="numeric" className="font-mono" {...register('cycles')} />}
          </Field>
          <Field label="Flame signal after repair" error={e.flameSignal?.message} hint='As read on the meter, e.g. "4.2 µA".'>
            {(a11y) => <TextInput {...a11y} inputMode="decimal" className="font-mono" placeholder="4.2 µA" {...register('flameSignal')} />}
          </Field>
        </div>
        {allChecks.length > 0 && (
          <fieldset>
            <legend className="label">Verification checklist</legend>
            <ul className="space-y-2">
              {allChecks.map((text) => (
                <li key={text}>
                  <label className="flex min-h-touch cursor-pointer items-center gap-3 rounded-lg border border-line bg-surface px-3 py-2">
                    <input type="checkbox" value={text} className="h-6 w-6 shrink-0 accent-[rgb(var(--copper))]" {...register('ticked')} />
                    <span>{text}</span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        )}
        <Field label="Notes" error={e.notes?.message} hint="Optional: anything the customer or the office should know.">
          {(a11y) => <textarea {...a11y} rows={2} className="input py-2" {...register('notes')} />}
        </Field>
        {!readOnly && (
          <button type="submit" className="btn-secondary" disabled={formState.isSubmitting}>
            {formState.isSubmitting ? 'Saving…' : 'Save repair and verification'}
          </button>
        )}
      </fieldset>
    </form>
  );
}

/** Close the call, or refer it on; the server says why when it may not be closed yet. */
export function CloseCallControls({ callId, closeCall }: { callId: string; closeCall: Act<{ status: string }> }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const finish = (outcome: 'closed' | 'referred') =>
    startTransition(async () => {
      setMessage(null);
      const result = await closeCall({ callId, outcome });
      if (!result.ok) {
        setMessage({ tone: 'error', text: result.message });
        return;
      }
      // The page itself says the call is closed once it is refreshed; these controls then go.
      router.refresh();
    });
  return (
    <div className="space-y-3">
      <FormMessage message={message?.text} tone={message?.tone} />
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" disabled={pending} onClick={() => finish('closed')}>
          Close call
        </button>
        <button type="button" className="btn-secondary" disabled={pending} onClick={() => finish('referred')}>
          Refer
        </button>
      </div>
      <p className="text-sm text-muted">Refer when the fault needs another trade, a part on order, or the office’s decision.</p>
    </div>
  );
}
