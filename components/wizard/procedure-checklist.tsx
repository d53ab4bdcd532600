'use client';

import clsx from 'clsx';
import { useCallback, useId, useState, useSyncExternalStore } from 'react';
import { ActionBar } from '@/components/wizard/action-bar';

export interface ProcedureChecklistProps {
  items: readonly string[];
  onConfirm: () => void;
  confirmLabel?: string;
  disabled?: boolean;
  /**
   * Keeps the ticks on this device under this key (the diagnosis and the step), so a reload halfway
   * through a lock-out does not lose them; they are cleared when the step is confirmed.
   */
  storageKey?: string;
}

const PREFIX = 'pg-checklist:';

// The ticks kept per key: in localStorage, and in memory only for keys storage refused (full or disabled).
const memory = new Map<string, string>();
const listeners = new Set<() => void>();

function readStored(key: string): string {
  try {
    return localStorage.getItem(PREFIX + key) ?? memory.get(key) ?? '';
  } catch {
    return memory.get(key) ?? '';
  }
}

function writeStored(key: string, ticked: readonly string[]) {
  const raw = ticked.length === 0 ? '' : JSON.stringify(ticked);
  memory.delete(key);
  try {
    if (raw === '') localStorage.removeItem(PREFIX + key);
    else localStorage.setItem(PREFIX + key, raw);
  } catch {
    // Storage full or disabled: the ticks live in memory for this page.
    if (raw !== '') memory.set(key, raw);
  }
  listeners.forEach((l) => l());
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  // Another tab of the same diagnosis ticking the same step.
  window.addEventListener('storage', listener);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', listener);
  };
}

function parseStored(raw: string): string[] {
  if (raw === '') return [];
  try {
    const list: unknown = JSON.parse(raw);
    return Array.isArray(list) ? list.filter((x): x is string => typeof x === 'string') : [];
  } catch {
    return [];
  }
}

/** The ticked items (by their text), kept in storage under `storageKey` or in this component alone. */
function useTicks(items: readonly string[], storageKey: string | undefined) {
  const [local, setLocal] = useState<string[]>([]);
  const raw = useSyncExternalStore(
    subscribe,
    () => (storageKey ? readStored(storageKey) : ''),
    // The server renders nothing ticked; the stored ticks appear once the page is hydrated.
    () => '',
  );
  const stored = parseStored(raw);
  const list = storageKey ? stored : local;
  const ticked = items.map((item) => list.includes(item));
  const set = useCallback(
    (item: string, on: boolean) => {
      const next = (current: string[]) => (on ? [...current.filter((x) => x !== item), item] : current.filter((x) => x !== item));
      if (storageKey) writeStored(storageKey, next(parseStored(readStored(storageKey))));
      else setLocal(next);
    },
    [storageKey],
  );
  const clear = useCallback(() => {
    if (storageKey) writeStored(storageKey, []);
    else setLocal([]);
  }, [storageKey]);
  return { ticked, set, clear };
}

/** An action step's items, ticked one by one; Confirm is offered only once every item is ticked. */
export function ProcedureChecklist({ items, onConfirm, confirmLabel = 'Confirm', disabled, storageKey }: ProcedureChecklistProps) {
  const id = useId();
  const { ticked, set, clear } = useTicks(items, storageKey);
  const done = ticked.filter(Boolean).length;
  const all = done === items.length;
  return (
    <>
      {items.length > 0 && (
        <fieldset className="space-y-2">
          <legend className="label text-base">Tick each item as you do it</legend>
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
                    onChange={(e) => set(item, e.target.checked)}
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
        <button
          type="button"
          className="btn-primary min-w-[12rem] text-lg"
          disabled={disabled || !all}
          onClick={() => {
            clear();
            onConfirm();
          }}
        >
          {confirmLabel}
        </button>
      </ActionBar>
    </>
  );
}
