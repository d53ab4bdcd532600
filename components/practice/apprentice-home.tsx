import Link from 'next/link';
import type { AssignmentOutput } from '@/lib/validations/practice';
import { formatDay } from '@/components/calls/format';

/** An apprentice's home: their practice assignments, due dates first, with the last score of each. */
export function ApprenticeHome({ assignments }: { assignments: readonly Omit<AssignmentOutput, 'apprentice'>[] }) {
  return (
    <section aria-labelledby="apprentice-home" className="card space-y-3" data-testid="apprentice-home">
      <h2 id="apprentice-home" className="text-lg font-bold">
        Practice assignments: <span className="font-mono">{assignments.length}</span>
      </h2>
      {assignments.length === 0 ? (
        <p className="text-muted">Nothing assigned. Your trainer’s scenarios will show here with their due dates.</p>
      ) : (
        <ul className="space-y-2">
          {assignments.slice(0, 5).map((a) => (
            <li key={a.id}>
              <Link
                href="/practice"
                className="flex min-h-touch flex-wrap items-center justify-between gap-2 rounded-lg border border-line bg-surface px-3 py-2 hover:border-copper"
              >
                <span>
                  <span className="font-semibold">{a.title}</span>
                  <span className="block text-sm text-muted">
                    {a.dueOn ? `Due ${formatDay(a.dueOn)}` : 'No due date'}
                    {a.openAttemptId ? ' · attempt under way' : ''}
                  </span>
                </span>
                <span className="font-mono font-semibold">{a.lastScore ? `${a.lastScore.total} / ${a.lastScore.max}` : 'not tried'}</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
