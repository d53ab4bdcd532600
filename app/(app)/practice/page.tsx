import type { Metadata } from 'next';
import Link from 'next/link';
import { FreeBenchForm } from '@/components/practice/free-bench-form';
import { ResultsTable } from '@/components/practice/results-table';
import { ScenarioForm } from '@/components/practice/scenario-form';
import { StartAttemptButton } from '@/components/practice/start-attempt-button';
import { unitText } from '@/components/practice/format';
import { pageScope } from '@/lib/server/operation';
import { myAssignments, practiceOverview } from '@/lib/server/practice';
import { requirePageUser } from '@/lib/server/guard';
import { assignmentSchema, practiceOverviewSchema } from '@/lib/validations/practice';
import { createScenarioAction, startAttemptAction } from './actions';
import { formatDay } from '@/components/calls/format';

export const metadata: Metadata = { title: 'Practice' };
export const dynamic = 'force-dynamic';

export default async function PracticePage() {
  const user = await requirePageUser({ page: '/practice' });
  if (user.role === 'apprentice') return <ApprenticePractice />;
  // Trainers make scenarios; leads and admins read the same results and prove a tree on a bench of their own.
  return <TrainerPractice trainer={user.role === 'trainer'} />;
}

async function ApprenticePractice() {
  const { scope } = await pageScope('practice.assignments.list');
  const assignments = assignmentSchema
    .omit({ apprentice: true })
    .array()
    .parse(await myAssignments({ scope }));
  return (
    <div className="space-y-6">
      <div>
        <h1 className="page-title">Practice</h1>
        <p className="text-muted">
          Each scenario is a simulated furnace with one fault. Measure on its schematic, isolate the fault, report the finding: the score
          counts the right finding, the readings beyond the shortest path, the safety actions and the time.
        </p>
      </div>
      {assignments.length === 0 ? (
        <p className="card text-muted">Nothing assigned yet. Your trainer’s scenarios will show here.</p>
      ) : (
        <ul className="space-y-3" data-testid="assignments">
          {assignments.map((a) => (
            <li key={a.id} className="card space-y-2">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <h2 className="text-lg font-bold">{a.title}</h2>
                <span className="text-base">{a.dueOn ? `Due ${formatDay(a.dueOn)}` : 'No due date'}</span>
              </div>
              <p className="text-base text-muted">{unitText(a.unit)}</p>
              {a.notes && <p className="whitespace-pre-line text-base">{a.notes}</p>}
              <p className="text-base">
                {a.lastScore ? (
                  <>
                    Last score <span className="font-mono font-semibold">{`${a.lastScore.total} / ${a.lastScore.max}`}</span> ·{' '}
                  </>
                ) : null}
                {a.attempts} attempt{a.attempts === 1 ? '' : 's'}
              </p>
              <StartAttemptButton assignmentId={a.id} resume={a.openAttemptId !== null} start={startAttemptAction} />
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

async function TrainerPractice({ trainer }: { trainer: boolean }) {
  const { scope } = await pageScope('practice.overview');
  const data = practiceOverviewSchema.parse(await practiceOverview({ scope }));
  return (
    <div className="space-y-8">
      <div>
        <h1 className="page-title">Practice scenarios</h1>
        <p className="text-muted">
          {trainer
            ? 'Bench faults on a unit profile, assigned to apprentices, and how their attempts went.'
            : 'The trainers’ scenarios and how the apprentices’ attempts went (read only), and a bench of your own to prove the tree against a fault.'}
        </p>
      </div>

      {!trainer && (
        <section id="prove" aria-labelledby="prove-title" className="card space-y-3">
          <h2 id="prove-title" className="text-xl font-bold">
            Prove the tree on the bench
          </h2>
          <p className="text-base text-muted">
            Choose a fault and a unit: the published no-heat tree is walked in the wizard with the bench answering each step, so you see
            which finding the tree reaches for that fault. Nothing of the walk is stored.
          </p>
          <FreeBenchForm faults={data.faults} />
        </section>
      )}

      <section aria-labelledby="scenarios-title" className="space-y-3">
        <h2 id="scenarios-title" className="text-xl font-bold">
          Scenarios: <span className="font-mono">{data.scenarios.length}</span>
        </h2>
        {data.scenarios.length === 0 ? (
          <p className="card text-muted">
            {trainer ? 'No scenario yet: create the first one below.' : 'No trainer has made a scenario yet.'}
          </p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2" data-testid="scenarios">
            {data.scenarios.map((s) => (
              <li key={s.id}>
                <Link href={`/practice/scenarios/${s.id}`} className="card flex h-full min-h-touch flex-col gap-1 hover:border-copper">
                  <span className="text-lg font-bold">{s.title}</span>
                  <span className="text-base text-muted">
                    {s.faultIds.length === 1 ? '1 fault' : `1 of ${s.faultIds.length} faults at random`} · {unitText(s.unit)}
                  </span>
                  <span className="text-base">
                    {s.assigned} assigned · {s.finished} of {s.attempts} attempts finished{s.dueOn ? ` · due ${formatDay(s.dueOn)}` : ''}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="apprentices-title" className="space-y-3">
        <h2 id="apprentices-title" className="text-xl font-bold">
          Apprentices
        </h2>
        {data.apprentices.length === 0 ? (
          <p className="card text-muted">Your company has no active apprentices.</p>
        ) : (
          <ul className="flex flex-wrap gap-2">
            {data.apprentices.map((a) => (
              <li key={a.id}>
                <Link href={`/practice/apprentices/${a.id}`} className="btn-secondary">
                  {a.name}: progress
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="results-title" className="space-y-3">
        <h2 id="results-title" className="text-xl font-bold">
          Results
        </h2>
        <ResultsTable rows={data.attempts} />
      </section>

      {trainer && (
        <section id="new-scenario" aria-labelledby="new-title" className="card space-y-3">
          <h2 id="new-title" className="text-xl font-bold">
            New scenario
          </h2>
          <ScenarioForm faults={data.faults} createScenario={createScenarioAction} />
        </section>
      )}
    </div>
  );
}
