import { z } from 'zod';
import { multiLine, objectError, singleLine } from '@/lib/validations/text';

/** A revision is a PostgreSQL integer: anything above never names one (and would not fit the column). */
const MAX_REVISION = 2_147_483_647;

// Inputs of tree authoring, shared by the editor's forms and the server. A draft is saved with its
// problems (the validator lists them), so a draft's graph is only checked for its outline here: an
// object with a start and a list of step objects. What a step must hold is the validator's business.

export const MAX_STEPS = 400;

export const draftGraphSchema = z.object(
  {
    start: z.string({ error: 'The graph needs its start step id.' }).max(100, { error: 'The start step id is at most 100 characters.' }),
    steps: z
      .array(z.record(z.string(), z.unknown(), { error: 'Each step must be an object.' }), { error: 'The graph needs a list of steps.' })
      .max(MAX_STEPS, { error: `A tree has at most ${MAX_STEPS} steps.` }),
    afterRepair: z.array(z.unknown(), { error: 'afterRepair must be a list.' }).max(50).optional(),
  },
  { error: objectError('the graph') },
);
export type DraftGraph = z.infer<typeof draftGraphSchema>;

const slug = z
  .string({ error: 'The short name must be text.' })
  .regex(/^[a-z0-9][a-z0-9-]{0,62}$/, { error: 'The short name is lower-case letters, digits and dashes (at most 63).' });

export const createTreeSchema = z.object(
  {
    title: singleLine({ label: 'The title', max: 200, required: 'Give the tree a title.' }),
    symptom: singleLine({ label: 'The symptom', max: 200, required: 'Say which symptom the tree starts from (e.g. "No heat").' }),
    equipmentKind: singleLine({ label: 'The equipment kind', max: 100, required: 'Say which equipment the tree is for.' }),
    /** Derived from the title when left out. */
    slug: slug.optional(),
  },
  { error: objectError('the tree') },
);
export type CreateTreeInput = z.infer<typeof createTreeSchema>;

/** Neither field: a draft from scratch. `fromVersionId`: a copy of that version. `fromBuiltin`: the product's current built-in revision. */
export const startDraftSchema = z
  .object(
    {
      fromVersionId: z.uuid({ error: 'fromVersionId is the id of a version of this tree.' }).optional(),
      fromBuiltin: z.boolean({ error: 'fromBuiltin is true or false.' }).optional(),
    },
    { error: objectError('the draft') },
  )
  .refine((v) => !(v.fromVersionId && v.fromBuiltin), { error: 'Start from a version or from the built-in tree, not both.' });

export const saveDraftSchema = z.object(
  {
    baseRevision: z
      .number({ error: 'baseRevision is the revision your edit started from.' })
      .int()
      .min(1)
      .max(MAX_REVISION, { error: 'baseRevision is not a revision of this draft.' }),
    graph: draftGraphSchema,
  },
  { error: objectError('the save') },
);
export type SaveDraftInput = z.infer<typeof saveDraftSchema>;

export const reviewCommentSchema = z.object(
  {
    stepId: z.string({ error: 'stepId must be text.' }).max(100).optional(),
    text: multiLine({ label: 'The comment', max: 2000, required: 'Write the comment.' }),
  },
  { error: objectError('the comment') },
);

export const returnVersionSchema = z.object(
  {
    comments: z
      .array(reviewCommentSchema, { error: 'comments is a list of { stepId?, text }.' })
      .min(1, { error: 'Say what to change: at least one comment.' })
      .max(200, { error: 'At most 200 comments.' }),
  },
  { error: objectError('the return') },
);

/** Submitting names the revision the lead saw, so a save landing in between is not submitted unseen. */
export const submitVersionSchema = z.object(
  { revision: z.number().int().min(1).max(MAX_REVISION).optional() },
  { error: objectError('the request') },
);

export const diffQuerySchema = z.object({
  against: z.union([z.literal('builtin'), z.string().max(100)], { error: 'against is the id of the other version, or "builtin".' }),
});

export const importTreeSchema = z.object(
  { document: z.unknown().refine((d) => d !== undefined, { error: 'Send the exported document as "document".' }) },
  { error: objectError('the import') },
);

/**
 * One version waiting on a lead (a lead's home): submitted by someone else for review, or approved
 * and not yet published. The service parses what it returns through it, and the home page's list
 * takes its type from it.
 */
export const waitingReviewSchema = z.object({
  id: z.string(),
  treeId: z.string(),
  title: z.string(),
  version: z.number().int(),
  status: z.enum(['in_review', 'approved']),
  submittedAt: z.date().nullable(),
  submittedBy: z.string().nullable(),
});
export const waitingReviewListSchema = z.array(waitingReviewSchema);
export type WaitingReview = z.output<typeof waitingReviewSchema>;
