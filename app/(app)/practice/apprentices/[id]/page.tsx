import type { Metadata } from 'next';
import { ProgressChart } from '@/components/practice/progress-chart';
import { ResultsTable } from '@/components/practice/results-table';
import { BackLink } from '@/components/ui/back-link';
import { Time } from '@/components/ui/time-zone';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { apprenticeProgress } from '@/lib/server/practice';
import { progressSchema } from '@/lib/validations/practice';

export const metadata: Metadata = { title: 'Apprentice progress' };
export const dynamic = 'force-dynamic';

export default async function ProgressPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { scope } = await pageScope('practice.progress');
  const p = progressSchema.parse(await orNotFound(apprenticeProgress({ scope, apprenticeId: id })));
  return (
    <div className="space-y-6">
      <BackLink href="/practice">Practice scenarios</BackLink>
      <div>
        <h1 className="page-title">{p.apprentice.name}</h1>
        <p className="text-muted">{p.apprentice.email}</p>
      </div>
      <section className="card space-y-3" aria-labelledby="chart-title">
        <h2 id="chart-title" className="text-lg font-bold">
          Scores and times
        </h2>
        <ProgressChart rows={p.attempts} />
      </section>
      <section className="card space-y-2" aria-labelledby="isolated-title">
        <h2 id="isolated-title" className="text-lg font-bold">
          Faults isolated: <span className="font-mono">{p.isolated.length}</span>
        </h2>
        {p.isolated.length === 0 ? (
          <p className="text-muted">No fault isolated on the bench yet.</p>
        ) : (
          <ul className="divide-y divide-line">
            {p.isolated.map((f) => (
              <li key={f.faultId} className="flex flex-wrap justify-between gap-2 py-2">
                <span className="font-semibold">{f.faultTitle}</span>
                <span className="text-base">
                  {f.times}× · best <span className="font-mono">{f.best}</span>
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="card space-y-2" aria-labelledby="signoff-title">
        <h2 id="signoff-title" className="text-lg font-bold">
          Real diagnoses waiting for a technician’s sign-off: <span className="font-mono">{p.awaitingSignOff.length}</span>
        </h2>
        {p.awaitingSignOff.length === 0 ? (
          <p className="text-muted">None waiting.</p>
        ) : (
          <ul className="divide-y divide-line">
            {p.awaitingSignOff.map((d) => (
              <li key={d.diagnosisId} className="flex flex-wrap justify-between gap-2 py-2">
                <span>
                  <span className="font-semibold">{d.findingTitle}</span> · {d.site}
                </span>
                <Time value={d.at} />
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="space-y-3" aria-labelledby="attempts-title">
        <h2 id="attempts-title" className="text-xl font-bold">
          Attempts
        </h2>
        <ResultsTable rows={p.attempts} hide={['apprentice']} />
      </section>
    </div>
  );
}
