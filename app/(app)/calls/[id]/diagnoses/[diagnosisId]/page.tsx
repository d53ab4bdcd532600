import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Wizard } from '@/components/wizard/wizard';
import { getCompany } from '@/db/companies';
import { getTreeVersion } from '@/db/trees';
import { getUnit } from '@/db/units';
import { AppError } from '@/lib/errors';
import { getDiagnosisView } from '@/lib/server/diagnoses';
import { requirePageUser } from '@/lib/server/guard';
import { viewerOf } from '@/lib/server/viewer';
import type { DiagnosisViewJson } from '@/lib/swr/use-diagnosis';
import { getCall } from '@/db/calls';
import { submitAnswerAction, undoAnswerAction } from '../actions';

export const metadata: Metadata = { title: 'Diagnosis' };
export const dynamic = 'force-dynamic';

export default async function DiagnosisPage({ params }: { params: Promise<{ id: string; diagnosisId: string }> }) {
  const { id, diagnosisId } = await params;
  const user = await requirePageUser({ roles: ['apprentice', 'technician', 'lead', 'admin'] });
  const viewer = viewerOf(user);
  try {
    const view = await getDiagnosisView({ viewer, id: diagnosisId });
    if (view.callId !== id) notFound();
    const [record, company, call] = await Promise.all([
      getTreeVersion({ companyId: user.companyId, id: view.treeVersionId }),
      getCompany({ id: user.companyId }),
      getCall({ viewer, id }),
    ]);
    const unit = await getUnit({ companyId: user.companyId, id: call.unitId }).catch(() => null);
    // The same JSON the route handler sends, so SWR's later fetches replace it like for like.
    const initialView = JSON.parse(JSON.stringify(view)) as DiagnosisViewJson;
    return (
      <div>
        <nav aria-label="Breadcrumb" className="mb-3 text-sm">
          <Link href={`/calls/${id}`} className="inline-flex min-h-touch items-center underline">
            ← {call.unitLabel} · {call.siteName}
          </Link>
        </nav>
        <Wizard
          actions={{ submitAnswer: submitAnswerAction, undoAnswer: undoAnswerAction }}
          diagnosisId={diagnosisId}
          callId={id}
          version={{ id: record.id, version: record.version, graph: record.graph }}
          initialView={initialView}
          displayUnits={company.displayUnits}
          transformerVa={unit?.transformerVa ?? null}
        />
      </div>
    );
  } catch (error) {
    if (error instanceof AppError && error.code === 'not_found') notFound();
    throw error;
  }
}
