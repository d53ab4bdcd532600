'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Field, FormMessage, Select, TextInput } from '@/components/ui/field';
import type { ActionResult, AdminUser } from '@/lib/validations/api';
import { ROLE_LABELS, ROLES, type Role } from '@/lib/roles';
import { createUserSchema, type UpdateUserInput } from '@/lib/validations/users';

/** A user as GET /api/users sends it. */
export type AdminUserRow = AdminUser;

type Result<T> = ActionResult<T>;

interface Props {
  users: AdminUserRow[];
  currentUserId: string;
  createUser: (input: unknown) => Promise<Result<unknown>>;
  updateUser: (input: unknown) => Promise<Result<unknown>>;
}

/** A change waiting for the admin's confirmation, with the words the dialog shows. */
interface PendingChange {
  user: AdminUserRow;
  patch: UpdateUserInput;
  title: string;
  description: string;
  confirmLabel: string;
  done: string;
}

export function UsersAdmin({ users, currentUserId, createUser, updateUser }: Props) {
  const router = useRouter();
  const [status, setStatus] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  const [busyId, setBusyId] = useState<string | null>(null);
  const [asking, setAsking] = useState<PendingChange | null>(null);
  const [dialogError, setDialogError] = useState<string | null>(null);

  function confirmChange() {
    if (!asking) return;
    const { user, patch, done } = asking;
    setBusyId(user.id);
    setDialogError(null);
    startTransition(async () => {
      const result = await updateUser({ id: user.id, patch });
      setBusyId(null);
      if (!result.ok) {
        setDialogError(result.message);
        return;
      }
      setAsking(null);
      setStatus({ tone: 'ok', text: done });
      router.refresh();
    });
  }

  function ask(change: PendingChange) {
    setStatus(null);
    setDialogError(null);
    setAsking(change);
  }

  return (
    <div className="space-y-8">
      <FormMessage message={status?.text} tone={status?.tone} className="-mb-8 [&:not(:empty)]:mb-0" />
      <section aria-labelledby="users-heading" className="card relative overflow-x-auto p-0">
        <h2 id="users-heading" className="sr-only">
          People
        </h2>
        <table className="w-full min-w-[40rem] text-left">
          <thead className="border-b border-line text-sm text-muted">
            <tr>
              <th scope="col" className="px-4 py-3">
                Name
              </th>
              <th scope="col" className="px-4 py-3">
                Role
              </th>
              <th scope="col" className="px-4 py-3">
                Status
              </th>
              <th scope="col" className="px-4 py-3">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {users.length === 0 && (
              <tr>
                <td colSpan={4} className="px-4 py-6 text-muted">
                  No users yet. Add the first one below.
                </td>
              </tr>
            )}
            {users.map((user) => {
              const self = user.id === currentUserId;
              const busy = pending && busyId === user.id;
              return (
                <tr key={user.id} className={clsx('border-b border-line last:border-0', !user.active && 'text-muted')}>
                  <td className="px-4 py-2">
                    <div className="font-semibold">
                      {user.name}
                      {self && <span className="ml-2 text-sm font-normal text-muted">(you)</span>}
                    </div>
                    <div className="text-sm text-muted">{user.email}</div>
                  </td>
                  <td className="px-4 py-2">
                    <label className="sr-only" htmlFor={`role-${user.id}`}>
                      Role of {user.name}
                    </label>
                    <Select
                      id={`role-${user.id}`}
                      value={user.role}
                      disabled={self || busy}
                      onChange={(e) => {
                        const role = e.target.value as Role;
                        const label = ROLE_LABELS[role].toLowerCase();
                        ask({
                          user,
                          patch: { role },
                          title: `Make ${user.name} ${/^[aeiou]/.test(label) ? 'an' : 'a'} ${label}?`,
                          description: `${user.name} is signed out on every device at once and signs in again as ${label}, with what that role may do.`,
                          confirmLabel: `Make ${label}`,
                          done: `${user.name} is now ${label}.`,
                        });
                      }}
                      className="min-w-[10rem]"
                    >
                      {ROLES.map((r) => (
                        <option key={r} value={r}>
                          {ROLE_LABELS[r]}
                        </option>
                      ))}
                    </Select>
                  </td>
                  <td className="px-4 py-2">
                    <span className="inline-flex items-center gap-1 font-semibold">
                      <span aria-hidden>{user.active ? '●' : '○'}</span>
                      {user.active ? 'Active' : 'Deactivated'}
                    </span>
                  </td>
                  <td className="px-4 py-2">
                    <div className="flex flex-wrap justify-end gap-2">
                      {!self && (
                        <button
                          type="button"
                          className="btn-secondary text-sm"
                          disabled={busy}
                          onClick={() =>
                            ask(
                              user.active
                                ? {
                                    user,
                                    patch: { active: false },
                                    title: `Deactivate ${user.name}?`,
                                    description: `${user.name} is signed out on every device and can no longer sign in. Their calls and diagnoses stay on record. You can reactivate them later.`,
                                    confirmLabel: 'Deactivate',
                                    done: `${user.name} is deactivated and signed out.`,
                                  }
                                : {
                                    user,
                                    patch: { active: true },
                                    title: `Reactivate ${user.name}?`,
                                    description: `${user.name} can sign in again with their password, as ${ROLE_LABELS[user.role].toLowerCase()}.`,
                                    confirmLabel: 'Reactivate',
                                    done: `${user.name} is active again.`,
                                  },
                            )
                          }
                        >
                          {user.active ? 'Deactivate' : 'Reactivate'}
                          <span className="sr-only"> {user.name}</span>
                        </button>
                      )}
                      {user.active && (
                        <button
                          type="button"
                          className="btn-quiet text-sm"
                          disabled={busy}
                          onClick={() =>
                            ask({
                              user,
                              patch: { revokeSessions: true },
                              title: `Sign ${user.name} out everywhere?`,
                              description: `${user.name} is signed out on every device and signs in again with their password. Answers still waiting to be saved on a tablet stay on it until then.`,
                              confirmLabel: 'Sign out everywhere',
                              done: `${user.name} is signed out everywhere.`,
                            })
                          }
                        >
                          Sign out everywhere<span className="sr-only"> for {user.name}</span>
                        </button>
                      )}
                    </div>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </section>
      <ConfirmDialog
        open={asking !== null}
        title={asking?.title ?? ''}
        description={<p>{asking?.description}</p>}
        confirmLabel={asking?.confirmLabel ?? 'Confirm'}
        busy={pending}
        busyLabel="Saving…"
        error={dialogError}
        onConfirm={confirmChange}
        onCancel={() => setAsking(null)}
      />
      <CreateUserForm
        onCreate={async (values) => {
          const result = await createUser(values);
          if (result.ok) {
            setStatus({ tone: 'ok', text: `${values.name} was added.` });
            router.refresh();
          }
          return result;
        }}
      />
    </div>
  );
}

type CreateInput = z.input<typeof createUserSchema>;
type CreateOutput = z.output<typeof createUserSchema>;

function CreateUserForm({ onCreate }: { onCreate: (values: CreateOutput) => Promise<Result<unknown>> }) {
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState, reset, setError } = useForm<CreateInput, unknown, CreateOutput>({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: '', name: '', role: 'technician', password: '' },
  });

  async function onSubmit(values: CreateOutput) {
    setMessage(null);
    const result = await onCreate(values);
    if (result.ok) {
      reset();
      return;
    }
    setMessage(result.message);
    for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) {
      if (field in values) setError(field as keyof CreateInput, { message: messages[0] });
    }
  }

  return (
    <section aria-labelledby="add-user" className="card max-w-2xl">
      <h2 id="add-user" className="mb-4 text-xl font-bold">
        Add a user
      </h2>
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="grid gap-4 sm:grid-cols-2">
        <div className="sm:col-span-2">
          <FormMessage message={message} />
        </div>
        <Field label="Name" error={formState.errors.name?.message}>
          {(a11y) => <TextInput {...a11y} autoComplete="off" {...register('name')} />}
        </Field>
        <Field label="E-mail" error={formState.errors.email?.message}>
          {(a11y) => <TextInput {...a11y} type="email" autoComplete="off" {...register('email')} />}
        </Field>
        <Field label="Role" error={formState.errors.role?.message}>
          {(a11y) => (
            <Select {...a11y} {...register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Starting password" error={formState.errors.password?.message} hint="At least 12 characters. Share it in person.">
          {(a11y) => <TextInput {...a11y} type="password" autoComplete="new-password" {...register('password')} />}
        </Field>
        <div className="sm:col-span-2">
          <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
            {formState.isSubmitting ? 'Adding…' : 'Add user'}
          </button>
        </div>
      </form>
    </section>
  );
}
