'use client';

import Link from 'next/link';
import { useId, useState } from 'react';
import { FUEL_LABELS, IGNITION_LABELS, formatDate } from '@/components/calls/format';
import { useTimeZone } from '@/components/ui/time-zone';
import { TextInput } from '@/components/ui/field';

export interface UnitsListSite {
  id: string;
  name: string;
  address: string;
  units: {
    id: string;
    label: string;
    ignition: keyof typeof IGNITION_LABELS;
    fuel: keyof typeof FUEL_LABELS;
    transformerVa: number;
    installYear: number | null;
    lastCallAt: string | null;
  }[];
}

/** Units grouped by site, searchable by site, address or unit. */
export function UnitsList({ sites }: { sites: UnitsListSite[] }) {
  const [query, setQuery] = useState('');
  const id = useId();
  const timeZone = useTimeZone();
  const q = query.trim().toLowerCase();
  const shown = sites
    .map((s) => {
      if (!q || `${s.name} ${s.address}`.toLowerCase().includes(q)) return s;
      return { ...s, units: s.units.filter((u) => u.label.toLowerCase().includes(q)) };
    })
    .filter((s) => s.units.length > 0 || (!q && s.units.length === 0));
  const count = shown.reduce((n, s) => n + s.units.length, 0);
  return (
    <div className="space-y-4">
      <div role="search">
        <label htmlFor={id} className="label">
          Search
        </label>
        <TextInput id={id} type="search" placeholder="Site, address or unit" value={query} onChange={(e) => setQuery(e.target.value)} />
      </div>
      <p className="text-sm text-muted" role="status" aria-live="polite">
        {count} {count === 1 ? 'unit' : 'units'}
        {q ? ' match' : ''}
      </p>
      {shown.length === 0 && <p className="card text-muted">No unit matches “{query}”.</p>}
      {shown.map((s) => (
        <section key={s.id} aria-labelledby={`site-${s.id}`} className="card space-y-3">
          <div>
            <h2 id={`site-${s.id}`} className="text-xl font-bold">
              {s.name}
            </h2>
            <p className="text-muted">{s.address}</p>
          </div>
          {s.units.length === 0 ? (
            <p className="text-muted">No units recorded at this site.</p>
          ) : (
            <ul className="space-y-2">
              {s.units.map((u) => (
                <li key={u.id} className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-line bg-surface p-3">
                  <div>
                    <Link
                      href={`/units/${u.id}`}
                      className="inline-flex min-h-touch items-center text-lg font-semibold underline decoration-copper decoration-2 underline-offset-4"
                    >
                      {u.label}
                    </Link>
                    <p className="text-sm text-muted">
                      {IGNITION_LABELS[u.ignition]} · {FUEL_LABELS[u.fuel]} · <span className="font-mono">{u.transformerVa} VA</span>
                      {u.installYear ? ` · installed ${u.installYear}` : ''}
                      {u.lastCallAt ? ` · last call ${formatDate(u.lastCallAt, timeZone)}` : ' · no calls yet'}
                    </p>
                  </div>
                  <Link href={`/calls/new?unitId=${u.id}`} className="btn-secondary">
                    New call<span className="sr-only"> for {u.label}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
      ))}
    </div>
  );
}
