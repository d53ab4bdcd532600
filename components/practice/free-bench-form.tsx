'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { UnitProfileFields } from '@/components/practice/unit-profile-fields';
import { Field, FormMessage, Select } from '@/components/ui/field';
import { createBenchSessionSchema } from '@/lib/validations/bench';
import type { FaultChoice } from '@/lib/validations/practice';

type In = z.input<typeof createBenchSessionSchema>;
type Out = z.output<typeof createBenchSessionSchema>;

/**
 * A lead's (or admin's) own bench session with a fault of their choice, to prove the company's tree
 * against it before publishing or after a change: POST /api/bench/sessions, then the bench page.
 */
export function FreeBenchForm({ faults }: { faults: readonly FaultChoice[] }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<In, unknown, Out>({
    resolver: zodResolver(createBenchSessionSchema),
    defaultValues: { faultId: null, unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } },
  });

  async function onSubmit(values: Out) {
    setMessage(null);
    try {
      const res = await fetch('/api/bench/sessions', {
        method: 'POST',
        headers: { 'content-type': 'application/json', accept: 'application/json' },
        credentials: 'same-origin',
        body: JSON.stringify(values),
      });
      const data = (await res.json().catch(() => null)) as { id?: string; error?: { message?: string } } | null;
      if (!res.ok || !data?.id) {
        setMessage(data?.error?.message ?? `The bench could not be opened (${res.status}).`);
        return;
      }
      router.push(`/practice/bench/${data.id}`);
    } catch {
      setMessage('The bench could not be reached: check the connection and try again.');
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-4" aria-label="Open a bench to prove the tree">
      <FormMessage message={message} />
      <Field label="Fault on the bench" error={formState.errors.faultId?.message}>
        {(p) => (
          <Select {...p} {...register('faultId', { setValueAs: (v: string) => (v === '' ? null : v) })}>
            <option value="">No fault (a healthy unit)</option>
            {faults.map((f) => (
              <option key={f.id} value={f.id}>
                {f.title}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <UnitProfileFields register={register} />
      <button type="submit" className="btn-primary w-full sm:w-auto" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Opening…' : 'Open the bench'}
      </button>
    </form>
  );
}
