import 'server-only';
import { z } from 'zod';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import {
  approveVersion,
  createTree,
  diffVersions,
  exportVersion,
  getTreeForAuthoring,
  getVersionForAuthoring,
  importTree,
  listTreesForAuthoring,
  publishVersion,
  returnVersion,
  saveDraft,
  startDraft,
  submitVersion,
  validateVersion,
} from '@/lib/server/trees';
import { getCompanyTreeUsage, getTreeUsage } from '@/lib/server/tree-usage';
import {
  authoringTreeListSchema,
  companyTreeUsageSchema,
  authoringVersionSchema,
  createdDraftSchema,
  saveDraftResultSchema,
  treeDetailSchema,
  treeDiffSchema,
  treeDocumentOutSchema,
  treeUsageSchema,
  treeValidationSchema,
  versionTransitionSchema,
} from '@/lib/validations/api';
import {
  createTreeSchema,
  diffQuerySchema,
  importTreeSchema,
  returnVersionSchema,
  saveDraftSchema,
  startDraftSchema,
  submitVersionSchema,
} from '@/lib/validations/trees';

// Tree authoring (issue 8): the routes under /api/trees and /api/tree-versions/{id}, and the editor's actions.

// Pages: the tree list of authoring
export const listAuthoringTreesOp = defineOperation({
  name: 'trees.authoring',
  input: noInput,
  output: authoringTreeListSchema,
  handler: async ({ scope }) => listTreesForAuthoring({ scope }),
});

// Pages: one tree with its versions and audit trail
export const getTreeDetailOp = defineOperation({
  name: 'trees.get',
  input: z.object({ treeId: recordId }),
  output: treeDetailSchema,
  handler: async ({ scope, input }) => getTreeForAuthoring({ scope, treeId: input.treeId }),
});

// Pages: one version for the editor or a review
export const getAuthoringVersionOp = defineOperation({
  name: 'treeVersions.authoring',
  input: z.object({ id: recordId }),
  output: authoringVersionSchema,
  handler: async ({ scope, input }) => getVersionForAuthoring({ scope, id: input.id }),
});

// POST /api/trees · createTreeAction
export const createTreeOp = defineOperation({
  name: 'trees.create',
  input: createTreeSchema,
  output: createdDraftSchema,
  handler: async ({ scope, input }) => createTree({ scope, input }),
});

// POST /api/trees/{id}/drafts · startDraftAction
export const startDraftOp = defineOperation({
  name: 'trees.startDraft',
  fieldsUnder: 'draft',
  input: z.object({ treeId: recordId, draft: startDraftSchema.default({}) }),
  output: createdDraftSchema,
  handler: async ({ scope, input }) => startDraft({ scope, treeId: input.treeId, ...input.draft }),
});

// PUT /api/tree-versions/{id} · saveDraftAction
export const saveDraftOp = defineOperation({
  name: 'treeVersions.save',
  input: saveDraftSchema.extend({ id: recordId }),
  output: saveDraftResultSchema,
  handler: async ({ scope, input }) => saveDraft({ scope, id: input.id, baseRevision: input.baseRevision, graph: input.graph }),
});

// POST /api/tree-versions/{id}/submit · submitDraftAction
export const submitVersionOp = defineOperation({
  name: 'treeVersions.submit',
  input: submitVersionSchema.extend({ id: recordId }),
  output: versionTransitionSchema,
  handler: async ({ scope, user, input }) => submitVersion({ scope, id: input.id, revision: input.revision, who: user.name }),
});

// POST /api/tree-versions/{id}/approve · approveVersionAction
export const approveVersionOp = defineOperation({
  name: 'treeVersions.approve',
  input: z.object({ id: recordId }),
  output: versionTransitionSchema,
  handler: async ({ scope, input }) => approveVersion({ scope, id: input.id }),
});

// POST /api/tree-versions/{id}/return · returnVersionAction
export const returnVersionOp = defineOperation({
  name: 'treeVersions.return',
  input: returnVersionSchema.extend({ id: recordId }),
  output: versionTransitionSchema,
  handler: async ({ scope, input }) => returnVersion({ scope, id: input.id, comments: input.comments }),
});

// POST /api/tree-versions/{id}/publish · publishVersionAction
export const publishVersionOp = defineOperation({
  name: 'treeVersions.publish',
  input: z.object({ id: recordId }),
  output: versionTransitionSchema,
  handler: async ({ scope, input }) => publishVersion({ scope, id: input.id }),
});

// GET /api/tree-versions/{id}/validation
export const validateVersionOp = defineOperation({
  name: 'treeVersions.validation',
  input: z.object({ id: recordId }),
  output: treeValidationSchema,
  handler: async ({ scope, input }) => validateVersion({ scope, id: input.id }),
});

// GET /api/tree-versions/{id}/diff?against={otherId|builtin}
export const diffVersionsOp = defineOperation({
  name: 'treeVersions.diff',
  input: diffQuerySchema.extend({ id: recordId }),
  output: treeDiffSchema,
  handler: async ({ scope, input }) => diffVersions({ scope, id: input.id, against: input.against }),
});

// GET /api/tree-versions/{id}/export
export const exportVersionOp = defineOperation({
  name: 'treeVersions.export',
  input: z.object({ id: recordId }),
  output: treeDocumentOutSchema,
  handler: async ({ scope, input }) => exportVersion({ scope, id: input.id }),
});

// POST /api/trees/import · importTreeAction
export const importTreeOp = defineOperation({
  name: 'trees.import',
  input: importTreeSchema,
  output: createdDraftSchema,
  handler: async ({ scope, input }) => importTree({ scope, document: input.document }),
});

// GET /api/trees/{id}/usage
export const treeUsageOp = defineOperation({
  name: 'trees.usage',
  input: z.object({ treeId: recordId }),
  output: treeUsageSchema,
  handler: async ({ scope, input }) => getTreeUsage({ scope, treeId: input.treeId }),
});

// GET /api/trees/usage
export const companyTreeUsageOp = defineOperation({
  name: 'trees.companyUsage',
  input: noInput,
  output: companyTreeUsageSchema,
  handler: async ({ scope }) => getCompanyTreeUsage({ scope }),
});
