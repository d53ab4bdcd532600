'use client';

import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { forwardRef, useId, useRef, useState, useTransition, type FormEvent } from 'react';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { FormMessage, Select } from '@/components/ui/field';
import { ROLE_LABELS, type Role } from '@/lib/roles';
import type { ActionResult } from '@/lib/validations/api';
import { assignCallSchema, closeCallSchema, reopenCallSchema, signOffSchema } from '@/lib/validations/field';

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

/** Signs off someone else's finding, behind a confirmation that takes an optional comment. */
export function SignOffButton({
  callId,
  diagnosisId,
  findingTitle,
  signOff,
}: {
  callId: string;
  diagnosisId: string;
  findingTitle?: string;
  signOff: Act<unknown>;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [asking, setAsking] = useState(false);
  const [comment, setComment] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const commentRef = useRef<HTMLTextAreaElement>(null);
  const commentId = useId();

  function confirm() {
    const parsed = signOffSchema.safeParse({ comment: comment || undefined });
    if (!parsed.success) {
      setMessage(parsed.error.issues[0]?.message ?? 'Check the comment.');
      return;
    }
    startTransition(async () => {
      setMessage(null);
      const result = await signOff({ callId, diagnosisId, ...parsed.data });
      if (!result.ok) {
        setMessage(result.message);
        return;
      }
      setAsking(false);
      router.refresh();
    });
  }

  return (
    <div className="space-y-2">
      <button type="button" className="btn-secondary" disabled={pending} onClick={() => setAsking(true)}>
        Sign off this finding
      </button>
      <ConfirmDialog
        open={asking}
        title="Sign off this finding?"
        description={
          <p>
            You confirm that the readings support {findingTitle ? `“${findingTitle}”` : 'this finding'} and that the repair may go ahead.
            Your name goes on the call and on the service report.
          </p>
        }
        confirmLabel="Sign off"
        busy={pending}
        busyLabel="Signing off…"
        error={message}
        initialFocus={commentRef}
        onConfirm={confirm}
        onCancel={() => {
          setAsking(false);
          setMessage(null);
        }}
      >
        <div>
          <label htmlFor={commentId} className="label">
            Comment (optional)
          </label>
          <textarea
            ref={commentRef}
            id={commentId}
            rows={3}
            className="input py-2"
            value={comment}
            onChange={(e) => setComment(e.target.value)}
            placeholder="What you checked, or what the apprentice should know."
          />
        </div>
      </ConfirmDialog>
    </div>
  );
}

type Finish = { step: 'idle' } | { step: 'asking'; outcome: 'closed' | 'referred' };

/** Close the call, or refer it on with a reason; each behind a confirmation. The server says why when it may not be closed yet. */
export function CloseCallControls({ callId, closeCall }: { callId: string; closeCall: Act<{ status: string }> }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [state, setState] = useState<Finish>({ step: 'idle' });
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const reasonId = useId();
  const outcome = state.step === 'asking' ? state.outcome : null;

  function cancel() {
    setState({ step: 'idle' });
    setMessage(null);
    setReasonError(null);
  }

  function confirm() {
    if (!outcome) return;
    const parsed = closeCallSchema.safeParse({ outcome, reason: outcome === 'referred' ? reason : undefined });
    if (!parsed.success) {
      setReasonError(parsed.error.issues[0]?.message ?? 'Check the reason.');
      reasonRef.current?.focus();
      return;
    }
    setReasonError(null);
    startTransition(async () => {
      setMessage(null);
      const result = await closeCall({ callId, ...parsed.data });
      if (!result.ok) {
        setMessage(result.message);
        if (result.fieldErrors?.reason) setReasonError(result.fieldErrors.reason[0]);
        return;
      }
      setState({ step: 'idle' });
      // The page itself says the call is closed once it is refreshed; these controls then go.
      router.refresh();
    });
  }

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" disabled={pending} onClick={() => setState({ step: 'asking', outcome: 'closed' })}>
          Close call
        </button>
        <button
          type="button"
          className="btn-secondary"
          disabled={pending}
          onClick={() => setState({ step: 'asking', outcome: 'referred' })}
        >
          Refer
        </button>
      </div>
      <p className="text-muted">Refer when the fault needs another trade, a part on order, or the office’s decision.</p>
      <ConfirmDialog
        open={outcome !== null}
        title={outcome === 'referred' ? 'Refer this call?' : 'Close this call?'}
        description={
          outcome === 'referred' ? (
            <p>The call leaves your list and goes to the office with your reason. A lead or an admin can reopen it.</p>
          ) : (
            <p>
              The call’s record is final once it is closed: the repair and verification can no longer change. A lead or an admin can reopen
              it.
            </p>
          )
        }
        confirmLabel={outcome === 'referred' ? 'Refer the call' : 'Close the call'}
        busy={pending}
        busyLabel={outcome === 'referred' ? 'Referring…' : 'Closing…'}
        error={message}
        initialFocus={outcome === 'referred' ? reasonRef : undefined}
        onConfirm={confirm}
        onCancel={cancel}
      >
        {outcome === 'referred' && (
          <ReasonField
            id={reasonId}
            ref={reasonRef}
            label="Why refer it?"
            hint="For the office: what is needed, e.g. a part on order or another trade."
            value={reason}
            error={reasonError}
            onChange={setReason}
          />
        )}
      </ConfirmDialog>
    </div>
  );
}

