'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { Field, FormMessage, TextInput } from '@/components/ui/field';
import { NO_ANSWER, NO_CONNECTION, postJson, waitInWords, type PostResult } from '@/lib/http';
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
    const result = await postJson('/api/auth/sign-in', values);
    if (result.kind === 'ok') {
      router.replace('/');
      router.refresh();
      return;
    }
    setMessage(signInMessage(result));
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

/** What the form says when the sign-in did not go through. */
function signInMessage(result: Exclude<PostResult, { kind: 'ok' }>): string {
  if (result.kind === 'timeout') return NO_ANSWER;
  if (result.kind === 'offline') return NO_CONNECTION;
  if (result.status === 503) {
    const busy = result.message ?? 'The server is not available right now. Nothing was changed.';
    return result.retryAfterSeconds !== undefined ? `${busy} Try again in ${waitInWords(result.retryAfterSeconds)}.` : busy;
  }
  return result.message ?? `Sign-in failed (the server answered ${result.status}). Try again.`;
}
