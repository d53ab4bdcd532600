'use client';

import { useEffect, useRef, useState } from 'react';

export interface UndoLastProps {
  lastTitle: string | null;
  disabled: boolean;
  onUndo: () => void;
  /** Why undo is not offered at all (a closed call, a signed-off diagnosis); said instead of the button. */
  lockedReason?: string | null;
}

/** Undo of the last answer, behind a confirmation, since it removes a saved answer. */
export function UndoLast({ lastTitle, disabled, onUndo, lockedReason }: UndoLastProps) {
  const [asking, setAsking] = useState(false);
  const confirmRef = useRef<HTMLButtonElement>(null);
  const openerRef = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    if (asking) confirmRef.current?.focus();
  }, [asking]);
  if (!lastTitle) return null;
  if (lockedReason) {
    return (
      <p className="text-base text-muted" data-testid="undo-locked">
        {lockedReason}
      </p>
    );
  }
  if (!asking) {
    return (
      <button ref={openerRef} type="button" className="btn-secondary" disabled={disabled} onClick={() => setAsking(true)}>
        <span aria-hidden>↶</span> Undo last answer
      </button>
    );
  }
  return (
    <div
      role="alertdialog"
      aria-modal="false"
      aria-labelledby="undo-title"
      aria-describedby="undo-desc"
      className="w-full rounded-lg border-2 border-ink bg-raised p-4"
    >
      <p id="undo-title" className="font-semibold">
        Undo the last answer?
      </p>
      <p id="undo-desc" className="mb-3 text-base">
        The answer to “{lastTitle}” is removed and that step is asked again.
      </p>
      <div className="flex flex-wrap gap-3">
        <button
          ref={confirmRef}
          type="button"
          className="btn-primary"
          onClick={() => {
            setAsking(false);
            onUndo();
          }}
        >
          Undo it
        </button>
        <button
          type="button"
          className="btn-secondary"
          onClick={() => {
            setAsking(false);
            setTimeout(() => openerRef.current?.focus(), 0);
          }}
        >
          Keep it
        </button>
      </div>
    </div>
  );
}
