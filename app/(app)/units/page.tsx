import type { Metadata } from 'next';
import { UnitsList } from '@/components/units/units-list';
import { listUnitsBySite } from '@/lib/server/calls';
import { pageScope } from '@/lib/server/operation';

export const metadata: Metadata = { title: 'Units' };
export const dynamic = 'force-dynamic';

export default async function UnitsPage() {
  // A unit carries every call's readings: the list opens to those who may open a unit's history.
  const { scope } = await pageScope('units.get');
  const sites = await listUnitsBySite({ scope });
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
