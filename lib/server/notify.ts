import 'server-only';
import { listDisabledNotifications, listNotifiable, saveNotificationSettings } from '@/db/outbox';
import { getUser } from '@/db/users';
import type { Scope } from '@/lib/policy';
import { queueMail } from '@/lib/server/outbox-worker';
import { NOTIFICATION_KINDS, type NotificationKind } from '@/lib/validations/mail';

// Short e-mail notifications to the person who must act, through the same outbox as the report:
// one message per recipient (each has their own settings), once per event and recipient (the
// idempotency key), never to the person who caused it. A notification is a courtesy: it never
// fails the action that raised it.

/** `who` may be given; otherwise the actor's name is looked up. */
export type NotifyEvent = { who?: string } & (
  | { kind: 'sign-off'; companyId: string; actorId: string; callId: string; diagnosisId: string; findingTitle: string }
  | { kind: 'escalation'; companyId: string; actorId: string; callId: string; diagnosisId: string; note: string }
  | { kind: 'tree-review'; companyId: string; actorId: string; versionId: string; treeTitle: string; version: number }
  | {
      kind: 'scenario';
      companyId: string;
      actorId: string;
      assignmentId: string;
      apprenticeId: string;
      scenarioTitle: string;
    }
);

function link(path: string): string {
  const base = process.env.APP_URL?.replace(/\/$/, '') ?? '';
  return base ? `${base}${path}` : path;
}

function compose(event: NotifyEvent & { who: string }): {
  subject: string;
  lines: string[];
  ref: string;
  roles?: string[];
  userIds?: string[];
} {
  switch (event.kind) {
    case 'sign-off':
      return {
        ref: event.diagnosisId,
        roles: ['technician'],
        subject: `Sign-off needed: ${event.findingTitle}`,
        lines: [
          `${event.who} reached a finding that needs a technician's sign-off before the call can be closed:`,
          `  ${event.findingTitle}`,
          '',
          `Review it: ${link(`/calls/${event.callId}`)}`,
        ],
      };
    case 'escalation':
      return {
        ref: event.diagnosisId,
        roles: ['lead'],
        subject: 'A diagnosis was escalated to the leads',
        lines: [
          `${event.who} found that no step fits and handed the diagnosis on:`,
          `  “${event.note}”`,
          '',
          `Open the call: ${link(`/calls/${event.callId}`)}`,
        ],
      };
    case 'tree-review':
      return {
        ref: event.versionId,
        roles: ['lead'],
        subject: `Review requested: ${event.treeTitle}, version ${event.version}`,
        lines: [`${event.who} asked for a review of ${event.treeTitle}, version ${event.version}.`, '', `Review it: ${link('/trees')}`],
      };
    case 'scenario':
      return {
        ref: event.assignmentId,
        userIds: [event.apprenticeId],
        subject: `Practice scenario assigned: ${event.scenarioTitle}`,
        lines: [
          `${event.who} assigned you a practice scenario on the bench: ${event.scenarioTitle}.`,
          '',
          `Start it: ${link('/practice')}`,
        ],
      };
  }
}

const FOOTER = ['', '—', 'Proving Ground. You can turn this kind of e-mail off in your settings:', link('/settings')];

/** Queues the event's notification for everyone who should act on it; answers how many were queued. */
export async function notify(event: NotifyEvent): Promise<number> {
  try {
    const actor = await getUser({ companyId: event.companyId, id: event.actorId });
    if (event.kind === 'sign-off' && actor.role !== 'apprentice') return 0;
    const { subject, lines, ref, roles, userIds } = compose({ ...event, who: event.who ?? actor.name });
    const people = await listNotifiable({ companyId: event.companyId, kind: event.kind, roles, userIds, except: event.actorId });
    let queued = 0;
    for (const person of people) {
      const { created } = await queueMail({
        companyId: event.companyId,
        callId: 'callId' in event ? event.callId : null,
        kind: event.kind,
        idempotencyKey: `${event.kind}:${ref}:${person.id}`,
        recipients: [person.email],
        subject,
        body: [`Hello ${person.name},`, '', ...lines, ...FOOTER].join('\n'),
        createdBy: event.actorId,
      });
      if (created) queued++;
    }
    return queued;
  } catch (error) {
    console.error(`notify(${event.kind}) failed; the action it follows is not affected`, error);
    return 0;
  }
}

// ── Each user's settings ────────────────────────────────────────────────────────────────────────

export async function getNotificationSettings({ scope }: { scope: Scope }) {
  const [off, user] = await Promise.all([
    listDisabledNotifications({ companyId: scope.companyId, userId: scope.userId }),
    getUser({ companyId: scope.companyId, id: scope.userId }),
  ]);
  return { settings: NOTIFICATION_KINDS.map((kind) => ({ kind, enabled: !off.includes(kind) })), email: user.email };
}

export async function updateNotificationSettings({ scope, input }: { scope: Scope; input: Partial<Record<NotificationKind, boolean>> }) {
  const settings = Object.fromEntries(Object.entries(input).filter(([, v]) => typeof v === 'boolean')) as Record<string, boolean>;
  await saveNotificationSettings({ companyId: scope.companyId, userId: scope.userId, settings });
  return getNotificationSettings({ scope });
}
