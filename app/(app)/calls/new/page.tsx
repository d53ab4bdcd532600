import type { Metadata } from 'next';
import { createCallAction, createSiteAction, createUnitAction } from '@/app/(app)/calls/actions';
import { NewCallForm } from '@/components/calls/new-call-form';
import { BackLink } from '@/components/ui/back-link';
import { listCallAssignees, listSitesWithUnits } from '@/lib/server/calls';
import { pageScope } from '@/lib/server/operation';

export const metadata: Metadata = { title: 'New service call' };
export const dynamic = 'force-dynamic';

export default async function NewCallPage({ searchParams }: { searchParams: Promise<{ unitId?: string }> }) {
  const { user, scope } = await pageScope('calls.create');
  const { unitId } = await searchParams;
  const [sites, assignees] = await Promise.all([listSitesWithUnits({ scope }), listCallAssignees({ scope })]);
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <div>
        <BackLink href="/calls">Service calls</BackLink>
        <h1 id="new-call-title" className="page-title">
          New service call
        </h1>
        <p className="text-muted">Pick the site and the unit, or add them, then describe the complaint.</p>
      </div>
      <NewCallForm
        sites={sites.map((s) => ({
          id: s.id,
          name: s.name,
          address: s.address,
          contactEmail: s.contactEmail,
          units: s.units.map((u) => ({
            id: u.id,
            siteId: u.siteId,
            label: u.label,
            ignition: u.ignition,
            fuel: u.fuel,
            controlSupply: u.controlSupply,
            draft: u.draft,
            transformerVa: u.transformerVa,
            installYear: u.installYear,
          })),
        }))}
        assignees={assignees}
        me={{ id: user.id, name: user.name }}
        preselectUnitId={unitId}
        createSite={createSiteAction}
        createUnit={createUnitAction}
        createCall={createCallAction}
      />
    </div>
  );
}
