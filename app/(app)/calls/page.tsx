import type { Metadata } from 'next';
import Link from 'next/link';
import { CallsTable } from '@/components/calls/calls-table';
import { FIELD_ROLES } from '@/lib/roles';
import { findCalls, listCallAssignees } from '@/lib/server/calls';
import { requirePageUser } from '@/lib/server/guard';
import { viewerOf } from '@/lib/server/viewer';
import type { CallRow } from '@/lib/swr/use-calls';

export const metadata: Metadata = { title: 'Service calls' };
export const dynamic = 'force-dynamic';

export default async function CallsPage() {
  const user = await requirePageUser({ roles: FIELD_ROLES });
  const viewer = viewerOf(user);
  const [calls, assignees] = await Promise.all([findCalls({ viewer }), listCallAssignees({ viewer })]);
  const rows: CallRow[] = calls.map((c) => ({
    id: c.id,
    unitId: c.unitId,
    unitLabel: c.unitLabel,
    siteId: c.siteId,
    siteName: c.siteName,
    siteAddress: c.siteAddress,
    complaint: c.complaint,
    status: c.status,
    technicianId: c.technicianId,
    technicianName: c.technicianName,
    technicianRole: c.technicianRole,
    openedAt: c.openedAt.toISOString(),
    closedAt: c.closedAt?.toISOString() ?? null,
  }));
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
