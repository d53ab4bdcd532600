'use client';

import { useState, useTransition } from 'react';
import { FormMessage } from '@/components/ui/field';
import type { ActionResult } from '@/lib/validations/api';
import { NOTIFICATION_LABELS, type NotificationKind } from '@/lib/validations/mail';

interface Settings {
  settings: { kind: NotificationKind; enabled: boolean }[];
  email: string;
}

/** One switch per kind of e-mail notification; each change is saved at once. */
export function NotificationSettingsForm({
  initial,
  save,
}: {
  initial: Settings;
  save: (input: unknown) => Promise<ActionResult<Settings>>;
}) {
  const [settings, setSettings] = useState(initial.settings);
  const [message, setMessage] = useState<{ text: string; tone: 'ok' | 'error' } | null>(null);
  const [pending, startTransition] = useTransition();

  function toggle(kind: NotificationKind, enabled: boolean) {
    const before = settings;
    setSettings(settings.map((s) => (s.kind === kind ? { ...s, enabled } : s)));
    startTransition(async () => {
      const result = await save({ [kind]: enabled });
      if (result.ok) {
        setSettings(result.data.settings);
        setMessage({ text: `Saved: ${NOTIFICATION_LABELS[kind].title.toLowerCase()} ${enabled ? 'on' : 'off'}.`, tone: 'ok' });
      } else {
        setSettings(before);
        setMessage({ text: `${result.message} Nothing was changed.`, tone: 'error' });
      }
    });
  }

  return (
    <section aria-labelledby="notifications-heading" className="card space-y-4">
      <div>
        <h2 id="notifications-heading" className="text-xl font-bold">
          E-mail notifications
        </h2>
        <p className="text-muted">
          Sent to <span className="font-semibold">{initial.email}</span> when something waits for you. Turn off what you do not want.
        </p>
      </div>
      <ul className="space-y-2">
        {settings.map((s) => (
          <li key={s.kind}>
            <label className="flex min-h-touch cursor-pointer items-start gap-3 rounded-lg border border-line p-3">
              <input
                type="checkbox"
                className="mt-1 h-6 w-6 shrink-0 accent-copper"
                checked={s.enabled}
                disabled={pending}
                onChange={(e) => toggle(s.kind, e.target.checked)}
              />
              <span>
                <span className="block font-semibold">{NOTIFICATION_LABELS[s.kind].title}</span>
                <span className="block text-sm text-muted">{NOTIFICATION_LABELS[s.kind].detail}</span>
              </span>
            </label>
          </li>
        ))}
      </ul>
      <FormMessage message={message?.text} tone={message?.tone ?? 'ok'} />
    </section>
  );
}
