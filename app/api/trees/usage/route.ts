// GET /api/trees/usage – the company's most common findings per month, first-time fix, median time from first step to finding.
import { routeOf } from '@/lib/server/operation';
import { companyTreeUsageOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const GET = routeOf(companyTreeUsageOp);
