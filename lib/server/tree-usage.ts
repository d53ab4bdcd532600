import 'server-only';
import { getTree } from '@/db/trees';
import { ABANDONED_AFTER_DAYS, getCompanyUsageRows, getVersionUsageRows, RETURN_WINDOW_DAYS } from '@/db/tree-usage';
import type { Scope } from '@/lib/policy';
import { companyTimeZone } from '@/lib/server/company';
import { parseProcedureStateId } from '@/lib/trees/graph';

// Usage of the trees, shaped for the usage pages: for each published (or retired) version of a tree,
// how many diagnoses ran, which findings they reached and how often, and at which step they were
// escalated or abandoned; across the company, the findings of each month, first-time fix and the
// median time from the first step to a finding.

type Obj = Record<string, unknown>;

function titlesOf(graphs: unknown[]): Map<string, string> {
  const titles = new Map<string, string>();
  for (const graph of graphs) {
    const steps = graph && typeof graph === 'object' && Array.isArray((graph as Obj).steps) ? ((graph as Obj).steps as Obj[]) : [];
    for (const s of steps) if (typeof s.id === 'string' && typeof s.title === 'string' && !titles.has(s.id)) titles.set(s.id, s.title);
  }
  return titles;
}

/** The tree step a diagnosis state stands at: an inserted procedure counts for the step it leads to. */
function stepOfState(state: string): string {
  const procedure = parseProcedureStateId(state);
  if (procedure) return procedure.targetId;
  // The repair, readings retaken and checks ("recheck--flame-signal--f-…") belong to the finding.
  const parts = state.split('--');
  return parts.length > 1 ? parts[parts.length - 1] : state;
}

export async function getTreeUsage({ scope, treeId }: { scope: Scope; treeId: string }) {
  const tree = await getTree({ companyId: scope.companyId, id: treeId });
  const rows = await getVersionUsageRows({ companyId: scope.companyId, treeId });
  return {
    tree: { id: tree.id, title: tree.title },
    abandonedAfterDays: ABANDONED_AFTER_DAYS,
    versions: rows.versions.map((v) => {
      const titles = titlesOf([v.graph]);
      const statuses = rows.byStatus.filter((r) => r.versionId === v.id);
      const count = (status: string) => statuses.find((s) => s.status === status)?.n ?? 0;
      const stops = new Map<string, { stepId: string; title: string; escalated: number; abandoned: number }>();
      for (const r of rows.stops.filter((s) => s.versionId === v.id)) {
        const stepId = stepOfState(r.state);
        const entry = stops.get(stepId) ?? { stepId, title: titles.get(stepId) ?? stepId, escalated: 0, abandoned: 0 };
        entry[r.kind] += r.n;
        stops.set(stepId, entry);
      }
      return {
        id: v.id,
        version: v.version,
        status: v.status,
        publishedAt: v.publishedAt,
        diagnoses: statuses.reduce((sum, s) => sum + s.n, 0),
        inProgress: count('in_progress'),
        found: count('found') + count('verified'),
        escalated: count('escalated'),
        findings: rows.findings
          .filter((f) => f.versionId === v.id)
          .map((f) => ({ stepId: f.stepId, title: titles.get(f.stepId) ?? f.stepId, count: f.n }))
          .sort((a, b) => b.count - a.count),
        stops: [...stops.values()].sort((a, b) => b.escalated + b.abandoned - (a.escalated + a.abandoned)),
      };
    }),
  };
}

export async function getCompanyTreeUsage({ scope, months = 12 }: { scope: Scope; months?: number }) {
  const timeZone = await companyTimeZone(scope.companyId);
  const rows = await getCompanyUsageRows({ companyId: scope.companyId, timeZone, months });
  const titles = titlesOf(rows.stepGraphs);
  const byMonth = new Map<string, { stepId: string; title: string; count: number }[]>();
  for (const r of rows.findingsByMonth) {
    const list = byMonth.get(r.month) ?? [];
    list.push({ stepId: r.stepId, title: titles.get(r.stepId) ?? r.stepId, count: r.n });
    byMonth.set(r.month, list);
  }
  return {
    months: [...byMonth.entries()].map(([month, findings]) => ({
      month,
      findings: findings.slice(0, 5),
      total: findings.reduce((s, f) => s + f.count, 0),
    })),
    firstTimeFix: {
      windowDays: RETURN_WINDOW_DAYS,
      closed: rows.closedCalls,
      returned: rows.returned,
      windowOpen: rows.windowOpen,
      rate: rows.closedCalls > 0 ? (rows.closedCalls - rows.returned) / rows.closedCalls : null,
    },
    timeToFinding: { medianSeconds: rows.medianSecondsToFinding, diagnoses: rows.findingsTimed },
  };
}
