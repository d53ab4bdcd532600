import { Figure } from '@/components/trees/usage/tree-usage';
import type { CompanyTreeUsageOut } from '@/lib/validations/api';

// Across the company: the most common findings of each month, first-time fix (closed calls with no
// new call for the same unit within the window), and the median time from the first step to a finding.

function duration(seconds: number | null): string {
  if (seconds === null) return '—';
  const minutes = Math.round(seconds / 60);
  if (minutes < 60) return `${minutes} min`;
  return `${Math.floor(minutes / 60)} h ${minutes % 60} min`;
}

function monthName(month: string): string {
  const [y, m] = month.split('-').map(Number);
  // A month label, not a moment: built at noon UTC on the 15th so no time zone moves it.
  return new Intl.DateTimeFormat('en', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(y, m - 1, 15, 12)));
}

export function CompanyUsage({ usage }: { usage: CompanyTreeUsageOut }) {
  const fix = usage.firstTimeFix;
  return (
    <div className="space-y-6">
      <dl className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <Figure label="First-time fix" value={fix.rate === null ? '—' : `${Math.round(fix.rate * 100)} %`} />
        <Figure label="Calls closed" value={String(fix.closed)} />
        <Figure label="Median, first step to finding" value={duration(usage.timeToFinding.medianSeconds)} />
      </dl>
      <p className="text-sm text-muted">
        Since the company started: first-time fix counts closed calls with no new call for the same unit within {fix.windowDays} days (
        {fix.returned} came back).
        {fix.windowOpen > 0 &&
          ` ${fix.windowOpen} of the closed calls were closed less than ${fix.windowDays} days ago and may still come back.`}{' '}
        The median counts all {usage.timeToFinding.diagnoses} diagnoses that reached a finding.
      </p>
      <section className="card space-y-3" aria-labelledby="findings-by-month">
        <h2 id="findings-by-month" className="text-lg font-bold">
          Most common findings by month
        </h2>
        {usage.months.length === 0 ? (
          <p className="text-muted">No diagnosis has reached a finding in the last twelve months.</p>
        ) : (
          <div className="grid gap-4 md:grid-cols-2">
            {usage.months.map((m) => (
              <div key={m.month}>
                <h3 className="font-semibold">
                  {monthName(m.month)} <span className="font-normal text-muted">· {m.total} findings</span>
                </h3>
                <ol className="mt-1 list-decimal pl-6">
                  {m.findings.map((f) => (
                    <li key={f.stepId}>
                      {f.title} <span className="tabular-nums text-muted">× {f.count}</span>
                    </li>
                  ))}
                </ol>
              </div>
            ))}
          </div>
        )}
      </section>
    </div>
  );
}
