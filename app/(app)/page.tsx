import type { Metadata } from 'next';
import Link from 'next/link';
import { CallStatusBadge } from '@/components/calls/call-status';
import { Time } from '@/components/ui/time-zone';
import { FormMessage } from '@/components/ui/field';
import { ApprenticeHome } from '@/components/practice/apprentice-home';
import { TrainerHome } from '@/components/practice/trainer-home';
import { ReviewQueue } from '@/components/trees/review-queue';
import { apprenticeHomeData, trainerHomeData } from '@/lib/server/practice';
import { may } from '@/lib/policy';
import { ROLE_LABELS, type Role } from '@/lib/roles';
import { listEscalations } from '@/db/diagnoses';
import { findCalls } from '@/lib/server/calls';
import { requirePageUser, type CurrentUser } from '@/lib/server/guard';
import { authorize } from '@/lib/server/operation';
import { listReviewsWaiting } from '@/lib/server/trees';

export const metadata: Metadata = { title: 'Home' };

interface Tile {
  href: string;
  title: string;
  text: string;
}

// What each role does first.
const TILES: Record<Role, Tile[]> = {
  apprentice: [
    {
      href: '/calls',
      title: 'My service calls',
      text: 'Open the calls assigned to you and follow the guided diagnosis at the unit. A technician signs off your finding.',
    },
    {
      href: '/practice',
      title: 'Practice',
      text: 'The practice scenarios your trainer assigns, run on a simulated furnace and scored.',
    },
  ],
  technician: [
    {
      href: '/calls',
      title: 'My service calls',
      text: 'Start a call, run the guided diagnosis, record the repair and its verification, and close it.',
    },
    { href: '/units', title: 'Units', text: 'Every furnace your company services, with its readings over the years.' },
  ],
  lead: [
    { href: '/calls', title: 'All service calls', text: 'Every call of the company, with where each diagnosis went.' },
    {
      href: '/trees',
      title: 'Fault trees',
      text: 'Edit drafts, review another lead’s changes, publish new versions, and see where diagnoses go wrong.',
    },
  ],
  trainer: [
    {
      href: '/practice',
      title: 'Practice scenarios',
      text: 'Assign bench faults to apprentices and review their attempts and scores.',
    },
  ],
  admin: [
    { href: '/admin/users', title: 'Users', text: 'Add people, change roles, deactivate accounts and end their sessions.' },
    { href: '/admin/company', title: 'Company settings', text: 'Company name, office e-mail and the display units your technicians see.' },
    { href: '/calls', title: 'All service calls', text: 'Every call of the company.' },
  ],
};

export default async function HomePage({ searchParams }: { searchParams: Promise<{ refused?: string }> }) {
  const user = await requirePageUser();
  const { refused } = await searchParams;
  return (
    <div className="space-y-6">
      {refused && <FormMessage message="That page is not open to your role, so you were brought home." />}
      <div>
        <p className="text-sm font-semibold uppercase tracking-wide text-copper-strong">{ROLE_LABELS[user.role]}</p>
        <h1 className="page-title">Good to see you, {user.name.split(' ')[0]}</h1>
        <p className="text-muted">{user.companyName}</p>
      </div>
      {may(user.role, 'diagnoses.escalations') && <Escalations />}
      {may(user.role, 'trees.authoring') && (
        <ReviewQueue reviews={await listReviewsWaiting({ scope: (await authorize('trees.authoring')).scope })} />
      )}
      {may(user.role, 'calls.list') && <OpenCalls user={user} />}
      {user.role === 'trainer' && <TrainerHome {...await trainerHomeData()} />}
      {user.role === 'apprentice' && <ApprenticeHome {...await apprenticeHomeData()} />}
      <ul className="grid gap-4 sm:grid-cols-2">
        {TILES[user.role].map((tile) => (
          <li key={tile.href + tile.title}>
            <Link href={tile.href} className="card flex h-full min-h-[8rem] flex-col gap-2 hover:border-copper">
              <span className="text-lg font-bold">{tile.title}</span>
              <span className="text-muted">{tile.text}</span>
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The calls still to work: one's own for the field, the whole company's count for leads and admins. */
async function OpenCalls({ user }: { user: CurrentUser }) {
  const { scope } = await authorize('calls.list');
  const supervisor = scope.reach === 'company';
  const calls = (await findCalls({ scope, technician: supervisor ? undefined : 'me' })).filter(
    (c) => c.status !== 'closed' && c.status !== 'referred',
  );
  const unassigned = calls.filter((c) => !c.technicianId).length;
  const shown = calls.slice(0, 3);
  return (
    <section aria-labelledby="open-calls" className="card space-y-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="open-calls" className="text-lg font-bold">
          {supervisor ? 'Open calls in the company' : 'My open calls'}: <span className="font-mono">{calls.length}</span>
        </h2>
        {supervisor && unassigned > 0 && <p className="text-muted">{unassigned} not assigned yet</p>}
      </div>
      {shown.length === 0 ? (
        <p className="text-muted">Nothing open. {user.role === 'apprentice' ? '' : 'Start a call from the Service calls page.'}</p>
      ) : (
        <ul className="space-y-2">
          {shown.map((c) => (
            <li key={c.id}>
              <Link
                href={`/calls/${c.id}`}
                className="flex min-h-touch flex-wrap items-center justify-between gap-2 rounded-lg border border-line bg-surface px-3 py-2 hover:border-copper"
              >
                <span>
                  <span className="font-semibold">{c.siteName}</span> · {c.unitLabel}
                  <span className="block text-sm text-muted">
                    Opened <Time value={c.openedAt} kind="date" />
                    {supervisor ? ` · ${c.technicianName ?? 'unassigned'}` : ''}
                  </span>
                </span>
                <CallStatusBadge status={c.status} />
              </Link>
            </li>
          ))}
        </ul>
      )}
      {calls.length > shown.length && (
        <Link href="/calls" className="inline-flex min-h-touch items-center font-semibold underline underline-offset-4">
          All {calls.length} open calls
        </Link>
      )}
    </section>
  );
}

/** Diagnoses the field handed on ("none of these fits"), on calls not closed yet: for leads and admins. */
async function Escalations() {
  const { scope } = await authorize('diagnoses.escalations');
  const escalations = await listEscalations({ companyId: scope.companyId, limit: 5 });
  return (
    <section aria-labelledby="escalations" className="card space-y-3" data-testid="escalations">
      <h2 id="escalations" className="text-lg font-bold">
        Sent to the leads: <span className="font-mono">{escalations.length}</span>
      </h2>
      {escalations.length === 0 ? (
        <p className="text-muted">No diagnosis is waiting for a lead.</p>
      ) : (
        <ul className="space-y-2">
          {escalations.map((e) => (
            <li key={e.diagnosisId}>
              <Link
                href={`/calls/${e.callId}`}
                className="flex min-h-touch flex-col gap-1 rounded-lg border border-line bg-surface px-3 py-2 hover:border-copper"
              >
                <span>
                  <span className="font-semibold">{e.site}</span> · {e.unit}
                </span>
                <span className="text-base">“{e.note}”</span>
                <span className="text-base text-muted">
                  {e.by ?? 'Someone'}, <Time value={e.at} />
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
