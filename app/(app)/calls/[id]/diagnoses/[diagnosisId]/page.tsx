import type { Metadata } from 'next';
import { BackLink } from '@/components/ui/back-link';
import { notFound } from 'next/navigation';
import { Wizard } from '@/components/wizard/wizard';
import { getCall } from '@/db/calls';
import { getCompany } from '@/db/companies';
import { getTreeVersion } from '@/db/trees';
import { getUnit } from '@/db/units';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { may } from '@/lib/policy';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { diagnosisViewSchema } from '@/lib/validations/api';
import { escalateAction, submitAnswerAction, undoAnswerAction } from '../actions';

export const metadata: Metadata = { title: 'Diagnosis' };
export const dynamic = 'force-dynamic';

// No loading.tsx here: a loading boundary would stream a 200 before this page can answer 404 for a
// diagnosis that is not the user's.
export default async function DiagnosisPage({ params }: { params: Promise<{ id: string; diagnosisId: string }> }) {
  const { id, diagnosisId } = await params;
  const { user, scope } = await pageScope('diagnoses.get');
  const view = await orNotFound(getDiagnosisView({ scope, id: diagnosisId }));
  if (view.callId !== id) notFound();
  const [record, company, call] = await Promise.all([
    getTreeVersion({ companyId: scope.companyId, id: view.treeVersionId }),
    getCompany({ id: scope.companyId }),
    orNotFound(getCall({ scope, id })),
  ]);
  const unit = await getUnit({ companyId: scope.companyId, id: call.unitId }).catch(() => null);
  return (
    <div>
      <nav aria-label="Breadcrumb" className="mb-3 text-base">
        <BackLink href={`/calls/${id}`}>
          {call.unitLabel} · {call.siteName}
        </BackLink>
      </nav>
      <Wizard
        actions={{ submitAnswer: submitAnswerAction, undoAnswer: undoAnswerAction, escalate: escalateAction }}
        diagnosisId={diagnosisId}
        callId={id}
        version={{ id: record.id, version: record.version, graph: record.graph }}
        // The same JSON the route handler sends, so SWR's later fetches replace it like for like.
        initialView={diagnosisViewSchema.parse(view)}
        displayUnits={company.displayUnits}
        transformerVa={unit?.transformerVa ?? null}
        viewerRole={user.role}
        unit={unit ? { ignition: unit.ignition, fuel: unit.fuel, controlSupply: unit.controlSupply, draft: unit.draft } : undefined}
        correctUnitHref={unit && may(user.role, 'units.correct') ? `/units/${unit.id}#record` : null}
      />
    </div>
  );
}
