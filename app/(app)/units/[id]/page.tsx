import type { Metadata } from 'next';
import Link from 'next/link';
import { CallStatusBadge } from '@/components/calls/call-status';
import { formatDate } from '@/components/calls/format';
import { ReadingsTable } from '@/components/calls/readings-table';
import { UnitCard } from '@/components/calls/unit-card';
import { BackLink } from '@/components/ui/back-link';
import { FlameSignalChart } from '@/components/units/flame-signal-chart';
import { UnitFactsForm } from '@/components/units/unit-facts-form';
import { may } from '@/lib/policy';
import { correctUnitAction } from '../actions';
import { getUnitPage } from '@/lib/server/calls';
import { companyTimeZone } from '@/lib/server/company';
import { orNotFound, pageScope } from '@/lib/server/operation';

export const metadata: Metadata = { title: 'Unit' };
export const dynamic = 'force-dynamic';

export default async function UnitPage({ params }: { params: Promise<{ id: string }> }) {
  const { scope, user } = await pageScope('units.get');
  const { id } = await params;
  const page = await orNotFound(getUnitPage({ scope, id }));
  const { unit, site, visits, readings, flame } = page;
  const timeZone = await companyTimeZone(scope.companyId);
  return (
    <div className="space-y-6 pb-8">
      <div className="space-y-2">
        <BackLink href="/units">Units</BackLink>
        <div className="flex flex-wrap items-end justify-between gap-3">
          <div>
            <h1 className="page-title">{unit.label}</h1>
            <p className="text-muted">
              {site.name} · {site.address}
            </p>
          </div>
          <Link href={`/calls/new?unitId=${unit.id}`} className="btn-primary">
            New call for this unit
          </Link>
        </div>
      </div>

      <UnitCard unit={unit} linkToUnit={false} heading="Attributes" />
      {may(user.role, 'units.correct') && (
        <UnitFactsForm
          unitId={unit.id}
          facts={{ ignition: unit.ignition, fuel: unit.fuel, controlSupply: unit.controlSupply, draft: unit.draft }}
          correct={correctUnitAction}
        />
      )}

      <section aria-labelledby="flame-heading" className="card space-y-3">
        <h2 id="flame-heading" className="text-xl font-bold">
          Flame signal across visits
        </h2>
        <FlameSignalChart
          diagnosis={flame.diagnosis.map((p) => ({ at: p.at.toISOString(), value: p.value }))}
          afterRepair={flame.afterRepair.map((p) => ({ at: new Date(p.at).toISOString(), value: p.value }))}
          bands={flame.bands}
        />
      </section>

      <section aria-labelledby="visits-heading" className="card space-y-3">
        <h2 id="visits-heading" className="text-xl font-bold">
          Visits
        </h2>
        {visits.length === 0 ? (
          <p className="text-muted">No calls on this unit yet.</p>
        ) : (
          <ol className="space-y-2">
            {visits.map((v) => (
              <li key={v.id} className="rounded-lg border border-line bg-surface p-3">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <div className="min-w-0 flex-1">
                    <p className="text-sm text-muted">
                      {formatDate(v.openedAt, timeZone)} · {v.technicianName ?? 'Unassigned'}
                    </p>
                    <Link
                      href={`/calls/${v.id}`}
                      className="inline-flex min-h-touch items-center font-semibold underline decoration-copper decoration-2 underline-offset-4"
                    >
                      {v.complaint}
                    </Link>
                    <p className="mt-1">
                      <span className="text-muted">Finding: </span>
                      {v.findings.length ? v.findings.join('; ') : <span className="text-muted">none recorded</span>}
                      {v.flameAfterRepair !== null && (
                        <span className="text-muted">
                          {' '}
                          · after repair <span className="font-mono text-ink">{v.flameAfterRepair} µA</span>
                        </span>
                      )}
                    </p>
                  </div>
                  <CallStatusBadge status={v.status} />
                </div>
              </li>
            ))}
          </ol>
        )}
      </section>

      <section aria-labelledby="unit-readings-heading" className="card space-y-3">
        <h2 id="unit-readings-heading" className="text-xl font-bold">
          Readings
        </h2>
        {readings.length === 0 && <p className="text-muted">No readings on this unit yet.</p>}
        {visits
          .filter((v) => readings.some((r) => r.callId === v.id))
          .map((v, i) => {
            const ofVisit = readings.filter((r) => r.callId === v.id).reverse();
            return (
              <details key={v.id} open={i === 0} className="rounded-lg border border-line">
                <summary className="min-h-touch cursor-pointer content-center px-3 font-semibold">
                  {formatDate(v.openedAt, timeZone)} · {ofVisit.length} {ofVisit.length === 1 ? 'reading' : 'readings'}
                  <span className="font-normal text-muted"> · {v.findings.join('; ') || 'no finding'}</span>
                </summary>
                <div className="border-t border-line p-3">
                  <ReadingsTable
                    caption={`Readings of the visit on ${formatDate(v.openedAt, timeZone)}`}
                    readings={ofVisit.map((r) => ({
                      id: r.answerId,
                      stepTitle: r.stepTitle ?? r.stepId,
                      points: null,
                      text: r.text,
                      value: r.value,
                      unit: r.unit,
                      band: r.bandLabel,
                      verdict: r.verdict,
                      at: r.takenAt,
                    }))}
                  />
                </div>
              </details>
            );
          })}
      </section>
    </div>
  );
}
