import clsx from 'clsx';
import { forwardRef, useId, type InputHTMLAttributes } from 'react';

/** A row of large radio buttons for a choice of two or three, easy to hit with gloves on. */
export function Segmented({ legend, error, children }: { legend: string; error?: string; children: React.ReactNode }) {
  const id = useId();
  return (
    <fieldset aria-describedby={error ? `${id}-error` : undefined} aria-invalid={Boolean(error) || undefined}>
      <legend className="label">{legend}</legend>
      <div className="grid auto-cols-fr grid-flow-col gap-2">{children}</div>
      <p id={`${id}-error`} className={clsx('field-error', !error && 'sr-only')} aria-live="polite">
        {error && (
          <>
            <span aria-hidden>⚠</span> {error}
          </>
        )}
      </p>
    </fieldset>
  );
}

export const SegmentOption = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { label: string; detail?: string }>(
  function SegmentOption({ label, detail, className, ...props }, ref) {
    return (
      <label className={clsx('relative block cursor-pointer', className)}>
        <input ref={ref} type="radio" className="peer sr-only" {...props} />
        <span aria-hidden className="absolute right-2 top-1 hidden font-mono text-sm peer-checked:inline">
          ✓
        </span>
        <span className="flex min-h-touch flex-col items-center justify-center rounded-lg border-2 border-line bg-raised px-3 py-2 text-center font-semibold peer-checked:border-copper peer-checked:bg-copper-soft peer-focus-visible:outline peer-focus-visible:outline-[3px] peer-focus-visible:outline-offset-2 peer-focus-visible:outline-copper">
          <span>{label}</span>
          {detail && <span className="text-sm font-normal text-muted">{detail}</span>}
        </span>
      </label>
    );
  },
);
