import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { DraftWorkspace } from '@/components/trees/draft-workspace';
import { ReviewComments } from '@/components/trees/review-comments';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getVersionForAuthoring } from '@/lib/server/trees';
import { authoringVersionSchema } from '@/lib/validations/api';
import { saveDraftAction, submitDraftAction } from '../../../actions';

export const metadata: Metadata = { title: 'Edit a draft' };

export default async function EditDraftPage({
  params,
  searchParams,
}: {
  params: Promise<{ versionId: string }>;
  searchParams: Promise<{ step?: string | string[] }>;
}) {
  const { versionId } = await params;
  const { step } = await searchParams;
  const { scope } = await pageScope('treeVersions.save');
  const version = authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: versionId })));
  if (version.status !== 'draft')
    redirect(`/trees/versions/${version.id}${typeof step === 'string' ? `?step=${encodeURIComponent(step)}` : ''}`);
  return (
    <div className="space-y-4">
      <div>
        <Link href={`/trees/${version.treeId}`} className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← {version.title}
        </Link>
        <h1 className="page-title">
          {version.title}: draft version {version.version}
        </h1>
        <p className="text-muted">Saved automatically as you edit. Submit it for review when no problems are left.</p>
      </div>
      {version.reviewComments.length > 0 && <ReviewComments version={version} />}
      <DraftWorkspace
        version={version}
        actions={{ saveDraft: saveDraftAction, submitDraft: submitDraftAction }}
        initialStepId={typeof step === 'string' ? step : undefined}
      />
    </div>
  );
}
