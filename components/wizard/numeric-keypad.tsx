'use client';

import clsx from 'clsx';

// A big keypad for gloved fingers: digits 1–9 then ". 0 ⌫" in a 3×4 grid, and a row for what the
// quantity needs — "/" and a space for fractions of an inch ("1 1/8"), a minus for DC readings
// that can be negative with the leads reversed, "OL" for an ohms reading over range (open circuit).
export interface NumericKeypadProps {
  onKey: (key: string) => void;
  onBackspace: () => void;
  /** The "OL" key: the entry becomes the over-range answer. Shown only when given (ohms steps). */
  onOverRange?: () => void;
  fractions?: boolean;
  negative?: boolean;
  disabled?: boolean;
}

const DIGITS = ['1', '2', '3', '4', '5', '6', '7', '8', '9'];

export function NumericKeypad({
  onKey,
  onBackspace,
  onOverRange,
  fractions = false,
  negative = false,
  disabled = false,
}: NumericKeypadProps) {
  const key = 'btn-secondary min-h-[56px] text-2xl font-mono font-semibold';
  return (
    <div role="group" aria-label="Keypad" className="grid grid-cols-3 gap-2">
      {DIGITS.map((d) => (
        <button key={d} type="button" className={key} onClick={() => onKey(d)} disabled={disabled}>
          {d}
        </button>
      ))}
      <button type="button" className={key} onClick={() => onKey('.')} disabled={disabled} aria-label="Decimal point">
        .
      </button>
      <button type="button" className={key} onClick={() => onKey('0')} disabled={disabled}>
        0
      </button>
      <button type="button" className={key} onClick={onBackspace} disabled={disabled} aria-label="Backspace">
        ⌫
      </button>
      {(fractions || negative || onOverRange) && (
        <>
          {fractions && (
            <button type="button" className={key} onClick={() => onKey('/')} disabled={disabled} aria-label="Fraction slash">
              /
            </button>
          )}
          {fractions && (
            <button type="button" className={clsx(key, 'text-base')} onClick={() => onKey(' ')} disabled={disabled} aria-label="Space">
              space
            </button>
          )}
          {negative && (
            <button type="button" className={key} onClick={() => onKey('-')} disabled={disabled} aria-label="Minus">
              −
            </button>
          )}
          {onOverRange && (
            <button
              type="button"
              className={clsx(key, 'col-span-3')}
              onClick={onOverRange}
              disabled={disabled}
              aria-label="OL, open circuit (over range)"
            >
              OL <span className="ml-2 font-sans text-lg font-semibold">open circuit</span>
            </button>
          )}
        </>
      )}
    </div>
  );
}
