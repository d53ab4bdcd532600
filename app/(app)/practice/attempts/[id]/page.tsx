import type { Metadata } from 'next';
import Link from 'next/link';
import { AttemptRunner } from '@/components/practice/attempt-runner';
import { unitText } from '@/components/practice/format';
import { PracticeWizard } from '@/components/practice/practice-wizard';
import { AttemptPath, ScoreCard, WalkPath } from '@/components/practice/score-card';
import { BackLink } from '@/components/ui/back-link';
import { Time } from '@/components/ui/time-zone';
import { getCompany } from '@/db/companies';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { attemptDetail, attemptWalkView } from '@/lib/server/practice';
import { diagnosisViewSchema } from '@/lib/validations/api';
import { attemptSchema } from '@/lib/validations/practice';
import { finishAttemptAction, practiceAnswerAction, practiceUndoAction } from '../../actions';

export const metadata: Metadata = { title: 'Practice attempt' };
export const dynamic = 'force-dynamic';

export default async function AttemptPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { user, scope } = await pageScope('practice.attempts.get');
  const a = attemptSchema.parse(await orNotFound(attemptDetail({ user, scope, id })));
  const mine = a.apprentice.id === user.id;
  const running = a.finishedAt === null;
  const walk = running && mine && a.walk ? await attemptWalkView({ user, scope, id }) : null;
  const company = walk ? await getCompany({ id: scope.companyId }) : null;
  return (
    <div className="space-y-6">
      <BackLink href={mine ? '/practice' : `/practice/scenarios/${a.scenarioId}`}>{mine ? 'Practice' : 'The scenario'}</BackLink>
      <div>
        <h1 className="page-title">{a.title}</h1>
        <p className="text-muted">
          {mine ? '' : `${a.apprentice.name} · `}
          {unitText(a.unit)} · started <Time value={a.startedAt} />
        </p>
        {a.notes && <p className="mt-2 whitespace-pre-line text-base">{a.notes}</p>}
      </div>
      {running && mine && walk && company ? (
        <PracticeWizard
          attemptId={a.id}
          unit={a.unit}
          facts={walk.unit}
          version={walk.version}
          initialView={diagnosisViewSchema.parse(walk.view)}
          displayUnits={company.displayUnits}
          answer={practiceAnswerAction}
          undo={practiceUndoAction}
        />
      ) : running && mine ? (
        // An attempt started without a tree to walk: the finding is reported by hand.
        <AttemptRunner attempt={a} finish={finishAttemptAction} />
      ) : (
        <>
          {running ? (
            <p className="card" role="status">
              Still running: {a.apprentice.name} has not reported a finding yet.
            </p>
          ) : (
            <section className="card space-y-2" aria-labelledby="result-title" data-testid="attempt-result">
              <h2 id="result-title" className="text-lg font-bold">
                {a.finding && a.expectedFindings.some((f) => f.id === a.finding!.id) ? '✓ Fault isolated' : '✗ Not the fault'}
              </h2>
              <dl className="grid gap-2 sm:grid-cols-2">
                <div>
                  <dt className="text-muted">Finding reported</dt>
                  <dd className="font-semibold">{a.finding?.title ?? '—'}</dd>
                </div>
                <div>
                  <dt className="text-muted">Fault injected</dt>
                  <dd className="font-semibold">{a.fault?.title ?? '—'}</dd>
                  {a.expectedFindings.length > 0 && (
                    <dd className="text-base text-muted">The finding it leads to: {a.expectedFindings.map((f) => f.title).join(' or ')}</dd>
                  )}
                </div>
              </dl>
              {a.fault?.description && <p className="text-base text-muted">{a.fault.description}</p>}
            </section>
          )}
          {a.score && <ScoreCard score={a.score} />}
          {a.walk && <WalkPath walk={a.walk} />}
          {(a.events.length > 0 || !mine) && <AttemptPath attempt={a} />}
          {mine && (
            <Link href="/practice" className="btn-secondary">
              Back to my assignments
            </Link>
          )}
        </>
      )}
    </div>
  );
}
