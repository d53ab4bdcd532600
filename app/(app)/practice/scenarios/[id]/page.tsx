import type { Metadata } from 'next';
import { AssignForm } from '@/components/practice/assign-form';
import { unitText } from '@/components/practice/format';
import { ResultsTable } from '@/components/practice/results-table';
import { BackLink } from '@/components/ui/back-link';
import { Time } from '@/components/ui/time-zone';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { practiceOverview, scenarioDetail } from '@/lib/server/practice';
import { scenarioDetailSchema } from '@/lib/validations/practice';
import { assignScenarioAction } from '../../actions';
import { formatDay } from '@/components/calls/format';

export const metadata: Metadata = { title: 'Practice scenario' };
export const dynamic = 'force-dynamic';

export default async function ScenarioPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { scope, user } = await pageScope('practice.scenarios.get');
  const detail = scenarioDetailSchema.parse(await orNotFound(scenarioDetail({ scope, id })));
  const { apprentices } = await practiceOverview({ scope });
  const s = detail.scenario;
  return (
    <div className="space-y-6">
      <BackLink href="/practice">Practice scenarios</BackLink>
      <div>
        <h1 className="page-title">{s.title}</h1>
        <p className="text-muted">
          {unitText(s.unit)} · by {s.trainerName ?? 'a former trainer'} · <Time value={s.createdAt} kind="date" />
          {s.dueOn ? ` · due ${formatDay(s.dueOn)}` : ''}
        </p>
      </div>
      <section className="card space-y-2" aria-labelledby="faults-title">
        <h2 id="faults-title" className="text-lg font-bold">
          {detail.faults.length === 1 ? 'The fault' : `One of ${detail.faults.length} faults, drawn at random for each attempt`}
        </h2>
        <ul className="space-y-1">
          {detail.faults.map((f) => (
            <li key={f.id}>
              <span className="font-semibold">{f.title}</span>
              {f.description && <span className="block text-base text-muted">{f.description}</span>}
            </li>
          ))}
        </ul>
        {s.notes && (
          <p className="whitespace-pre-line border-t border-line pt-2 text-base">
            <span className="font-semibold">Notes for the apprentice: </span>
            {s.notes}
          </p>
        )}
      </section>
      <section className="card space-y-3" aria-labelledby="assigned-title">
        <h2 id="assigned-title" className="text-lg font-bold">
          Assigned to: <span className="font-mono">{detail.assignments.length}</span>
        </h2>
        {detail.assignments.length > 0 && (
          <ul className="flex flex-wrap gap-2" data-testid="assigned">
            {detail.assignments.map((a) => (
              <li key={a.id} className="rounded-full border border-line px-3 py-1">
                {a.apprentice.name}
              </li>
            ))}
          </ul>
        )}
        {user.role === 'trainer' && (
          <AssignForm
            scenarioId={s.id}
            apprentices={apprentices}
            assignedIds={detail.assignments.map((a) => a.apprentice.id)}
            assign={assignScenarioAction}
          />
        )}
      </section>
      <section className="space-y-3" aria-labelledby="results-title">
        <h2 id="results-title" className="text-xl font-bold">
          Results
        </h2>
        <ResultsTable rows={detail.attempts} hide={['scenario']} />
      </section>
    </div>
  );
}
