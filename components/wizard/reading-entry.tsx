'use client';

import { useId } from 'react';
import type { MeasureStep } from '@/lib/trees/schema';
import { parseReading, type ParseResult } from '@/lib/units';
import { BandGauge } from '@/components/wizard/band-gauge';
import { NumericKeypad } from '@/components/wizard/numeric-keypad';
import { UnitPicker } from '@/components/wizard/unit-picker';

export interface ReadingValue {
  text: string;
  unit: string;
}

/** The same parse the server runs on the answer, so what is refused here would be refused there. */
export function parseEntry(step: Pick<MeasureStep, 'quantity'>, value: ReadingValue): ParseResult {
  return parseReading(step.quantity, value.text, value.unit);
}

export interface ReadingEntryProps {
  step: Pick<MeasureStep, 'id' | 'quantity' | 'bands'>;
  value: ReadingValue;
  onChange: (value: ReadingValue) => void;
  /** Enter in the text field: the form's primary action. */
  onSubmit?: () => void;
  disabled?: boolean;
}

export function ReadingEntry({ step, value, onChange, onSubmit, disabled }: ReadingEntryProps) {
  const id = useId();
  const parsed = value.text.trim() === '' ? null : parseEntry(step, value);
  const signed = step.quantity === 'vdc' || step.quantity === 'udc';

  const setText = (text: string) => onChange({ ...value, text });

  return (
    <div className="space-y-4">
      <div className="grid gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <div className="space-y-3">
          <label htmlFor={`${id}-reading`} className="label">
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
            <p className="label" id={`${id}-unit`}>
              Unit
            </p>
            <UnitPicker quantity={step.quantity} value={value.unit} onChange={(unit) => onChange({ ...value, unit })} />
          </div>
          <p id={`${id}-feedback`} aria-live="polite" className="min-h-[1.5rem] text-base" data-testid="parse-feedback">
            {parsed === null ? (
              <span className="text-muted">Type the value or use the keypad; fractions like 1 1/8 work for inches.</span>
            ) : parsed.ok ? (
              <span>
                <span aria-hidden>✓ </span>Reads as <span className="font-mono font-semibold">{value.text.trim()}</span>
                {!/[a-zµΩ"']/i.test(value.text) && <span className="font-mono font-semibold"> {parsed.unit}</span>}
              </span>
            ) : (
              <span className="field-error mt-0" role="status">
                <span aria-hidden>✗</span> {parsed.message}
              </span>
            )}
          </p>
        </div>
        <NumericKeypad
          disabled={disabled}
          fractions={step.quantity === 'length'}
          negative={signed}
          // The field is not focused from the keypad: that would pop up the tablet's own keyboard.
          onKey={(k) => setText(value.text + k)}
          onBackspace={() => setText(value.text.slice(0, -1))}
        />
      </div>
      {parsed?.ok && <BandGauge step={step} value={parsed.value} unit={parsed.unit} caption="This reading" />}
    </div>
  );
}
