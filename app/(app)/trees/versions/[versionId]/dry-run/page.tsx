import type { Metadata } from 'next';
import Link from 'next/link';
import { DryRun } from '@/components/trees/dry-run';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getVersionForAuthoring } from '@/lib/server/trees';
import { authoringVersionSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Dry run' };

export default async function DryRunPage({ params }: { params: Promise<{ versionId: string }> }) {
  const { versionId } = await params;
  const { scope } = await pageScope('treeVersions.authoring');
  const version = authoringVersionSchema.parse(await orNotFound(getVersionForAuthoring({ scope, id: versionId })));
  return (
    <div className="space-y-4">
      <div>
        <Link
          href={version.status === 'draft' ? `/trees/versions/${version.id}/edit` : `/trees/versions/${version.id}`}
          className="text-sm font-semibold text-muted underline-offset-4 hover:underline"
        >
          ← Back to version {version.version}
        </Link>
        <h1 className="page-title">
          Dry run: {version.title}, version {version.version}
        </h1>
        <p className="text-muted">
          The wizard as a technician sees it, on this version as last saved. No service call is created and nothing is stored; readings are
          judged against this version&rsquo;s bands.
        </p>
      </div>
      <DryRun versionId={version.id} version={version.version} title={version.title} graph={version.graph} />
    </div>
  );
}
