import { VERDICT_WORDS } from '@/components/calls/format';
import { Time } from '@/components/ui/time-zone';

export interface ReadingRow {
  id: string;
  stepTitle: string;
  points: [string, string] | null;
  text: string | null;
  /** null for an over-range reading ("OL"). */
  value: number | null;
  unit: string | null;
  band: string | null;
  verdict: string | null;
  at: Date | string;
}

export function Verdict({ verdict, band }: { verdict: string | null; band: string | null }) {
  const v = verdict ? VERDICT_WORDS[verdict] : null;
  return (
    <span className="inline-flex flex-wrap items-center gap-x-1.5">
      {v && (
        <span className="inline-flex items-center gap-1 font-semibold">
          <span aria-hidden className="font-mono">
            {v.icon}
          </span>
          {v.word}
        </span>
      )}
      {band && <span className="text-muted">{v ? `— ${band}` : band}</span>}
    </span>
  );
}

/** The value as typed, and the stored canonical value when the technician typed another unit. */
function Value({ r }: { r: ReadingRow }) {
  if (r.value === null) return <span className="font-mono">OL (open circuit)</span>;
  const typed = r.text ?? String(r.value);
  const hasUnit = /[a-zµΩ"]/i.test(typed);
  return (
    <span className="font-mono">
      {typed}
      {!hasUnit && r.unit ? ` ${r.unit}` : ''}
    </span>
  );
}

/** Readings of a call: a table on wide screens, a list of cards on a phone. */
export function ReadingsTable({ readings, caption = 'Readings' }: { readings: ReadingRow[]; caption?: string }) {
  if (readings.length === 0) return <p className="text-muted">No readings yet: they appear here as the diagnosis takes them.</p>;
  return (
    <>
      <table className="hidden w-full table-fixed text-left sm:table print:table">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-line text-sm text-muted">
          <tr>
            <th scope="col" className="w-[38%] py-2 pr-3">
              Step and test points
            </th>
            <th scope="col" className="w-[7.5rem] py-2 pr-3">
              Value
            </th>
            <th scope="col" className="py-2 pr-3">
              Band
            </th>
            <th scope="col" className="w-[8.5rem] py-2">
              Time
            </th>
          </tr>
        </thead>
        <tbody>
          {readings.map((r) => (
            <tr key={r.id} className="border-b border-line align-top last:border-0">
              <td className="break-words py-2 pr-3">
                <span className="font-semibold">{r.stepTitle}</span>
                {r.points && (
                  <span className="block font-mono text-sm text-muted">
                    {r.points[0]} ↔ {r.points[1]}
                  </span>
                )}
              </td>
              <td className="whitespace-nowrap py-2 pr-3">
                <Value r={r} />
              </td>
              <td className="py-2 pr-3">
                <Verdict verdict={r.verdict} band={r.band} />
              </td>
              <td className="py-2 text-sm">
                <Time value={r.at} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <ul className="space-y-2 sm:hidden print:hidden" aria-label={caption}>
        {readings.map((r) => (
          <li key={r.id} className="rounded-lg border border-line bg-surface p-3">
            <p className="font-semibold">{r.stepTitle}</p>
            {r.points && (
              <p className="font-mono text-sm text-muted">
                {r.points[0]} ↔ {r.points[1]}
              </p>
            )}
            <p className="mt-1 flex flex-wrap items-baseline justify-between gap-2">
              <span className="text-lg">
                <Value r={r} />
              </span>
              <Verdict verdict={r.verdict} band={r.band} />
            </p>
            <p className="text-sm text-muted">
              <Time value={r.at} />
            </p>
          </li>
        ))}
      </ul>
    </>
  );
}
