import 'server-only';
import { z } from 'zod';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import { diagnosisViewSchema } from '@/lib/validations/api';
import {
  addScenario,
  apprenticeProgress,
  attemptBenchAct,
  attemptBenchMeasure,
  attemptBenchObserve,
  attemptBenchState,
  assignToApprentices,
  answerMyAttempt,
  attemptDetail,
  finishMyAttempt,
  undoMyAnswer,
  myAssignments,
  practiceOverview,
  scenarioDetail,
  startAttempt,
} from '@/lib/server/practice';
import {
  assignmentSchema,
  attemptActionSchema,
  attemptMeasureSchema,
  attemptObserveSchema,
  benchActionReplySchema,
  benchMeasureReplySchema,
  benchObserveReplySchema,
  benchStateSchema,
  assignScenarioSchema,
  attemptSchema,
  createScenarioSchema,
  finishAttemptSchema,
  practiceAnswerResultSchema,
  practiceAnswerSchema,
  practiceOverviewSchema,
  progressSchema,
  scenarioDetailSchema,
  scenarioSchema,
  startedAttemptSchema,
} from '@/lib/validations/practice';

// GET /api/practice
export const practiceOverviewOp = defineOperation({
  name: 'practice.overview',
  input: noInput,
  output: practiceOverviewSchema,
  handler: async ({ scope }) => practiceOverview({ scope }),
});

// POST /api/practice/scenarios · createScenarioAction
export const createScenarioOp = defineOperation({
  name: 'practice.scenarios.create',
  input: createScenarioSchema,
  output: scenarioSchema,
  handler: async ({ user, input }) => addScenario({ user, input }),
});

// GET /api/practice/scenarios/{id}
export const getScenarioOp = defineOperation({
  name: 'practice.scenarios.get',
  input: z.object({ id: recordId }),
  output: scenarioDetailSchema,
  handler: async ({ scope, input }) => scenarioDetail({ scope, id: input.id }),
});

// POST /api/practice/scenarios/{id}/assignments · assignScenarioAction
export const assignScenarioOp = defineOperation({
  name: 'practice.scenarios.assign',
  fieldsUnder: 'assignment',
  input: z.object({ id: recordId, assignment: assignScenarioSchema }),
  output: z.object({ added: z.number() }),
  handler: async ({ user, input }) => assignToApprentices({ user, id: input.id, apprenticeIds: input.assignment.apprenticeIds }),
});

// GET /api/practice/assignments
export const listAssignmentsOp = defineOperation({
  name: 'practice.assignments.list',
  input: noInput,
  output: z.array(assignmentSchema),
  handler: async ({ scope }) => myAssignments({ scope }),
});

// POST /api/practice/assignments/{id}/attempts · startAttemptAction
export const startAttemptOp = defineOperation({
  name: 'practice.attempts.start',
  input: z.object({ id: recordId }),
  output: startedAttemptSchema,
  handler: async ({ user, scope, input }) => startAttempt({ user, scope, assignmentId: input.id }),
});

// GET /api/practice/attempts/{id}
export const getAttemptOp = defineOperation({
  name: 'practice.attempts.get',
  input: z.object({ id: recordId }),
  output: attemptSchema,
  handler: async ({ user, scope, input }) => attemptDetail({ user, scope, id: input.id }),
});

// POST /api/practice/attempts/{id}/finish · finishAttemptAction
export const finishAttemptOp = defineOperation({
  name: 'practice.attempts.finish',
  fieldsUnder: 'finding',
  input: z.object({ id: recordId, finding: finishAttemptSchema }),
  output: attemptSchema,
  handler: async ({ user, scope, input }) => finishMyAttempt({ user, scope, id: input.id, findingStepId: input.finding.findingStepId }),
});

// POST /api/practice/attempts/{id}/answers · practiceAnswerAction
export const answerAttemptOp = defineOperation({
  name: 'practice.attempts.answer',
  fieldsUnder: 'answer',
  input: z.object({ id: recordId, answer: practiceAnswerSchema }),
  output: practiceAnswerResultSchema,
  handler: async ({ user, scope, input }) => answerMyAttempt({ user, scope, id: input.id, input: input.answer }),
});

// DELETE /api/practice/attempts/{id}/answers/last?last={clientId} · practiceUndoAction
export const undoAttemptAnswerOp = defineOperation({
  name: 'practice.attempts.undo',
  input: z.object({
    id: recordId,
    last: z.uuid({ error: 'last is the clientId of the answer you see as the last one.' }).optional(),
  }),
  output: diagnosisViewSchema,
  handler: async ({ user, scope, input }) => undoMyAnswer({ user, scope, id: input.id, last: input.last }),
});

// GET /api/practice/apprentices/{id}
export const apprenticeProgressOp = defineOperation({
  name: 'practice.progress',
  input: z.object({ id: recordId }),
  output: progressSchema,
  handler: async ({ scope, input }) => apprenticeProgress({ scope, apprenticeId: input.id }),
});

// GET /api/practice/attempts/{id}/bench
export const attemptBenchStateOp = defineOperation({
  name: 'practice.bench.get',
  input: z.object({ id: recordId }),
  output: benchStateSchema,
  handler: async ({ user, scope, input }) => attemptBenchState({ user, scope, id: input.id }),
});

// POST /api/practice/attempts/{id}/bench/actions
export const attemptBenchActOp = defineOperation({
  name: 'practice.bench.act',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: attemptActionSchema }),
  output: benchActionReplySchema,
  handler: async ({ user, scope, input }) => attemptBenchAct({ user, scope, id: input.id }, input.body),
});

// POST /api/practice/attempts/{id}/bench/measure
export const attemptBenchMeasureOp = defineOperation({
  name: 'practice.bench.measure',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: attemptMeasureSchema }),
  output: benchMeasureReplySchema,
  handler: async ({ user, scope, input }) => attemptBenchMeasure({ user, scope, id: input.id }, input.body),
});

// POST /api/practice/attempts/{id}/bench/observe
export const attemptBenchObserveOp = defineOperation({
  name: 'practice.bench.observe',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: attemptObserveSchema }),
  output: benchObserveReplySchema,
  handler: async ({ user, scope, input }) => attemptBenchObserve({ user, scope, id: input.id }, input.body),
});
