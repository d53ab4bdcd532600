// The isolation check's wire shapes (GET /api/tree-versions/{id}/isolation-check): the query the
// route takes and the rows it answers. The tree editor's types come from here.
import { z } from 'zod';

const choice = <T extends string>(values: readonly [T, ...T[]], what: string) =>
  z.enum(values, { error: `${what} is one of ${values.join(', ')}.` }).optional();

/** The unit profile the faults run on; each field left out is the bench's default unit's. */
export const isolationQuerySchema = z.object({
  controlSupply: choice(['24v', 'line'], 'The control supply'),
  ignition: choice(['two-rod', 'single-rod'], 'The ignition'),
  fuel: choice(['natural-gas', 'lp'], 'The fuel'),
  draft: choice(['induced', 'natural'], 'The draft'),
  /** The control's own flame-signal test, on a single-rod unit. */
  flameTest: choice(['dc-test-terminals', 'status-light'], 'The flame-signal test'),
});
export type IsolationQuery = z.infer<typeof isolationQuerySchema>;

export const isolationRowSchema = z.object({
  faultId: z.string(),
  /** Beyond the contract: the fault's title, for the matrix on screen. */
  faultTitle: z.string(),
  expectedFindingTags: z.array(z.string()),
  /** The finding reached, or the step the run stopped at. */
  reachedStepId: z.string().nullable(),
  ok: z.boolean(),
  /** Why a row is not ok: the finding lacks tags, or the bench could not answer a step. */
  reason: z.string().optional(),
  unit: z.object({
    controlSupply: z.enum(['24v', 'line']),
    ignition: z.enum(['two-rod', 'single-rod']),
    fuel: z.enum(['natural-gas', 'lp']),
    draft: z.enum(['induced', 'natural']),
  }),
  /** The steps walked, each with the answer the bench gave. */
  path: z.array(z.object({ stepId: z.string(), answer: z.string() })),
});
export const isolationCheckSchema = z.array(isolationRowSchema);
export type IsolationRowOut = z.output<typeof isolationRowSchema>;
