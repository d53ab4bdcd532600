'use client';

import { useId, useState } from 'react';
import type { ActionResult } from '@/lib/validations/api';

/**
 * The way out of every step: "none of these fits" or "I can't take this reading" ends the
 * diagnosis as escalated, with a note the company's leads read. Asks for the note first and
 * says plainly what follows.
 */
export function EscalateStep({
  onEscalate,
  disabled = false,
}: {
  onEscalate: (note: string) => Promise<ActionResult<unknown>>;
  /** While answers still wait to be saved, the diagnosis cannot be handed on. */
  disabled?: boolean;
}) {
  const id = useId();
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [sending, setSending] = useState(false);

  if (!open) {
    return (
      <button type="button" className="btn-quiet min-h-touch text-base underline" disabled={disabled} onClick={() => setOpen(true)}>
        None of these fits, or I can’t take this reading
      </button>
    );
  }
  const send = async () => {
    if (note.trim() === '') {
      setError('Say what you saw, or why the reading cannot be taken, so a lead can pick it up.');
      return;
    }
    setSending(true);
    setError(null);
    try {
      const result = await onEscalate(note.trim());
      if (!result.ok) setError(result.message);
    } catch {
      setError('The server did not answer. Your note is still here: try again.');
    } finally {
      setSending(false);
    }
  };
  return (
    <section aria-labelledby={`${id}-h`} className="space-y-3 rounded-lg border-2 border-ink bg-raised p-4" data-testid="escalate">
      <h2 id={`${id}-h`} className="text-lg font-bold">
        Send this diagnosis to the leads
      </h2>
      <p className="text-base">
        The diagnosis ends here without a finding, and your company’s leads see it with your note. Leave the unit safe before you go.
      </p>
      <label className="block space-y-2">
        <span className="label text-base">What you saw, or why the reading cannot be taken</span>
        <textarea
          className="input min-h-[6rem] w-full text-lg"
          maxLength={1000}
          value={note}
          onChange={(e) => setNote(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-e` : undefined}
        />
      </label>
      {error && (
        <p id={`${id}-e`} role="alert" className="font-semibold">
          {error}
        </p>
      )}
      <div className="flex flex-wrap gap-3">
        <button type="button" className="btn-primary" disabled={sending} onClick={send}>
          {sending ? 'Sending…' : 'Send to the leads'}
        </button>
        <button type="button" className="btn-secondary" disabled={sending} onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </section>
  );
}
