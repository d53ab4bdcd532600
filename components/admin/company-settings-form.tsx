'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Field, FormMessage, Select, TextInput } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { companySettingsSchema, TIME_ZONE_NAMES } from '@/lib/validations/users';

type Input = z.input<typeof companySettingsSchema>;
type Output = z.output<typeof companySettingsSchema>;
type Result = ActionResult<unknown>;

export function CompanySettingsForm({ initial, save }: { initial: Output; save: (input: unknown) => Promise<Result> }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError } = useForm<Input, unknown, Output>({
    resolver: zodResolver(companySettingsSchema),
    defaultValues: initial,
  });

  async function onSubmit(values: Output) {
    const result = await save(values);
    if (result.ok) {
      setStatus({ tone: 'ok', text: 'Saved.' });
      router.refresh();
      return;
    }
    setStatus({ tone: 'error', text: result.message });
    for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
      if (field in values) setError(field as keyof Input, { message: messages[0] });
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="card max-w-xl space-y-5">
      <FormMessage message={status?.text} tone={status?.tone} className="-mb-5 [&:not(:empty)]:mb-0" />
      <Field label="Company name" error={formState.errors.name?.message}>
        {(a11y) => <TextInput {...a11y} {...register('name')} />}
      </Field>
      <Field label="Office e-mail" error={formState.errors.officeEmail?.message} hint="Service reports are copied here.">
        {(a11y) => <TextInput {...a11y} type="email" {...register('officeEmail')} />}
      </Field>
      <Field
        label="Time zone"
        error={formState.errors.timeZone?.message}
        hint="Every date in the app and on the service reports is shown in this zone, wherever the tablet is."
      >
        {(a11y) => (
          <Select {...a11y} {...register('timeZone')}>
            {TIME_ZONE_NAMES.map((zone) => (
              <option key={zone} value={zone}>
                {zone.replaceAll('_', ' ')}
              </option>
            ))}
          </Select>
        )}
      </Field>
      <fieldset>
        <legend className="label">Display units</legend>
        <div className="flex flex-wrap gap-3">
          {(
            [
              ['us', 'US customary (in, inWC)'],
              ['metric', 'Metric (mm, Pa)'],
            ] as const
          ).map(([value, label]) => (
            <label
              key={value}
              className="flex min-h-touch cursor-pointer items-center gap-3 rounded-lg border border-line px-4 has-[:checked]:border-copper has-[:checked]:bg-copper-soft"
            >
              <input type="radio" value={value} className="h-5 w-5 accent-[rgb(var(--copper))]" {...register('displayUnits')} />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Saving…' : 'Save settings'}
      </button>
    </form>
  );
}
