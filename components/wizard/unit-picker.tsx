'use client';

import clsx from 'clsx';
import { useRef } from 'react';
import type { MeasureStep } from '@/lib/trees/schema';
import { UNITS_BY_QUANTITY, unitsForStep } from '@/lib/units';

export interface UnitPickerProps {
  step: Pick<MeasureStep, 'quantity' | 'bands'>;
  value: string;
  onChange: (unit: string) => void;
}

/**
 * Segmented buttons, one per unit that fits the step (its quantity and the magnitude of its bands);
 * a radio group for keyboards and screen readers. A unit already chosen (a company default, a
 * reading given back after a refusal) stays on offer even when it is not one of those.
 */
export function UnitPicker({ step, value, onChange }: UnitPickerProps) {
  const fitting = unitsForStep(step);
  const current = fitting.some((u) => u.symbol === value) ? undefined : UNITS_BY_QUANTITY[step.quantity].find((u) => u.symbol === value);
  const units = current ? UNITS_BY_QUANTITY[step.quantity].filter((u) => u === current || fitting.includes(u)) : fitting;
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  if (units.length < 2) {
    return (
      <p className="font-mono text-lg font-semibold" aria-label="Unit">
        {units[0]?.symbol}
      </p>
    );
  }
  const move = (index: number) => {
    const next = (index + units.length) % units.length;
    onChange(units[next].symbol);
    refs.current[next]?.focus();
  };
  return (
    <div role="radiogroup" aria-label="Unit" className="flex flex-wrap gap-1 rounded-lg border border-line bg-sunken p-1">
      {units.map((u, i) => {
        const checked = u.symbol === value;
        return (
          <button
            key={u.symbol}
            ref={(el) => {
              refs.current[i] = el;
            }}
            type="button"
            role="radio"
            aria-checked={checked}
            aria-label={`${u.symbol} (${u.label})`}
            tabIndex={checked ? 0 : -1}
            onClick={() => onChange(u.symbol)}
            onKeyDown={(e) => {
              if (e.key === 'ArrowRight' || e.key === 'ArrowDown') {
                e.preventDefault();
                move(i + 1);
              } else if (e.key === 'ArrowLeft' || e.key === 'ArrowUp') {
                e.preventDefault();
                move(i - 1);
              }
            }}
            className={clsx(
              'min-h-touch min-w-touch flex-1 rounded-md px-3 font-mono text-base font-semibold',
              checked ? 'bg-ink text-surface shadow' : 'text-ink hover:bg-raised',
            )}
          >
            {checked && (
              <span aria-hidden className="mr-1">
                ✓
              </span>
            )}
            {u.symbol}
          </button>
        );
      })}
    </div>
  );
}
