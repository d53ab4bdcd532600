'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Field, FormMessage, TextInput } from '@/components/ui/field';
import { signInSchema } from '@/lib/validations/auth';

type Input = z.input<typeof signInSchema>;
type Output = z.output<typeof signInSchema>;

export function SignInForm() {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Input, unknown, Output>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  async function onSubmit(values: Output) {
    setMessage(null);
    try {
      const res = await fetch('/api/auth/sign-in', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify(values),
      });
      if (res.ok) {
        router.replace('/');
        router.refresh();
        return;
      }
      const body = await res.json().catch(() => null);
      setMessage(body?.error?.message ?? 'Sign-in failed. Try again.');
    } catch {
      setMessage('The server could not be reached. Check the connection and try again.');
    }
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-5">
      <FormMessage message={message} className="-mb-5 [&:not(:empty)]:mb-0" />
      <Field label="E-mail" error={formState.errors.email?.message}>
        {(a11y) => <TextInput {...a11y} type="email" autoComplete="username" inputMode="email" {...register('email')} />}
      </Field>
      <Field label="Password" error={formState.errors.password?.message}>
        {(a11y) => <TextInput {...a11y} type="password" autoComplete="current-password" {...register('password')} />}
      </Field>
      <button type="submit" className="btn-primary w-full text-lg" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
