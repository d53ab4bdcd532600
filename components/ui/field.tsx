import clsx from 'clsx';
import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

interface FieldProps {
  label: string;
  error?: string;
  hint?: ReactNode;
  children: (props: { id: string; 'aria-invalid': boolean; 'aria-describedby'?: string }) => ReactNode;
}

/** A label, a control and its error, wired for screen readers; the error never relies on colour alone. */
export function Field({ label, error, hint, children }: FieldProps) {
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div>
      <label htmlFor={id} className="label">
        {label}
      </label>
      {children({ id, 'aria-invalid': Boolean(error), 'aria-describedby': describedBy })}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-sm text-muted">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} className={clsx('field-error', !error && 'sr-only')} aria-live="polite">
        {error && (
          <>
            <span aria-hidden>⚠</span> {error}
          </>
        )}
      </p>
    </div>
  );
}

export const TextInput = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement>>(function TextInput(
  { className, ...props },
  ref,
) {
  return <input ref={ref} className={clsx('input', className)} {...props} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className, ...props }, ref) {
  return <select ref={ref} className={clsx('input pr-8', className)} {...props} />;
});

/** A form-level message in a live region that is always there, so screen readers announce it. */
export function FormMessage({
  message,
  tone = 'error',
  className,
}: {
  message?: string | null;
  tone?: 'error' | 'ok';
  className?: string;
}) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} aria-live="polite" className={className}>
      {message && (
        <p
          className={clsx(
            'rounded-lg border-2 px-4 py-3 font-semibold',
            tone === 'error' ? 'border-ink bg-sunken' : 'border-copper bg-copper-soft',
          )}
        >
          <span aria-hidden>{tone === 'error' ? '⚠ ' : '✓ '}</span>
          {message}
        </p>
      )}
    </div>
  );
}
