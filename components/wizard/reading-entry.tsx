'use client';

import { useEffect, useId, useRef } from 'react';
import type { MeasureStep } from '@/lib/trees/schema';
import { formatOptionsFor, formatReading, OVER_RANGE_ENTRY, OVER_RANGE_TEXT, parseReading, type ReadingParse } from '@/lib/units';
import { BandGauge } from '@/components/wizard/band-gauge';
import { NumericKeypad } from '@/components/wizard/numeric-keypad';
import { UnitPicker } from '@/components/wizard/unit-picker';

export interface ReadingValue {
  text: string;
  unit: string;
}

/**
 * The same parse the server runs on the answer, so what is refused here would be refused there.
 * "OL" / "open" on an ohms step comes back as the over-range answer (saved as `overRange: true`).
 */
export function parseEntry(step: Pick<MeasureStep, 'quantity'>, value: ReadingValue): ReadingParse {
  return parseReading(step.quantity, value.text, value.unit, { overRange: true });
}

const HINTS: Partial<Record<MeasureStep['quantity'], string>> = {
  length: 'Type the value or use the keypad; fractions like 1 1/8 work for inches.',
  ohm: 'Type the value or use the keypad; OL is an open circuit (the meter over range).',
};
const HINT = 'Type the value or use the keypad.';

/**
 * Where a step's reading comes from instead of the keypad (the bench of a practice diagnosis): what
 * to measure, and the latest reading that answers the step, which fills it.
 */
export interface ReadingSource {
  /** What to measure, in words ("V AC across xfmr-hot and xfmr-common"). */
  hint: string;
  /** The latest reading that answers the step; `key` is new for each reading taken. */
  reading: (ReadingValue & { key: string; label: string }) | null;
}

export interface ReadingEntryProps {
  step: Pick<MeasureStep, 'id' | 'quantity' | 'bands'>;
  value: ReadingValue;
  onChange: (value: ReadingValue) => void;
  /** Enter in the text field: the form's primary action. */
  onSubmit?: () => void;
  disabled?: boolean;
  /** The reading is taken elsewhere (the bench): shown in place of the keypad, with "Use this reading". */
  source?: ReadingSource;
}

export function ReadingEntry({ step, value, onChange, onSubmit, disabled, source }: ReadingEntryProps) {
  const id = useId();
  const parsed = value.text.trim() === '' ? null : parseEntry(step, value);
  const signed = step.quantity === 'vdc' || step.quantity === 'udc';
  const ohms = step.quantity === 'ohm';

  const setText = (text: string) => onChange({ ...value, text });

  // When the gauge first appears under the keypad it can sit below the fold or behind the fixed
  // action bar (a tablet in landscape): bring it into view once, not on every key.
  const gaugeRef = useRef<HTMLDivElement>(null);
  const showsGauge = parsed?.ok === true;
  useEffect(() => {
    const el = gaugeRef.current;
    if (!showsGauge || !el) return;
    const bar = document.querySelector('[data-testid="action-bar"]')?.getBoundingClientRect().height ?? 0;
    if (el.getBoundingClientRect().bottom > window.innerHeight - bar) {
      const reduce = window.matchMedia?.('(prefers-reduced-motion: reduce)').matches;
      el.scrollIntoView?.({ block: 'end', behavior: reduce ? 'auto' : 'smooth' });
    }
  }, [showsGauge]);

  return (
    <div className="space-y-4">
      <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div className="space-y-3">
          <label htmlFor={`${id}-reading`} className="label text-base">
            Reading
          </label>
          <input
            id={`${id}-reading`}
            className="input h-16 font-mono text-3xl"
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            value={value.text}
            disabled={disabled}
            aria-invalid={parsed !== null && !parsed.ok}
            aria-describedby={`${id}-feedback`}
            onChange={(e) => setText(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter' && onSubmit) {
                e.preventDefault();
                onSubmit();
              }
            }}
          />
          <div>
            <p className="label text-base" id={`${id}-unit`}>
              Unit
            </p>
            <UnitPicker step={step} value={value.unit} onChange={(unit) => onChange({ ...value, unit })} />
          </div>
          <p id={`${id}-feedback`} aria-live="polite" className="min-h-[1.5rem] text-base" data-testid="parse-feedback">
            {parsed === null ? (
              <span className="text-muted">{HINTS[step.quantity] ?? HINT}</span>
            ) : parsed.ok && parsed.overRange ? (
              <span>
                <span aria-hidden>✓ </span>Reads as <span className="font-mono font-semibold">{OVER_RANGE_TEXT}</span>
              </span>
            ) : parsed.ok ? (
              <span>
                <span aria-hidden>✓ </span>Reads as{' '}
                <span className="font-mono font-semibold">
                  {formatReading(step.quantity, parsed.value, parsed.unit, formatOptionsFor(parsed.form))}
                </span>
              </span>
            ) : (
              <span className="field-error mt-0" role="status">
                <span aria-hidden>✗</span> {parsed.message}
              </span>
            )}
          </p>
        </div>
        {source ? (
          <div className="card space-y-3" data-testid="reading-source">
            <p className="label text-base">From the bench</p>
            <p className="text-base">Measure {source.hint} on the schematic: the reading fills this step.</p>
            {/* The practice page puts the bench below the step on a tablet. */}
            <a href="#practice-bench" className="inline-flex min-h-12 items-center font-semibold underline underline-offset-4 2xl:hidden">
              ↓ Go to the schematic
            </a>
            {source.reading ? (
              <>
                <p className="font-mono text-2xl font-semibold" data-testid="source-reading">
                  {source.reading.label}
                </p>
                <button
                  type="button"
                  className="btn-secondary w-full"
                  disabled={disabled}
                  onClick={() => onChange({ text: source.reading!.text, unit: source.reading!.unit })}
                >
                  Use this reading
                </button>
              </>
            ) : (
              <p className="text-base text-muted">No reading there yet.</p>
            )}
          </div>
        ) : (
          <NumericKeypad
            disabled={disabled}
            fractions={step.quantity === 'length'}
            negative={signed}
            onOverRange={ohms ? () => setText(OVER_RANGE_ENTRY) : undefined}
            // The field is not focused from the keypad: that would pop up the tablet's own keyboard.
            // A digit after "OL" starts a number again rather than making "OL5".
            onKey={(k) => setText((parsed?.ok && parsed.overRange ? '' : value.text) + k)}
            onBackspace={() => setText(value.text.slice(0, -1))}
          />
        )}
      </div>
      <div ref={gaugeRef} className="scroll-mb-4">
        {parsed?.ok &&
          (parsed.overRange ? (
            <BandGauge step={step} overRange unit={parsed.unit} caption="This reading" />
          ) : (
            <BandGauge step={step} value={parsed.value} unit={parsed.unit} form={parsed.form} caption="This reading" />
          ))}
      </div>
    </div>
  );
}
