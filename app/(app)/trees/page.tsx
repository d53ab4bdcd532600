import type { Metadata } from 'next';
import { TreeList } from '@/components/trees/tree-list';
import { may } from '@/lib/policy';
import { pageScope } from '@/lib/server/operation';
import { listTreesForAuthoring } from '@/lib/server/trees';
import { authoringTreeListSchema } from '@/lib/validations/api';
import { createTreeAction, importTreeAction, startDraftAction } from './actions';

export const metadata: Metadata = { title: 'Fault trees' };

export default async function TreesPage() {
  const { user, scope } = await pageScope('trees.authoring');
  const trees = authoringTreeListSchema.parse(await listTreesForAuthoring({ scope }));
  return (
    <div className="space-y-6">
      <div>
        <h1 className="page-title">Fault trees</h1>
        <p className="text-muted">
          The trees diagnoses run on. A change is made in a draft, checked as you edit, reviewed by another lead or an admin, and published;
          a diagnosis keeps the version it started on.
        </p>
      </div>
      <TreeList
        trees={trees}
        canEdit={may(user.role, 'trees.create')}
        actions={{ createTree: createTreeAction, startDraft: startDraftAction, importTree: importTreeAction }}
      />
    </div>
  );
}
