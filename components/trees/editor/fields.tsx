'use client';

// The small pieces the step panel's sections share: a labelled field with its error, and the
// error of a path of the form.
import { useId, type ReactNode } from 'react';
import { get, type FieldValues, type UseFormReturn } from 'react-hook-form';

export type Form = UseFormReturn<FieldValues>;

export function errorOf(form: Form, path: string): string | undefined {
  const e = get(form.formState.errors, path) as { message?: string } | undefined;
  return e?.message;
}

export function Labeled({
  label,
  error,
  children,
  className,
}: {
  label: string;
  error?: string;
  children: (id: string) => ReactNode;
  className?: string;
}) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="label">
        {label}
      </label>
      {children(id)}
      {error && (
        <p className="field-error" role="alert">
          <span aria-hidden>⚠</span> {error}
        </p>
      )}
    </div>
  );
}
