'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { UnitProfileFields } from '@/components/practice/unit-profile-fields';
import { Field, FormMessage, TextInput } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { createScenarioSchema, type FaultChoice, type ScenarioOutput } from '@/lib/validations/practice';

type In = z.input<typeof createScenarioSchema>;
type Out = z.output<typeof createScenarioSchema>;

interface Props {
  faults: readonly FaultChoice[];
  createScenario: (input: unknown) => Promise<ActionResult<ScenarioOutput>>;
}

/** A trainer's new scenario: one fault, or several for the bench to draw one from at random, on a unit profile. */
export function ScenarioForm({ faults, createScenario }: Props) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError, control } = useForm<In, unknown, Out>({
    resolver: zodResolver(createScenarioSchema),
    defaultValues: {
      title: '',
      faultIds: [],
      unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' },
      notes: '',
      dueOn: '',
    },
  });
  const chosen = useWatch({ control, name: 'faultIds' }) ?? [];

  async function onSubmit(values: Out) {
    setMessage(null);
    const result = await createScenario(values);
    if (!result.ok) {
      setMessage(result.message);
      for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
        if (field === 'title' || field === 'faultIds' || field === 'notes' || field === 'dueOn') setError(field, { message: messages[0] });
      }
      return;
    }
    router.push(`/practice/scenarios/${result.data.id}`);
  }

  const errors = formState.errors;
  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-5" aria-label="New practice scenario">
      <FormMessage message={message} />
      <Field label="Title" error={errors.title?.message}>
        {(p) => <TextInput {...p} {...register('title')} placeholder="e.g. No heat, sparks but no flame" />}
      </Field>
      <fieldset className="space-y-2">
        <legend className="label">
          Fault{' '}
          <span className="font-normal text-muted">
            — choose one, or several for the bench to draw one at random ({chosen.length} chosen)
          </span>
        </legend>
        {faults.length === 0 ? (
          <p className="text-muted">The bench has no faults to offer.</p>
        ) : (
          <ul className="grid gap-2 sm:grid-cols-2">
            {faults.map((f) => (
              <li key={f.id}>
                <label className="flex min-h-touch cursor-pointer items-start gap-3 rounded-lg border border-line bg-surface px-3 py-2 has-[:checked]:border-copper">
                  <input type="checkbox" value={f.id} {...register('faultIds')} className="mt-1 h-6 w-6 shrink-0 accent-copper" />
                  <span>
                    <span className="font-semibold">{f.title}</span>
                    {f.description && <span className="block text-sm text-muted">{f.description}</span>}
                  </span>
                </label>
              </li>
            ))}
          </ul>
        )}
        {errors.faultIds && (
          <p className="field-error" aria-live="polite">
            <span aria-hidden>⚠</span> {errors.faultIds.message ?? errors.faultIds.root?.message}
          </p>
        )}
      </fieldset>
      <UnitProfileFields register={register} />
      <Field
        label="Notes for the apprentice"
        error={errors.notes?.message}
        hint="What the customer said, what to practise. The fault is never shown to them."
      >
        {(p) => <textarea {...p} {...register('notes')} rows={3} className="input py-2" />}
      </Field>
      <Field label="Due date (optional)" error={errors.dueOn?.message}>
        {(p) => <TextInput {...p} type="date" {...register('dueOn')} />}
      </Field>
      <button type="submit" className="btn-primary w-full sm:w-auto" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Creating…' : 'Create the scenario'}
      </button>
    </form>
  );
}