/** A lead or admin reopens a closed or referred call, saying why. */
export function ReopenCallControls({ callId, reopenCall }: { callId: string; reopenCall: Act<{ status: string }> }) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const reasonId = useId();

  function confirm() {
    const parsed = reopenCallSchema.safeParse({ reason });
    if (!parsed.success) {
      setReasonError(parsed.error.issues[0]?.message ?? 'Check the reason.');
      reasonRef.current?.focus();
      return;
    }
    setReasonError(null);
    startTransition(async () => {
      setMessage(null);
      const result = await reopenCall({ callId, ...parsed.data });
      if (!result.ok) {
        setMessage(result.message);
        if (result.fieldErrors?.reason) setReasonError(result.fieldErrors.reason[0]);
        return;
      }
      setAsking(false);
      setReason('');
      router.refresh();
    });
  }

  return (
    <>
      <button type="button" className="btn-secondary" disabled={pending} onClick={() => setAsking(true)}>
        Reopen the call
      </button>
      <ConfirmDialog
        open={asking}
        title="Reopen this call?"
        description={<p>The call goes back on the list where its work stood. Your name and reason are kept on the call’s record.</p>}
        confirmLabel="Reopen"
        busy={pending}
        busyLabel="Reopening…"
        error={message}
        initialFocus={reasonRef}
        onConfirm={confirm}
        onCancel={() => {
          setAsking(false);
          setMessage(null);
          setReasonError(null);
        }}
      >
        <ReasonField
          id={reasonId}
          ref={reasonRef}
          label="Why reopen it?"
          hint="E.g. the customer called back, or the part arrived."
          value={reason}
          error={reasonError}
          onChange={setReason}
        />
      </ConfirmDialog>
    </>
  );
}

/** A lead or admin gives the call to another field user. */
export function ReassignCallControl({
  callId,
  currentId,
  assignees,
  assignCall,
}: {
  callId: string;
  currentId: string | null;
  assignees: { id: string; name: string; role: string }[];
  assignCall: Act<{ technicianName: string | null }>;
}) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const others = assignees.filter((a) => a.id !== currentId);
  const [choice, setChoice] = useState('');
  const [status, setStatus] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const selectId = useId();

  function submit(e: FormEvent) {
    e.preventDefault();
    const parsed = assignCallSchema.safeParse({ technicianId: choice });
    if (!parsed.success) {
      setStatus({ tone: 'error', text: parsed.error.issues[0]?.message ?? 'Choose a technician from the list.' });
      return;
    }
    startTransition(async () => {
      setStatus(null);
      const result = await assignCall({ callId, ...parsed.data });
      if (!result.ok) {
        setStatus({ tone: 'error', text: result.fieldErrors?.technicianId?.[0] ?? result.message });
        return;
      }
      setChoice('');
      setStatus({ tone: 'ok', text: `The call is now with ${result.data.technicianName ?? 'the technician you chose'}.` });
      router.refresh();
    });
  }

  if (others.length === 0) return null;
  return (
    <form onSubmit={submit} noValidate className="space-y-2">
      <label htmlFor={selectId} className="label">
        Reassign to
      </label>
      <div className="flex flex-wrap gap-2">
        <Select id={selectId} value={choice} onChange={(e) => setChoice(e.target.value)} className="w-auto min-w-[12rem] flex-1">
          <option value="">Choose a technician</option>
          {others.map((a) => (
            <option key={a.id} value={a.id}>
              {a.name} ({ROLE_LABELS[a.role as Role] ?? a.role})
            </option>
          ))}
        </Select>
        <button type="submit" className="btn-secondary" disabled={pending}>
          {pending ? 'Reassigning…' : 'Reassign'}
        </button>
      </div>
      <FormMessage message={status?.text} tone={status?.tone} />
    </form>
  );
}

const ReasonField = forwardRef<
  HTMLTextAreaElement,
  { id: string; label: string; hint: string; value: string; error: string | null; onChange: (value: string) => void }
>(function ReasonField({ id, label, hint, value, error, onChange }, ref) {
  return (
    <div>
      <label htmlFor={id} className="label">
        {label}
      </label>
      <textarea
        ref={ref}
        id={id}
        rows={3}
        className="input py-2"
        value={value}
        aria-invalid={Boolean(error)}
        aria-describedby={`${id}-hint ${id}-error`}
        onChange={(e) => onChange(e.target.value)}
      />
      <p id={`${id}-hint`} className="mt-1 text-muted">
        {hint}
      </p>
      <p id={`${id}-error`} className={clsx('field-error', !error && 'sr-only')} aria-live="polite">
        {error && (
          <>
            <span aria-hidden>⚠</span> {error}
          </>
        )}
      </p>
    </div>
  );
});
