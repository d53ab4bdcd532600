// POST /api/trees/import – { document } as exported: checked whole, stored as a draft, nothing stored on any problem.
import { routeOf } from '@/lib/server/operation';
import { importTreeOp } from '@/lib/server/operations/trees';

export const dynamic = 'force-dynamic';

export const POST = routeOf(importTreeOp, { status: 201 });
