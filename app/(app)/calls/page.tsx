import type { Metadata } from 'next';
import Link from 'next/link';
import { CallsTable } from '@/components/calls/calls-table';
import { findCalls, listCallAssignees } from '@/lib/server/calls';
import { pageScope } from '@/lib/server/operation';
import { serviceCallSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Service calls' };
export const dynamic = 'force-dynamic';

export default async function CallsPage() {
  const { user, scope } = await pageScope('calls.list');
  const [calls, assignees] = await Promise.all([findCalls({ scope }), listCallAssignees({ scope })]);
  // The same rows GET /api/calls sends, so the table's later refreshes replace them like for like.
  const rows = serviceCallSchema.array().parse(calls);
  const supervisor = user.role === 'lead' || user.role === 'admin';
  return (
    <div className="space-y-6 pb-24 sm:pb-0">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="page-title">Service calls</h1>
          <p className="text-muted">
            {supervisor
              ? 'Every call of the company.'
              : user.role === 'technician'
                ? 'Your calls, and your apprentices’ calls that may need your sign-off.'
                : 'The calls assigned to you.'}
          </p>
        </div>
        <Link href="/calls/new" className="btn-primary fixed inset-x-4 bottom-4 z-10 shadow-lg sm:static sm:inset-auto sm:shadow-none">
          New call
        </Link>
      </div>
      <CallsTable
        initialCalls={rows}
        technicianChoice={supervisor ? 'everyone' : user.role === 'technician' ? 'mine-or-visible' : 'none'}
        assignees={assignees.map((a) => ({ id: a.id, name: a.name }))}
      />
    </div>
  );
}
