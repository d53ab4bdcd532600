import Link from 'next/link';
import { Time } from '@/components/ui/time-zone';
import type { AttemptRow, ScenarioOutput } from '@/lib/validations/practice';
import { formatDay } from '@/components/calls/format';

interface Props {
  scenarios: readonly ScenarioOutput[];
  attempts: readonly AttemptRow[];
}

/** A trainer's home: their scenarios with how far the apprentices are, and the latest results. */
export function TrainerHome({ scenarios, attempts }: Props) {
  const finished = attempts.filter((a) => a.finishedAt !== null).slice(0, 5);
  const running = attempts.filter((a) => a.finishedAt === null).length;
  return (
    <section aria-labelledby="trainer-home" className="card space-y-4" data-testid="trainer-home">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="trainer-home" className="text-lg font-bold">
          Practice scenarios: <span className="font-mono">{scenarios.length}</span>
        </h2>
        <Link href="/practice#new-scenario" className="btn-primary">
          New scenario
        </Link>
      </div>
      {scenarios.length === 0 ? (
        <p className="text-muted">No scenario yet. Create one, pick a fault and assign it to your apprentices.</p>
      ) : (
        <ul className="space-y-2">
          {scenarios.slice(0, 4).map((s) => (
            <li key={s.id}>
              <Link
                href={`/practice/scenarios/${s.id}`}
                className="flex min-h-touch flex-wrap items-center justify-between gap-2 rounded-lg border border-line bg-surface px-3 py-2 hover:border-copper"
              >
                <span className="font-semibold">{s.title}</span>
                <span className="text-base text-muted">
                  {s.assigned} assigned · {s.finished} finished{s.dueOn ? ` · due ${formatDay(s.dueOn)}` : ''}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      <div>
        <h3 className="font-semibold">
          Latest results
          {running ? (
            <span className="font-normal text-muted">
              {' '}
              · {running} attempt{running === 1 ? '' : 's'} running
            </span>
          ) : null}
        </h3>
        {finished.length === 0 ? (
          <p className="text-muted">No attempt finished yet.</p>
        ) : (
          <ul className="divide-y divide-line">
            {finished.map((a) => (
              <li key={a.id}>
                <Link
                  href={`/practice/attempts/${a.id}`}
                  className="flex min-h-touch flex-wrap items-center justify-between gap-2 py-1 hover:text-copper-strong"
                >
                  <span>
                    <span className="font-semibold">{a.apprenticeName}</span> · {a.scenarioTitle}
                    <span className="block text-sm text-muted">
                      <span aria-hidden>{a.right ? '✓ ' : '✗ '}</span>
                      {a.right ? 'Right finding' : 'Not the fault'} · <Time value={a.finishedAt!} />
                    </span>
                  </span>
                  <span className="font-mono font-semibold">
                    {a.total} / {a.max}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}
