import type { Metadata } from 'next';
import Link from 'next/link';
import { CompanyUsage } from '@/components/trees/usage/company-usage';
import { pageScope } from '@/lib/server/operation';
import { getCompanyTreeUsage } from '@/lib/server/tree-usage';
import { companyTreeUsageSchema } from '@/lib/validations/api';

export const metadata: Metadata = { title: 'Tree usage' };
export const dynamic = 'force-dynamic';

export default async function CompanyTreeUsagePage() {
  const { scope } = await pageScope('trees.companyUsage');
  const usage = companyTreeUsageSchema.parse(await getCompanyTreeUsage({ scope }));
  return (
    <div className="space-y-6">
      <div>
        <Link href="/trees" className="text-sm font-semibold text-muted underline-offset-4 hover:underline">
          ← Fault trees
        </Link>
        <h1 className="page-title">How the trees are used</h1>
        <p className="text-muted">What your technicians find, how often it stays fixed, and how long it takes to get there.</p>
      </div>
      <CompanyUsage usage={usage} />
    </div>
  );
}
