import type { Metadata } from 'next';
import Link from 'next/link';
import { TreeUsage } from '@/components/trees/usage/tree-usage';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { getTreeUsage } from '@/lib/server/tree-usage';
import { treeUsageSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Tree usage' };
export const dynamic = 'force-dynamic';

export default async function TreeUsagePage({ params }: { params: Promise<{ treeId: string }> }) {
  const { treeId } = await params;
  const { scope } = await pageScope('trees.usage');
  const usage = treeUsageSchema.parse(await orNotFound(getTreeUsage({ scope, treeId })));
  const tree = usage.tree;
  return (
    <div className="space-y-6">
      <div>
        <Link href={`/trees/${tree.id}`} className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← {tree.title}
        </Link>
        <h1 className="page-title">Where diagnoses go on “{tree.title}”</h1>
        <p className="text-muted">For each published version: how many diagnoses ran, what they found, and at which step people stopped.</p>
      </div>
      <TreeUsage usage={usage} />
    </div>
  );
}
