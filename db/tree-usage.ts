import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';

// Usage of fault trees: how diagnoses went on each version, and the company's findings, first-time
// fixes and time to a finding. Read-only; every query is scoped by company.

/** A diagnosis still in progress after this long, or on a call closed or referred, was abandoned. */
export const ABANDONED_AFTER_DAYS = 7;
/** A call closed with no new call for the same unit within this many days was fixed the first time. */
export const RETURN_WINDOW_DAYS = 30;

export interface VersionUsageRows {
  versions: { id: string; version: number; status: string; graph: unknown; publishedAt: Date | null }[];
  byStatus: { versionId: string; status: string; n: number }[];
  findings: { versionId: string; stepId: string; n: number }[];
  /** Where diagnoses stopped without a finding: the state they stood at, escalated or abandoned. */
  stops: { versionId: string; state: string; kind: 'escalated' | 'abandoned'; n: number }[];
}

export async function getVersionUsageRows(
  { companyId, treeId }: { companyId: string; treeId: string },
  trx: Knex = db,
): Promise<VersionUsageRows> {
  if (!isUuid(treeId)) throw notFound('That tree');
  const tree = await trx('fault_trees').where({ id: treeId, company_id: companyId }).first('id');
  if (!tree) throw notFound('That tree');
  const versions = await trx('tree_versions')
    .where({ tree_id: treeId, company_id: companyId })
    .whereIn('status', ['published', 'retired'])
    .orderBy('version', 'desc')
    .select('id', 'version', 'status', 'graph', 'published_at');
  const ids = versions.map((v) => v.id as string);
  if (ids.length === 0) return { versions: [], byStatus: [], findings: [], stops: [] };
  const byStatus = await trx('diagnoses')
    .where('company_id', companyId)
    .whereIn('tree_version_id', ids)
    .groupBy('tree_version_id', 'status')
    .select('tree_version_id as versionId', 'status', trx.raw('count(*)::int as n'));
  const findings = await trx('diagnoses')
    .where('company_id', companyId)
    .whereIn('tree_version_id', ids)
    .whereNotNull('finding_step_id')
    .groupBy('tree_version_id', 'finding_step_id')
    .select('tree_version_id as versionId', 'finding_step_id as stepId', trx.raw('count(*)::int as n'));
  const stops = await trx('diagnoses as d')
    .join('service_calls as c', 'c.id', 'd.call_id')
    .where('d.company_id', companyId)
    .whereIn('d.tree_version_id', ids)
    .whereNotNull('d.current_state')
    .where((w) =>
      w
        .where('d.status', 'escalated')
        .orWhere((x) =>
          x
            .where('d.status', 'in_progress')
            .andWhere((y) =>
              y
                .whereIn('c.status', ['closed', 'referred'])
                .orWhere('d.started_at', '<', trx.raw(`now() - interval '${ABANDONED_AFTER_DAYS} days'`)),
            ),
        ),
    )
    .groupBy('d.tree_version_id', 'd.current_state', 'd.status')
    .select(
      'd.tree_version_id as versionId',
      'd.current_state as state',
      trx.raw(`CASE WHEN d.status = 'escalated' THEN 'escalated' ELSE 'abandoned' END as kind`),
      trx.raw('count(*)::int as n'),
    );
  return {
    versions: versions.map((v) => ({
      id: v.id,
      version: v.version,
      status: v.status,
      graph: v.graph,
      publishedAt: v.published_at ?? null,
    })),
    byStatus,
    findings,
    stops,
  };
}

export interface CompanyUsageRows {
  /** Findings reached per month (in the company's time zone), with a graph to name each by. */
  findingsByMonth: { month: string; stepId: string; n: number }[];
  stepGraphs: unknown[];
  closedCalls: number;
  /** Closed calls followed by a new call for the same unit within the window. */
  returned: number;
  /** Closed calls whose window is still open (closed less than the window ago). */
  windowOpen: number;
  medianSecondsToFinding: number | null;
  findingsTimed: number;
}

export async function getCompanyUsageRows(
  { companyId, timeZone, months = 12 }: { companyId: string; timeZone: string; months?: number },
  trx: Knex = db,
) {
  const findingsByMonth = await trx('diagnoses')
    .where('company_id', companyId)
    .whereNotNull('finding_step_id')
    .andWhere('started_at', '>=', trx.raw(`date_trunc('month', now()) - (? || ' months')::interval`, [String(months - 1)]))
    .groupByRaw(`1, 2`)
    .orderByRaw('1 desc, 3 desc')
    .select(
      trx.raw(`to_char(started_at AT TIME ZONE ?, 'YYYY-MM') as month`, [timeZone]),
      'finding_step_id as stepId',
      trx.raw('count(*)::int as n'),
    );
  const stepGraphs = await trx('tree_versions')
    .where('company_id', companyId)
    .whereIn('status', ['published', 'retired'])
    .orderBy('version', 'desc')
    .pluck('graph');
  const fix = await trx('service_calls as c')
    .where({ 'c.company_id': companyId, 'c.status': 'closed' })
    .whereNotNull('c.closed_at')
    .first(
      trx.raw('count(*)::int as closed'),
      trx.raw(
        `count(*) FILTER (WHERE EXISTS (SELECT 1 FROM service_calls r WHERE r.unit_id = c.unit_id AND r.id <> c.id
           AND r.opened_at > c.closed_at AND r.opened_at <= c.closed_at + interval '${RETURN_WINDOW_DAYS} days'))::int as returned`,
      ),
      trx.raw(`count(*) FILTER (WHERE c.closed_at > now() - interval '${RETURN_WINDOW_DAYS} days')::int as window_open`),
    );
  // From the first answer of the walk to the last answer on a tree step before the finding (steps the
  // diagnosis inserts have "--" in their ids; undone answers are off the path).
  const timing = await trx
    .with('walk', (w) =>
      w
        .from('answers as a')
        .join('diagnoses as d', 'd.id', 'a.diagnosis_id')
        .where('d.company_id', companyId)
        .whereNotNull('d.finding_step_id')
        .whereNull('a.undone_at')
        .groupBy('a.diagnosis_id')
        .select(
          'a.diagnosis_id',
          trx.raw('min(a.created_at) as first_at'),
          trx.raw(`max(a.created_at) FILTER (WHERE position('--' in a.step_id) = 0 AND a.step_id <> d.finding_step_id) as reached_at`),
        ),
    )
    .from('walk')
    .whereNotNull('reached_at')
    .first(
      trx.raw('percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM reached_at - first_at)) as median'),
      trx.raw('count(*)::int as n'),
    );
  return {
    findingsByMonth,
    stepGraphs,
    closedCalls: fix?.closed ?? 0,
    returned: fix?.returned ?? 0,
    windowOpen: fix?.window_open ?? 0,
    medianSecondsToFinding: timing?.median === null || timing?.median === undefined ? null : Number(timing.median),
    findingsTimed: timing?.n ?? 0,
  } satisfies CompanyUsageRows;
}
