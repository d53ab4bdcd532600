import type { Metadata } from 'next';
import { UnitsList } from '@/components/units/units-list';
import { listUnitsBySite } from '@/lib/server/calls';
import { requirePageUser } from '@/lib/server/guard';
import { viewerOf } from '@/lib/server/viewer';

export const metadata: Metadata = { title: 'Units' };
export const dynamic = 'force-dynamic';

// Units carry every call's readings, so they open to those who see every call or sign off others'.
const UNIT_ROLES = ['technician', 'lead', 'admin'] as const;

export default async function UnitsPage() {
  const user = await requirePageUser({ roles: UNIT_ROLES });
  const sites = await listUnitsBySite({ viewer: viewerOf(user) });
  return (
    <div className="space-y-6">
      <div>
        <h1 className="page-title">Units</h1>
        <p className="text-muted">Every furnace your company services, by site, with its history.</p>
      </div>
      <UnitsList
        sites={sites.map((s) => ({
          id: s.id,
          name: s.name,
          address: s.address,
          units: s.units.map((u) => ({
            id: u.id,
            label: u.label,
            ignition: u.ignition,
            fuel: u.fuel,
            transformerVa: u.transformerVa,
            installYear: u.installYear,
            lastCallAt: u.lastCallAt?.toISOString() ?? null,
          })),
        }))}
      />
    </div>
  );
}
