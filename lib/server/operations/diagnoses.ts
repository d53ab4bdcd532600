import 'server-only';
import { z } from 'zod';
import { listEscalations } from '@/db/diagnoses';
import { listTrees } from '@/db/trees';
import { answerDiagnosis, escalate, getDiagnosisView, signOffFinding, startDiagnosis, undoLastAnswer } from '@/lib/server/diagnoses';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import { readTreeVersion } from '@/lib/server/trees';
import {
  answerResultSchema,
  diagnosisViewSchema,
  escalationListSchema,
  startedDiagnosisSchema,
  treeListSchema,
  treeVersionOutSchema,
} from '@/lib/validations/api';
import { answerSchema, escalateSchema, signOffSchema, startDiagnosisSchema } from '@/lib/validations/field';

// POST /api/calls/{id}/diagnoses · startDiagnosisAction
export const startDiagnosisOp = defineOperation({
  name: 'diagnoses.start',
  input: startDiagnosisSchema.extend({ callId: recordId }),
  output: startedDiagnosisSchema,
  handler: async ({ scope, input }) => startDiagnosis({ scope, callId: input.callId, treeVersionId: input.treeVersionId }),
});

// GET /api/diagnoses/{id}
export const getDiagnosisOp = defineOperation({
  name: 'diagnoses.get',
  input: z.object({ id: recordId }),
  output: diagnosisViewSchema,
  handler: async ({ scope, input }) => getDiagnosisView({ scope, id: input.id }),
});

// POST /api/diagnoses/{id}/answers · submitAnswerAction
export const answerDiagnosisOp = defineOperation({
  name: 'diagnoses.answer',
  fieldsUnder: 'answer',
  input: z.object({ diagnosisId: recordId, answer: answerSchema }),
  output: answerResultSchema,
  handler: async ({ scope, input }) => answerDiagnosis({ scope, id: input.diagnosisId, input: input.answer }),
});

// DELETE /api/diagnoses/{id}/answers/last?last={clientId} · undoAnswerAction
export const undoAnswerOp = defineOperation({
  name: 'diagnoses.undo',
  input: z.object({
    diagnosisId: recordId,
    last: z.uuid({ error: 'last is the clientId of the answer you see as the last one.' }).optional(),
  }),
  output: diagnosisViewSchema,
  handler: async ({ scope, input }) => undoLastAnswer({ scope, id: input.diagnosisId, last: input.last }),
});

// POST /api/diagnoses/{id}/sign-off · signOffAction
export const signOffDiagnosisOp = defineOperation({
  name: 'diagnoses.signOff',
  input: signOffSchema.extend({ diagnosisId: recordId }),
  output: diagnosisViewSchema,
  handler: async ({ scope, input }) => signOffFinding({ scope, id: input.diagnosisId, comment: input.comment }),
});

// POST /api/diagnoses/{id}/escalate · escalateAction
export const escalateDiagnosisOp = defineOperation({
  name: 'diagnoses.escalate',
  input: escalateSchema.extend({ diagnosisId: recordId }),
  output: diagnosisViewSchema,
  handler: async ({ scope, input }) => escalate({ scope, id: input.diagnosisId, note: input.note }),
});

// GET /api/escalations
export const listEscalationsOp = defineOperation({
  name: 'diagnoses.escalations',
  input: noInput,
  output: escalationListSchema,
  handler: async ({ scope }) => listEscalations({ companyId: scope.companyId }),
});

// GET /api/trees
export const listTreesOp = defineOperation({
  name: 'trees.list',
  input: noInput,
  output: treeListSchema,
  handler: async ({ scope }) => listTrees({ companyId: scope.companyId }),
});

// GET /api/tree-versions/{id}
export const getTreeVersionOp = defineOperation({
  name: 'treeVersions.get',
  input: z.object({ id: recordId }),
  output: treeVersionOutSchema,
  // A draft or a version in review only for leads and admins (lib/server/trees.ts).
  handler: async ({ scope, user, input }) => readTreeVersion({ scope, role: user.role, id: input.id }),
});
