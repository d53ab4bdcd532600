import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { isUuid } from '@/db/users';
import { AppError, notFound } from '@/lib/errors';
import type { Scope } from '@/lib/policy';
import type { Score } from '@/lib/practice/scoring';
import type { UnitProfile } from '@/lib/validations/practice';

// Practice scenarios, assignments and attempts. Every query is of one company; an apprentice's
// scope (`own`) reaches only their own assignments and attempts.

export interface Scenario {
  id: string;
  title: string;
  faultIds: string[];
  unit: UnitProfile;
  notes: string;
  dueOn: string | null;
  trainerName: string | null;
  createdAt: Date;
  assigned: number;
  attempts: number;
  finished: number;
}

export interface Person {
  id: string;
  name: string;
  email: string;
}

export interface Assignment {
  id: string;
  scenarioId: string;
  title: string;
  notes: string;
  unit: UnitProfile;
  dueOn: string | null;
  faultIds: string[];
  apprentice: Person;
  assignedAt: Date;
  attempts: number;
  openAttemptId: string | null;
  lastScore: { total: number; max: number; finishedAt: Date } | null;
}

export interface Attempt {
  id: string;
  assignmentId: string;
  scenarioId: string;
  scenarioTitle: string;
  notes: string;
  unit: UnitProfile;
  apprentice: Person;
  benchSessionId: string;
  faultId: string;
  /** The tree version walked in the wizard; null for an attempt whose finding is reported by hand. */
  treeVersionId: string | null;
  findingStepId: string | null;
  score: Score | null;
  startedAt: Date;
  finishedAt: Date | null;
}

const dateOnly = (v: unknown): string | null => {
  if (v === null || v === undefined) return null;
  if (v instanceof Date) return v.toISOString().slice(0, 10);
  return String(v).slice(0, 10);
};

const toScenario = (r: Record<string, unknown>): Scenario => ({
  id: r.id as string,
  title: r.title as string,
  faultIds: r.fault_ids as string[],
  unit: r.unit as UnitProfile,
  notes: r.notes as string,
  dueOn: dateOnly(r.due_on_text ?? r.due_on),
  trainerName: (r.trainer_name as string | null) ?? null,
  createdAt: r.created_at as Date,
  assigned: Number(r.assigned ?? 0),
  attempts: Number(r.attempts ?? 0),
  finished: Number(r.finished ?? 0),
});

const scenarioQuery = (companyId: string, trx: Knex) =>
  trx('practice_scenarios as s')
    .leftJoin('users as t', 't.id', 's.trainer_id')
    .where('s.company_id', companyId)
    .select(
      's.*',
      trx.raw(`to_char(s.due_on, 'YYYY-MM-DD') as due_on_text`),
      't.name as trainer_name',
      trx.raw('(SELECT count(*) FROM practice_assignments pa WHERE pa.scenario_id = s.id) AS assigned'),
      trx.raw('(SELECT count(*) FROM practice_attempts at WHERE at.scenario_id = s.id) AS attempts'),
      trx.raw('(SELECT count(*) FROM practice_attempts at WHERE at.scenario_id = s.id AND at.finished_at IS NOT NULL) AS finished'),
    );

export async function createScenario(
  {
    companyId,
    trainerId,
    input,
  }: {
    companyId: string;
    trainerId: string;
    input: { title: string; faultIds: string[]; unit: UnitProfile; notes: string; dueOn: string | null };
  },
  trx: Knex = db,
): Promise<Scenario> {
  const [row] = await trx('practice_scenarios')
    .insert({
      company_id: companyId,
      trainer_id: trainerId,
      title: input.title,
      fault_ids: input.faultIds,
      unit: JSON.stringify(input.unit),
      notes: input.notes,
      due_on: input.dueOn,
    })
    .returning('id');
  return getScenario({ companyId, id: row.id as string }, trx);
}

export async function listScenarios({ companyId }: { companyId: string }, trx: Knex = db): Promise<Scenario[]> {
  const rows = await scenarioQuery(companyId, trx).orderBy('s.created_at', 'desc');
  return rows.map(toScenario);
}

