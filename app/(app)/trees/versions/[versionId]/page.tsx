import type { Metadata } from 'next';
import Link from 'next/link';
import { ReviewComments } from '@/components/trees/review-comments';
import { ReviewPanel } from '@/components/trees/review-panel';
import { STATUS_LABEL } from '@/components/trees/status';
import { VersionView } from '@/components/trees/version-view';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getVersionForAuthoring } from '@/lib/server/trees';
import { authoringVersionSchema } from '@/lib/validations/api';
import { approveVersionAction, publishVersionAction, returnVersionAction } from '../../actions';

export const metadata: Metadata = { title: 'Tree version' };

export default async function VersionPage({
  params,
  searchParams,
}: {
  params: Promise<{ versionId: string }>;
  searchParams: Promise<{ step?: string | string[] }>;
}) {
  const { versionId } = await params;
  const { step } = await searchParams;
  const { scope } = await pageScope('treeVersions.authoring');
  const version = authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: versionId })));
  const stepIds = version.graph.steps.map((s) => String(s.id ?? ''));
  return (
    <div className="space-y-4">
      <div>
        <Link href={`/trees/${version.treeId}`} className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← {version.title}
        </Link>
        <h1 className="page-title">
          {version.title}: version {version.version}
        </h1>
        <p className="text-muted">
          {STATUS_LABEL[version.status]}
          {version.author && <> · written by {version.author.name}</>}
          {version.submittedBy && <> · submitted by {version.submittedBy.name}</>}
          {version.approvedBy && <> · approved by {version.approvedBy.name}</>}
        </p>
        <div className="mt-2 flex flex-wrap gap-2">
          {version.status === 'draft' && (
            <Link className="btn-primary" href={`/trees/versions/${version.id}/edit`}>
              Edit the draft
            </Link>
          )}
          {version.basedOnId && (
            <Link className="btn-secondary" href={`/trees/versions/${version.id}/diff?against=${version.basedOnId}`}>
              What changed from the version it was copied from
            </Link>
          )}
          <Link className="btn-secondary" href={`/trees/versions/${version.id}/dry-run`}>
            Dry run
          </Link>
          <Link className="btn-secondary" href={`/trees/versions/${version.id}/isolation`}>
            Isolation check
          </Link>
          <a className="btn-secondary" href={`/api/tree-versions/${version.id}/export`} download>
            Export
          </a>
        </div>
      </div>
      {version.status === 'draft' && version.reviewComments.length > 0 && <ReviewComments version={version} />}
      <ReviewPanel
        version={version}
        stepIds={stepIds}
        problems={version.problems.length}
        actions={{ approve: approveVersionAction, returnVersion: returnVersionAction, publish: publishVersionAction }}
      />
      <VersionView version={version} initialStepId={typeof step === 'string' ? step : undefined} />
    </div>
  );
}
