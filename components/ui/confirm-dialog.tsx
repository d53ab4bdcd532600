'use client';

import clsx from 'clsx';
import { useEffect, useId, useRef, type FormEvent, type ReactNode, type RefObject } from 'react';
import { FormMessage } from '@/components/ui/field';

interface Props {
  open: boolean;
  title: string;
  /** What happens if the user goes ahead, in a sentence or two. */
  description: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  /** While the change is on its way: both buttons wait, and Escape does nothing. */
  busy?: boolean;
  busyLabel?: string;
  /** Why the last attempt did not go through, in words. */
  error?: string | null;
  /** Fields the decision needs (a reason, a comment), between the description and the buttons. */
  children?: ReactNode;
  /** What gets the focus on opening; the cancel button when not given, so Enter never confirms by accident. */
  initialFocus?: RefObject<HTMLElement | null>;
  onConfirm: () => void;
  onCancel: () => void;
}

/**
 * A confirmation as a native modal <dialog>: the page behind is inert, focus stays inside, Escape
 * cancels, and on closing the focus goes back to what opened it. Where showModal is missing
 * (jsdom), it opens as a plain dialog with the same focus handling.
 */
export function ConfirmDialog({
  open,
  title,
  description,
  confirmLabel,
  cancelLabel = 'Cancel',
  busy = false,
  busyLabel,
  error,
  children,
  initialFocus,
  onConfirm,
  onCancel,
}: Props) {
  const ref = useRef<HTMLDialogElement>(null);
  const cancelRef = useRef<HTMLButtonElement>(null);
  const opener = useRef<HTMLElement | null>(null);
  const id = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      opener.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
      if (typeof dialog.showModal === 'function') dialog.showModal();
      else dialog.setAttribute('open', '');
      (initialFocus?.current ?? cancelRef.current)?.focus();
    } else if (!open && dialog.open) {
      if (typeof dialog.close === 'function') dialog.close();
      else dialog.removeAttribute('open');
      opener.current?.focus();
      opener.current = null;
    }
  }, [open, initialFocus]);

  function submit(e: FormEvent) {
    e.preventDefault();
    if (!busy) onConfirm();
  }

  return (
    <dialog
      ref={ref}
      aria-labelledby={`${id}-title`}
      aria-describedby={`${id}-desc`}
      // Escape: the browser's cancel event, kept from closing the dialog on its own so the state stays the one truth.
      onCancel={(e) => {
        e.preventDefault();
        if (!busy) onCancel();
      }}
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.preventDefault();
          if (!busy) onCancel();
        }
      }}
      className={clsx(
        'w-[min(34rem,calc(100vw-2rem))] rounded-lg border-2 border-ink bg-raised p-0 text-ink shadow-xl backdrop:bg-graphite-950/60',
      )}
    >
      {open && (
        <form onSubmit={submit} noValidate className="space-y-4 p-5">
          <h2 id={`${id}-title`} className="text-xl font-bold">
            {title}
          </h2>
          <div id={`${id}-desc`} className="space-y-2">
            {description}
          </div>
          {children}
          <FormMessage message={error} />
          <div className="flex flex-wrap justify-end gap-2">
            <button ref={cancelRef} type="button" className="btn-secondary" disabled={busy} onClick={onCancel}>
              {cancelLabel}
            </button>
            <button type="submit" className="btn-primary" disabled={busy}>
              {busy ? (busyLabel ?? 'Working…') : confirmLabel}
            </button>
          </div>
        </form>
      )}
    </dialog>
  );
}
