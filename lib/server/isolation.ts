import 'server-only';
import { getAuthoringVersion } from '@/db/trees';
import { getFault } from '@/lib/bench/faults';
import { isolationCheck } from '@/lib/bench/isolation';
import { AppError } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import { validateGraph } from '@/lib/trees/validate';
import type { IsolationQuery, IsolationRowOut } from '@/lib/validations/isolation';

/**
 * GET /api/tree-versions/{id}/isolation-check: every fault of the bench's library that exists on the
 * unit profile, run through the version with the bench answering its steps (lib/bench/isolation.ts).
 * A version of another company is not found; one the validator refuses is a 422 with its problems,
 * as its walk would not be the tree's.
 */
export async function checkIsolation({
  scope,
  id,
  query,
}: {
  scope: Scope;
  id: string;
  query: IsolationQuery;
}): Promise<IsolationRowOut[]> {
  const version = await getAuthoringVersion({ companyId: scope.companyId, id });
  const checked = validateGraph(version.graph);
  if (!checked.ok) {
    const fieldErrors: Record<string, string[]> = {};
    for (const p of checked.problems) (fieldErrors[p.stepId ?? '_form'] ??= []).push(p.message);
    const n = checked.problems.length;
    throw new AppError('unprocessable', `The isolation check needs a tree without problems: this one has ${n} to fix first.`, {
      fieldErrors,
    });
  }
  const { flameTest, ...unit } = query;
  return isolationCheck(checked.graph, { unit, flameTest }).map((row) => ({
    ...row,
    faultTitle: getFault(row.faultId)?.title ?? row.faultId,
  }));
}
