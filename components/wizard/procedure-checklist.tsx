'use client';

import clsx from 'clsx';
import { useId, useState } from 'react';
import { ActionBar } from '@/components/wizard/action-bar';

export interface ProcedureChecklistProps {
  items: readonly string[];
  onConfirm: () => void;
  confirmLabel?: string;
  disabled?: boolean;
}

/** An action step's items, ticked one by one; Confirm is offered only once every item is ticked. */
export function ProcedureChecklist({ items, onConfirm, confirmLabel = 'Confirm', disabled }: ProcedureChecklistProps) {
  const id = useId();
  const [ticked, setTicked] = useState<boolean[]>(() => items.map(() => false));
  const done = ticked.filter(Boolean).length;
  const all = done === items.length;
  return (
    <>
      {items.length > 0 && (
        <fieldset className="space-y-2">
          <legend className="label">Tick each item as you do it</legend>
          <ol className="space-y-2">
            {items.map((item, i) => (
              <li key={i}>
                <label
                  htmlFor={`${id}-${i}`}
                  className={clsx(
                    'flex min-h-touch cursor-pointer items-center gap-4 rounded-lg border px-4 py-3 text-base',
                    ticked[i] ? 'border-ink bg-sunken' : 'border-line bg-raised',
                  )}
                >
                  <input
                    id={`${id}-${i}`}
                    type="checkbox"
                    className="h-7 w-7 shrink-0 accent-copper"
                    checked={ticked[i]}
                    disabled={disabled}
                    onChange={(e) => setTicked((t) => t.map((v, j) => (j === i ? e.target.checked : v)))}
                  />
                  <span className={clsx(ticked[i] && 'font-semibold')}>{item}</span>
                </label>
              </li>
            ))}
          </ol>
        </fieldset>
      )}
      <ActionBar
        hint={
          items.length > 0 ? <span aria-live="polite">{all ? 'All items ticked.' : `${done} of ${items.length} ticked`}</span> : undefined
        }
      >
        <button type="button" className="btn-primary min-w-[12rem] text-lg" disabled={disabled || !all} onClick={onConfirm}>
          {confirmLabel}
        </button>
      </ActionBar>
    </>
  );
}
