import Link from 'next/link';
import { FUEL_LABELS, IGNITION_LABELS, SUPPLY_LABELS } from '@/components/calls/format';

export interface UnitCardData {
  id: string;
  label: string;
  siteName: string;
  siteAddress: string;
  ignition: keyof typeof IGNITION_LABELS;
  fuel: keyof typeof FUEL_LABELS;
  controlSupply: keyof typeof SUPPLY_LABELS;
  /** Optional for records read before units had it. */
  draft?: 'induced' | 'natural';
  transformerVa: number;
  installYear: number | null;
}

/** The unit's attributes, as a technician checks them before the first reading. */
export function UnitCard({ unit, linkToUnit, heading = 'Unit' }: { unit: UnitCardData; linkToUnit: boolean; heading?: string }) {
  const rows: [string, React.ReactNode][] = [
    ['Site', unit.siteName],
    ['Address', unit.siteAddress],
    ['Ignition', IGNITION_LABELS[unit.ignition]],
    ['Fuel', FUEL_LABELS[unit.fuel]],
    ['Control supply', SUPPLY_LABELS[unit.controlSupply]],
    ['Draft', unit.draft === 'natural' ? 'Natural draft' : 'Induced draft (inducer, pressure switch)'],
    [
      'Transformer',
      <span key="va" className="font-mono">
        {unit.transformerVa} VA
      </span>,
    ],
    ['Installed', unit.installYear ?? '—'],
  ];
  return (
    <section aria-labelledby="unit-card-heading" className="card space-y-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="unit-card-heading" className="text-xl font-bold">
          {heading}: {unit.label}
        </h2>
        {linkToUnit && (
          <Link href={`/units/${unit.id}`} className="btn-quiet -my-2 underline underline-offset-4">
            Unit history<span className="sr-only"> of {unit.label}</span>
          </Link>
        )}
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr_auto_1fr]">
        {rows.map(([term, value]) => (
          <div key={term} className="contents">
            <dt className="text-muted">{term}</dt>
            <dd className="font-semibold">{value}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