export async function getScenario({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<Scenario> {
  if (!isUuid(id)) throw notFound('That scenario');
  const row = await scenarioQuery(companyId, trx).where('s.id', id).first();
  if (!row) throw notFound('That scenario');
  return toScenario(row);
}

export async function listApprentices({ companyId }: { companyId: string }, trx: Knex = db): Promise<Person[]> {
  return trx('users').where({ company_id: companyId, role: 'apprentice', active: true }).orderBy('name').select('id', 'name', 'email');
}

/** Assign a scenario; someone already assigned keeps their assignment. Every id must be an active apprentice of the company. */
export async function assignScenario(
  { companyId, scenarioId, apprenticeIds, by }: { companyId: string; scenarioId: string; apprenticeIds: string[]; by: string },
  trx: Knex = db,
): Promise<number> {
  return trx.transaction(async (t) => {
    await getScenario({ companyId, id: scenarioId }, t);
    const ids = [...new Set(apprenticeIds)];
    const found = await t('users').where({ company_id: companyId, role: 'apprentice', active: true }).whereIn('id', ids).pluck('id');
    if (found.length !== ids.length) {
      throw new AppError('bad_request', 'Only active apprentices of your company can be assigned a scenario.', {
        fieldErrors: { apprenticeIds: ['Choose apprentices from the list.'] },
      });
    }
    const inserted = await t('practice_assignments')
      .insert(ids.map((id) => ({ company_id: companyId, scenario_id: scenarioId, apprentice_id: id, assigned_by: by })))
      .onConflict(['scenario_id', 'apprentice_id'])
      .ignore()
      .returning('id');
    return inserted.length;
  });
}

const toAssignment = (r: Record<string, unknown>): Assignment => ({
  id: r.id as string,
  scenarioId: r.scenario_id as string,
  title: r.title as string,
  notes: r.notes as string,
  unit: r.unit as UnitProfile,
  dueOn: dateOnly(r.due_on_text),
  faultIds: r.fault_ids as string[],
  apprentice: { id: r.apprentice_id as string, name: r.apprentice_name as string, email: r.apprentice_email as string },
  assignedAt: r.assigned_at as Date,
  attempts: Number(r.attempts ?? 0),
  openAttemptId: (r.open_attempt_id as string | null) ?? null,
  lastScore:
    r.last_total === null || r.last_total === undefined
      ? null
      : { total: Number(r.last_total), max: Number(r.last_max), finishedAt: r.last_finished_at as Date },
});

const assignmentQuery = (scope: Scope, trx: Knex) => {
  const q = trx('practice_assignments as a')
    .join('practice_scenarios as s', 's.id', 'a.scenario_id')
    .join('users as u', 'u.id', 'a.apprentice_id')
    .where('a.company_id', scope.companyId)
    .select(
      'a.id',
      'a.scenario_id',
      'a.apprentice_id',
      'a.assigned_at',
      's.title',
      's.notes',
      's.unit',
      's.fault_ids',
      trx.raw(`to_char(s.due_on, 'YYYY-MM-DD') as due_on_text`),
      'u.name as apprentice_name',
      'u.email as apprentice_email',
      trx.raw('(SELECT count(*) FROM practice_attempts x WHERE x.assignment_id = a.id) AS attempts'),
      trx.raw(
        '(SELECT x.id FROM practice_attempts x WHERE x.assignment_id = a.id AND x.finished_at IS NULL ORDER BY x.started_at DESC LIMIT 1) AS open_attempt_id',
      ),
      trx.raw(
        `(SELECT (x.score->>'total')::numeric FROM practice_attempts x WHERE x.assignment_id = a.id AND x.finished_at IS NOT NULL ORDER BY x.finished_at DESC LIMIT 1) AS last_total`,
      ),
      trx.raw(
        `(SELECT (x.score->>'max')::numeric FROM practice_attempts x WHERE x.assignment_id = a.id AND x.finished_at IS NOT NULL ORDER BY x.finished_at DESC LIMIT 1) AS last_max`,
      ),
      trx.raw(
        `(SELECT x.finished_at FROM practice_attempts x WHERE x.assignment_id = a.id AND x.finished_at IS NOT NULL ORDER BY x.finished_at DESC LIMIT 1) AS last_finished_at`,
      ),
    );
  if (scope.reach !== 'company') q.where('a.apprentice_id', scope.userId);
  return q;
};

export async function listAssignments({ scope, scenarioId }: { scope: Scope; scenarioId?: string }, trx: Knex = db): Promise<Assignment[]> {
  const q = assignmentQuery(scope, trx).orderByRaw('s.due_on ASC NULLS LAST, a.assigned_at DESC');
  if (scenarioId) q.where('a.scenario_id', scenarioId);
  return (await q).map(toAssignment);
}

export async function getAssignment({ scope, id }: { scope: Scope; id: string }, trx: Knex = db): Promise<Assignment> {
  if (!isUuid(id)) throw notFound('That assignment');
  const row = await assignmentQuery(scope, trx).where('a.id', id).first();
  if (!row) throw notFound('That assignment');
  return toAssignment(row);
}

const toAttempt = (r: Record<string, unknown>): Attempt => ({
  id: r.id as string,
  assignmentId: r.assignment_id as string,
  scenarioId: r.scenario_id as string,
  scenarioTitle: r.title as string,
  notes: r.notes as string,
  unit: r.unit as UnitProfile,
  apprentice: { id: r.apprentice_id as string, name: r.apprentice_name as string, email: r.apprentice_email as string },
  benchSessionId: r.bench_session_id as string,
  faultId: r.fault_id as string,
  treeVersionId: (r.tree_version_id as string | null) ?? null,
  findingStepId: (r.finding_step_id as string | null) ?? null,
  score: (r.score as Score | null) ?? null,
  startedAt: r.started_at as Date,
  finishedAt: (r.finished_at as Date | null) ?? null,
});

const attemptQuery = (scope: Scope, trx: Knex) => {
  const q = trx('practice_attempts as x')
    .join('practice_scenarios as s', 's.id', 'x.scenario_id')
    .join('users as u', 'u.id', 'x.apprentice_id')
    .where('x.company_id', scope.companyId)
    .select('x.*', 's.title', 's.notes', 's.unit', 'u.name as apprentice_name', 'u.email as apprentice_email');
  if (scope.reach !== 'company') q.where('x.apprentice_id', scope.userId);
  return q;
};

export async function createAttempt(
  {
    companyId,
    assignment,
    benchSessionId,
    faultId,
    treeVersionId = null,
  }: { companyId: string; assignment: Assignment; benchSessionId: string; faultId: string; treeVersionId?: string | null },
  trx: Knex = db,
): Promise<string> {
  const [row] = await trx('practice_attempts')
    .insert({
      company_id: companyId,
      assignment_id: assignment.id,
      scenario_id: assignment.scenarioId,
      apprentice_id: assignment.apprentice.id,
      bench_session_id: benchSessionId,
      fault_id: faultId,
      tree_version_id: treeVersionId,
    })
    .returning('id');
  return row.id as string;
}

export async function getAttempt({ scope, id }: { scope: Scope; id: string }, trx: Knex = db): Promise<Attempt> {
  if (!isUuid(id)) throw notFound('That attempt');
  const row = await attemptQuery(scope, trx).where('x.id', id).first();
  if (!row) throw notFound('That attempt');
  return toAttempt(row);
}

export async function listAttempts(
  { scope, scenarioId, apprenticeId }: { scope: Scope; scenarioId?: string; apprenticeId?: string },
  trx: Knex = db,
): Promise<Attempt[]> {
  const q = attemptQuery(scope, trx).orderBy('x.started_at', 'desc');
  if (scenarioId) q.where('x.scenario_id', scenarioId);
  if (apprenticeId) q.where('x.apprentice_id', apprenticeId);
  return (await q).map(toAttempt);
}

/** Record the finding and the score, once: a finished attempt is never scored again. */
export async function finishAttempt(
  { scope, id, findingStepId, score, finishedAt }: { scope: Scope; id: string; findingStepId: string; score: Score; finishedAt: Date },
  trx: Knex = db,
): Promise<Attempt> {
  const q = trx('practice_attempts')
    .where({ id, company_id: scope.companyId })
    .whereNull('finished_at')
    .update({ finding_step_id: findingStepId, score: JSON.stringify(score), finished_at: finishedAt });
  if (scope.reach !== 'company') q.where('apprentice_id', scope.userId);
  const changed = await q;
  if (changed === 0) throw new AppError('conflict', 'This attempt is already finished and scored.');
  return getAttempt({ scope, id }, trx);
}

/** An apprentice's real diagnoses at a finding that no technician has signed off yet. */
export async function listAwaitingSignOff(
  { companyId, apprenticeId }: { companyId: string; apprenticeId: string },
  trx: Knex = db,
): Promise<{ diagnosisId: string; findingTitle: string; site: string; at: Date }[]> {
  const rows = await trx('diagnoses as d')
    .join('service_calls as c', 'c.id', 'd.call_id')
    .join('units as un', 'un.id', 'c.unit_id')
    .join('sites as si', 'si.id', 'un.site_id')
    .join('tree_versions as tv', 'tv.id', 'd.tree_version_id')
    .where({ 'd.company_id': companyId, 'd.user_id': apprenticeId })
    .whereNotNull('d.finding_step_id')
    .whereNull('d.signed_off_by')
    .orderBy('d.started_at', 'desc')
    .select(
      'd.id',
      'd.finding_step_id',
      'd.started_at',
      'si.name as site',
      trx.raw(
        `(SELECT st->>'title' FROM jsonb_array_elements(tv.graph->'steps') st WHERE st->>'id' = d.finding_step_id LIMIT 1) AS finding_title`,
      ),
    );
  return rows.map((r: Record<string, unknown>) => ({
    diagnosisId: r.id as string,
    findingTitle: (r.finding_title as string | null) ?? (r.finding_step_id as string),
    site: r.site as string,
    at: r.started_at as Date,
  }));
}

/** The company's published version of the tree with this slug (the newest), or null. */
export async function getPublishedVersionId(
  { companyId, slug }: { companyId: string; slug: string },
  trx: Knex = db,
): Promise<string | null> {
  const row = await trx('tree_versions as v')
    .join('fault_trees as t', 't.id', 'v.tree_id')
    .where({ 't.company_id': companyId, 't.slug': slug, 'v.status': 'published' })
    .orderBy('v.version', 'desc')
    .first('v.id');
  return (row?.id as string | undefined) ?? null;
}

// ── The answers of a practice walk ──────────────────────────────────────────────────────────────

export interface PracticeAnswerRecord {
  attemptId: string;
  seq: number;
  clientId: string;
  stepId: string;
  /** The answer as the wizard reads it back (apiAnswerSchema's shape). */
  answer: Record<string, unknown>;
  /** The bench event the reading or look was checked against, if one was. */
  benchSeq: number | null;
  createdAt: Date;
}

const toAnswer = (r: Record<string, unknown>): PracticeAnswerRecord => ({
  attemptId: r.attempt_id as string,
  seq: r.seq as number,
  clientId: r.client_id as string,
  stepId: r.step_id as string,
  answer: r.answer as Record<string, unknown>,
  benchSeq: (r.bench_seq as number | null) ?? null,
  createdAt: r.created_at as Date,
});

/** The answers of an attempt, in order. The caller has checked the attempt is within reach. */
export async function listPracticeAnswers(
  { companyId, attemptId }: { companyId: string; attemptId: string },
  trx: Knex = db,
): Promise<PracticeAnswerRecord[]> {
  if (!isUuid(attemptId)) return [];
  const rows = await trx('practice_answers').where({ company_id: companyId, attempt_id: attemptId }).orderBy('seq');
  return rows.map(toAnswer);
}

/**
 * Appends an answer as the attempt's `seq`-th. Call it holding the attempt's bench session row lock
 * (answers and bench events line up behind it); the primary key refuses a seq taken meanwhile.
 */
export async function appendPracticeAnswer(
  { companyId, attemptId, seq, clientId, stepId, answer, benchSeq }: Omit<PracticeAnswerRecord, 'createdAt'> & { companyId: string },
  trx: Knex = db,
): Promise<PracticeAnswerRecord> {
  try {
    const [row] = await trx('practice_answers')
      .insert({
        company_id: companyId,
        attempt_id: attemptId,
        seq,
        client_id: clientId,
        step_id: stepId,
        answer: JSON.stringify(answer),
        bench_seq: benchSeq,
      })
      .returning('*');
    return toAnswer(row);
  } catch (error) {
    if ((error as { code?: string }).code === '23505') throw new AppError('conflict', 'The walk moved on meanwhile. Try again.');
    throw error;
  }
}

/** Takes back the attempt's last answer (an undo), if it is still `clientId`'s. */
export async function deleteLastPracticeAnswer(
  { companyId, attemptId, seq }: { companyId: string; attemptId: string; seq: number },
  trx: Knex = db,
): Promise<number> {
  return trx('practice_answers').where({ company_id: companyId, attempt_id: attemptId, seq }).delete();
}
