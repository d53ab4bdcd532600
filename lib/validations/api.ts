// Output schemas: what every operation sends back, as its route handler (JSON) and its server action
// (the same object) deliver it. The server parses each result through its schema, which drops any
// field the schema does not name and turns dates into ISO strings; the client takes its types from
// the same schemas (`z.output<…>`), so a wire type is never copied by hand.
import { z } from 'zod';
import type { ErrorCode } from '@/lib/errors';
import { ROLES } from '@/lib/roles';
import { CALL_STATUSES } from '@/lib/validations/field';
import {
  actionStepSchema,
  cautionSchema,
  factStepSchema,
  findingStepSchema,
  inspectStepSchema,
  measureStepSchema,
  quantitySchema,
} from '@/lib/trees/schema';

/** A Date on the server, an ISO 8601 string on the wire. */
export const isoDate = z.union([z.date(), z.string()]).transform((d) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString()));
const optionalDate = isoDate.nullable();

const roleSchema = z.enum(ROLES);
const callStatusSchema = z.enum(CALL_STATUSES);
const diagnosisStatusSchema = z.enum(['in_progress', 'found', 'verified', 'escalated']);
/** The electric state as the first clients read it ("energized" / "locked-out"); `gas` beside it. */
const energySchema = z.enum(['energized', 'locked-out']);
const gasSchema = z.enum(['on', 'off']);

// ── Results every action shares ─────────────────────────────────────────────────────────────────

/** What a server action returns: its output, or why not (the same code a route handler maps to a status). */
export type ActionResult<T> =
  { ok: true; data: T } | { ok: false; code: ErrorCode; message: string; fieldErrors?: Record<string, string[]>; retryAfter?: number };

// ── People and company ──────────────────────────────────────────────────────────────────────────

export const publicUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  company: z.object({ id: z.string(), name: z.string() }),
});
export type PublicUser = z.output<typeof publicUserSchema>;

export const adminUserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: roleSchema,
  active: z.boolean(),
  createdAt: isoDate,
});
export type AdminUser = z.output<typeof adminUserSchema>;

export const companySchema = z.object({
  id: z.string(),
  name: z.string(),
  officeEmail: z.string(),
  displayUnits: z.enum(['us', 'metric']),
  timeZone: z.string(),
});
export type CompanyOut = z.output<typeof companySchema>;

export const healthSchema = z.object({ ok: z.boolean(), db: z.enum(['up', 'down']) });

/** Nothing to send back (the route answers 204). */
export const emptySchema = z.undefined();

// ── Sites and units ─────────────────────────────────────────────────────────────────────────────

export const siteOutSchema = z.object({
  id: z.string(),
  name: z.string(),
  address: z.string(),
  contactEmail: z.string().nullable(),
});
export type SiteOut = z.output<typeof siteOutSchema>;

export const unitOutSchema = z.object({
  id: z.string(),
  siteId: z.string(),
  siteName: z.string(),
  siteAddress: z.string(),
  label: z.string(),
  ignition: z.enum(['two-rod', 'single-rod']),
  fuel: z.enum(['natural-gas', 'lp']),
  controlSupply: z.enum(['24v', 'line']),
  draft: z.enum(['induced', 'natural']),
  transformerVa: z.number(),
  installYear: z.number().nullable(),
});
export type UnitOut = z.output<typeof unitOutSchema>;

export const unitReadingSchema = z.object({
  answerId: z.string(),
  callId: z.string(),
  diagnosisId: z.string(),
  stepId: z.string(),
  stepTitle: z.string().nullable(),
  quantity: z.string(),
  value: z.number(),
  text: z.string().nullable(),
  unit: z.string().nullable(),
  bandLabel: z.string().nullable(),
  verdict: z.string().nullable(),
  takenAt: isoDate,
});

export const unitHistorySchema = unitOutSchema.extend({
  readings: z.array(unitReadingSchema),
  calls: z.array(
    z.object({ id: z.string(), complaint: z.string(), status: callStatusSchema, openedAt: isoDate, technicianName: z.string().nullable() }),
  ),
});

// ── Service calls ───────────────────────────────────────────────────────────────────────────────

export const verificationSchema = z.object({
  cycles: z.number(),
  flameSignal: z.object({ text: z.string(), value: z.number() }).nullable(),
  checks: z.array(z.object({ text: z.string(), done: z.boolean() })),
  notes: z.string().optional(),
});

export const serviceCallSchema = z.object({
  id: z.string(),
  unitId: z.string(),
  unitLabel: z.string(),
  siteId: z.string(),
  siteName: z.string(),
  siteAddress: z.string(),
  complaint: z.string(),
  status: callStatusSchema,
  technicianId: z.string().nullable(),
  technicianName: z.string().nullable(),
  technicianRole: roleSchema.nullable(),
  repairNotes: z.string().nullable(),
  verification: verificationSchema.nullable(),
  openedAt: isoDate,
  closedAt: optionalDate,
  closedByName: z.string().nullable(),
});
export type ServiceCallOut = z.output<typeof serviceCallSchema>;

export const callDetailSchema = serviceCallSchema.extend({
  unit: unitOutSchema,
  diagnoses: z.array(
    z.object({
      id: z.string(),
      status: diagnosisStatusSchema,
      treeVersionId: z.string(),
      findingStepId: z.string().nullable(),
      startedBy: z.string().nullable(),
      startedAt: isoDate,
      signedOffBy: z.string().nullable(),
    }),
  ),
});

export const callStatusResultSchema = z.object({ id: z.string(), status: callStatusSchema });

// ── Steps, answers and diagnoses ────────────────────────────────────────────────────────────────

// A step as the API sends it: the tree's own step, with the measure step's canonical unit and
// without what only the server needs (a finding's expectations).
// The steps the diagnosis inserts (energy procedures, the repair's checks, readings retaken after
// it) have state ids built from tree step ids ("gas-on+re-energize--recheck--flame-signal--f-…"),
// so the id, and an action's outcome, are any string here, not a tree step id.
const stateId = z.string().min(1);
export const apiStepSchema = z.discriminatedUnion('kind', [
  measureStepSchema.extend({ unit: z.string(), id: stateId }),
  inspectStepSchema,
  actionStepSchema.extend({ id: stateId, outcome: stateId }),
  factStepSchema,
  findingStepSchema.omit({ expects: true }),
]);
export type ApiStep = z.output<typeof apiStepSchema>;
export const apiFindingSchema = findingStepSchema.omit({ expects: true });

export const apiAnswerSchema = z.object({
  id: z.string(),
  clientId: z.string(),
  seq: z.number(),
  stepId: z.string(),
  stepTitle: z.string(),
  kind: z.string(),
  text: z.string().nullable(),
  value: z.number().nullable(),
  unit: z.string().nullable(),
  quantity: quantitySchema.nullable(),
  band: z.string().nullable(),
  bandIndex: z.number().nullable(),
  verdict: z.string().nullable(),
  choice: z.string().nullable(),
  choiceLabel: z.string().nullable(),
  confirmed: z.boolean().nullable(),
  /** An ohms reading over the meter's range ("OL"): stored without a value. */
  overRange: z.boolean(),
  /** A unit-record branch the diagnosis took by itself (kind "fact"): not the technician's answer. */
  auto: z.boolean(),
  at: isoDate,
});
export type ApiAnswer = z.output<typeof apiAnswerSchema>;

export const contradictionSchema = z.object({
  stepId: z.string(),
  value: z.number(),
  expected: z.object({ from: z.number().optional(), to: z.number().optional() }),
  reason: z.string(),
  takenAt: z.string().optional(),
});
export type Contradiction = z.output<typeof contradictionSchema>;

export const diagnosisViewSchema = z.object({
  id: z.string(),
  callId: z.string(),
  status: diagnosisStatusSchema,
  treeVersionId: z.string(),
  tree: z.object({ title: z.string(), version: z.number() }),
  startedBy: z.object({ id: z.string().nullable(), name: z.string().nullable(), role: roleSchema.nullable() }),
  signedOff: z.object({ by: z.string().nullable(), at: optionalDate }).nullable(),
  energy: energySchema,
  gas: gasSchema,
  /** Where the visit stands: walking the tree, at the repair, retaking readings, verifying, done. */
  phase: z.enum(['walk', 'procedure', 'repair', 'reconnect', 'recheck', 'verify', 'done']),
  escalation: z.object({ note: z.string(), by: z.string().nullable(), at: optionalDate }).nullable(),
  path: z.array(apiAnswerSchema),
  current: apiStepSchema.nullable(),
  finding: apiFindingSchema.nullable(),
  contradictions: z.array(contradictionSchema),
  callStatus: callStatusSchema,
});
export type DiagnosisViewOut = z.output<typeof diagnosisViewSchema>;

export const startedDiagnosisSchema = z.object({ id: z.string(), step: apiStepSchema });

/**
 * What a save answers: the stored answer, where the walk goes next, and what the wizard would
 * otherwise fetch the whole diagnosis for (its status and energy state, the contradictions once a
 * finding is reached).
 */
export const answerResultSchema = z.object({
  answer: apiAnswerSchema,
  next: apiStepSchema.nullable(),
  finding: apiFindingSchema.nullable(),
  verdict: z.object({ band: z.string(), outcome: z.string(), position: z.number(), verdict: z.string(), value: z.number() }).optional(),
  diagnosis: z.object({
    status: diagnosisStatusSchema,
    energy: energySchema,
    gas: gasSchema,
    phase: z.enum(['walk', 'procedure', 'repair', 'reconnect', 'recheck', 'verify', 'done']),
    contradictions: z.array(contradictionSchema),
  }),
  /** Unit-record branches the diagnosis took by itself after this answer, in order. */
  auto: z.array(apiAnswerSchema).default([]),
});
export type AnswerResult = z.output<typeof answerResultSchema>;

/** The service report (web page and PDF, customer and office versions): the call with each diagnosis's path, finding and the cautions observed. */
export const callReportSchema = z.object({
  company: z.object({ name: z.string(), officeEmail: z.string().nullable(), timeZone: z.string() }),
  call: serviceCallSchema,
  unit: unitOutSchema.pick({
    label: true,
    ignition: true,
    fuel: true,
    controlSupply: true,
    draft: true,
    transformerVa: true,
    installYear: true,
  }),
  site: siteOutSchema,
  diagnoses: z.array(
    z.object({
      id: z.string(),
      status: diagnosisStatusSchema,
      treeTitle: z.string(),
      treeVersion: z.number(),
      startedBy: z.string().nullable(),
      startedByRole: roleSchema.nullable(),
      startedAt: isoDate,
      signedOff: z.object({ by: z.string().nullable(), at: optionalDate }).nullable(),
      finding: z.object({ title: z.string() }).nullable(),
      findingDetail: apiFindingSchema.nullable(),
      contradictions: z.array(contradictionSchema),
      steps: z.array(
        apiAnswerSchema.extend({
          instruction: z.string(),
          points: z.tuple([z.string(), z.string()]).nullable(),
          checklist: z.array(z.string()),
          /** An energy procedure the diagnosis inserted, by what it did. */
          procedure: z.enum(['lock-out', 're-energize', 'energy']).nullable(),
        }),
      ),
    }),
  ),
  cautions: z.array(cautionSchema),
  reasons: z.array(z.object({ kind: z.enum(['referred', 'reopened']), at: isoDate, by: z.string().nullable(), note: z.string() })),
  /** Who did what to the call (the office record): referred, closed, reopened, reassigned, signed off. */
  events: z.array(
    z.object({
      id: z.string(),
      kind: z.enum(['closed', 'referred', 'reopened', 'reassigned', 'signed_off']),
      at: isoDate,
      actorName: z.string().nullable(),
      note: z.string().nullable(),
      fromName: z.string().nullable(),
      toName: z.string().nullable(),
    }),
  ),
  /** Photos of the call, its readings and findings (ids for /api/attachments/{id}), oldest first. */
  photos: z.array(z.object({ id: z.string(), answerId: z.string().nullable(), caption: z.string().nullable() })).default([]),
});
export type CallReportOut = z.output<typeof callReportSchema>;

export const escalationListSchema = z.array(
  z.object({
    diagnosisId: z.string(),
    callId: z.string(),
    note: z.string(),
    at: isoDate,
    by: z.string().nullable(),
    unit: z.string(),
    site: z.string(),
  }),
);
export type EscalationOut = z.output<typeof escalationListSchema>[number];

// ── Trees ───────────────────────────────────────────────────────────────────────────────────────

export const treeListSchema = z.array(
  z.object({
    id: z.string(),
    slug: z.string(),
    title: z.string(),
    published: z.object({ id: z.string(), version: z.number() }).nullable(),
  }),
);

export const treeVersionStatusSchema = z.enum(['draft', 'in_review', 'approved', 'published', 'retired']);
export type TreeVersionStatusOut = z.output<typeof treeVersionStatusSchema>;

/** A draft's graph as stored: it may not pass the tree schema yet (the validator lists why). */
const storedGraphSchema = z.object({
  start: z.string(),
  steps: z.array(z.record(z.string(), z.unknown())),
  afterRepair: z.array(z.unknown()).optional(),
});

export const treeVersionOutSchema = z.object({
  id: z.string(),
  treeId: z.string(),
  slug: z.string(),
  title: z.string(),
  version: z.number(),
  status: treeVersionStatusSchema,
  /** Raised by every save of a draft; a save sends the revision it was based on. */
  revision: z.number(),
  publishedAt: optionalDate,
  graph: z.object({ start: z.string(), steps: z.array(apiStepSchema) }),
});

const personSchema = z.object({ id: z.string(), name: z.string() }).nullable();
const problemSchema = z.object({ stepId: z.string().optional(), message: z.string() });
export type TreeProblemOut = z.output<typeof problemSchema>;
const reviewCommentOutSchema = z.object({ stepId: z.string().optional(), text: z.string() });

/** A version as the editor and the tree page see it, with its graph as stored and its problems. */
export const authoringVersionSchema = z.object({
  id: z.string(),
  treeId: z.string(),
  slug: z.string(),
  title: z.string(),
  version: z.number(),
  status: treeVersionStatusSchema,
  revision: z.number(),
  graph: storedGraphSchema,
  problems: z.array(problemSchema),
  basedOnId: z.string().nullable(),
  fromBuiltinRevision: z.number().nullable(),
  builtinRevision: z.number().nullable(),
  author: personSchema,
  updatedBy: personSchema,
  updatedAt: isoDate,
  submittedBy: personSchema,
  submittedAt: optionalDate,
  approvedBy: personSchema,
  approvedAt: optionalDate,
  publishedBy: personSchema,
  publishedAt: optionalDate,
  returnedBy: personSchema,
  returnedAt: optionalDate,
  reviewComments: z.array(reviewCommentOutSchema),
  createdAt: isoDate,
});
export type AuthoringVersionOut = z.output<typeof authoringVersionSchema>;

/** POST /api/trees, POST /api/trees/{id}/drafts, POST /api/trees/import. */
export const createdDraftSchema = z.object({
  treeId: z.string(),
  id: z.string(),
  version: z.number(),
  revision: z.number(),
  status: z.literal('draft'),
});
export type CreatedDraftOut = z.output<typeof createdDraftSchema>;

/**
 * PUT /api/tree-versions/{id}: saved (200, or 422 with the problems the draft still has), or stale
 * (409: someone saved since `baseRevision`; the current graph and revision come back to merge or reload).
 */
export const saveDraftResultSchema = z.discriminatedUnion('outcome', [
  z.object({
    outcome: z.literal('saved'),
    id: z.string(),
    status: z.literal('draft'),
    revision: z.number(),
    updatedAt: isoDate,
    problems: z.array(problemSchema),
  }),
  z.object({
    outcome: z.literal('stale'),
    id: z.string(),
    message: z.string(),
    current: z.object({ revision: z.number(), graph: storedGraphSchema, updatedBy: personSchema, updatedAt: isoDate }),
  }),
]);
export type SaveDraftResultOut = z.output<typeof saveDraftResultSchema>;

/** The answer of submit, approve, return and publish: where the version stands now. */
export const versionTransitionSchema = z.object({
  id: z.string(),
  treeId: z.string(),
  status: treeVersionStatusSchema,
  revision: z.number(),
  /** The version publishing retired, if any. */
  retiredId: z.string().nullable().optional(),
});
export type VersionTransitionOut = z.output<typeof versionTransitionSchema>;

export const treeValidationSchema = z.object({ id: z.string(), revision: z.number(), ok: z.boolean(), problems: z.array(problemSchema) });
export type TreeValidationOut = z.output<typeof treeValidationSchema>;

const stepRefSchema = z.object({ stepId: z.string(), kind: z.string(), title: z.string() });
const fieldChangeSchema = z.object({ field: z.string(), before: z.string(), after: z.string() });
export const treeDiffSchema = z.object({
  from: z.object({ id: z.string(), label: z.string() }),
  to: z.object({ id: z.string(), label: z.string() }),
  start: z.object({ before: z.string(), after: z.string() }).nullable(),
  added: z.array(stepRefSchema),
  removed: z.array(stepRefSchema),
  changed: z.array(stepRefSchema.extend({ fields: z.array(fieldChangeSchema) })),
  rewired: z.array(z.object({ stepId: z.string(), via: z.string(), before: z.string().nullable(), after: z.string().nullable() })),
  afterRepair: fieldChangeSchema.nullable(),
});
export type TreeDiffOut = z.output<typeof treeDiffSchema>;

/** GET /api/tree-versions/{id}/export: the document of lib/trees/document.ts, passed through as built. */
export const treeDocumentOutSchema = z.object({
  format: z.string(),
  formatVersion: z.number(),
  tree: z.object({ slug: z.string(), title: z.string(), symptom: z.string(), equipmentKind: z.string() }),
  source: z.object({ version: z.number(), exportedAt: z.string() }).optional(),
  graph: z.looseObject({ start: z.string(), steps: z.array(z.looseObject({ id: z.string() })) }),
});

const treeEventSchema = z.object({
  id: z.string(),
  versionId: z.string().nullable(),
  version: z.number().nullable(),
  kind: z.string(),
  user: personSchema,
  detail: z.record(z.string(), z.unknown()),
  at: isoDate,
});
export type TreeEventOut = z.output<typeof treeEventSchema>;

const builtinUpdateSchema = z.object({ revision: z.number(), title: z.string(), publishedVersionId: z.string() }).nullable();

/** The tree list of authoring: published version, drafts and reviews open, who edits, last change. */
export const authoringTreeListSchema = z.array(
  z.object({
    id: z.string(),
    slug: z.string(),
    title: z.string(),
    symptom: z.string(),
    equipmentKind: z.string(),
    published: z.object({ id: z.string(), version: z.number(), publishedAt: optionalDate }).nullable(),
    openVersions: z.array(
      z.object({
        id: z.string(),
        version: z.number(),
        status: treeVersionStatusSchema,
        revision: z.number(),
        author: personSchema,
        updatedBy: personSchema,
        updatedAt: isoDate,
      }),
    ),
    lastChange: z.object({ kind: z.string(), user: personSchema, at: isoDate }).nullable(),
    builtinUpdate: builtinUpdateSchema,
  }),
);
export type AuthoringTreeOut = z.output<typeof authoringTreeListSchema>[number];

/** One tree's page: its versions (newest first), the audit trail, and a built-in update if any. */
export const treeDetailSchema = z.object({
  id: z.string(),
  slug: z.string(),
  title: z.string(),
  symptom: z.string(),
  equipmentKind: z.string(),
  versions: z.array(authoringVersionSchema.omit({ graph: true, problems: true })),
  events: z.array(treeEventSchema),
  builtinUpdate: builtinUpdateSchema,
});
export type TreeDetailOut = z.output<typeof treeDetailSchema>;

/** GET /api/trees/{id}/usage: how diagnoses went on each published (or retired) version. */
export const treeUsageSchema = z.object({
  tree: z.object({ id: z.string(), title: z.string() }),
  abandonedAfterDays: z.number(),
  versions: z.array(
    z.object({
      id: z.string(),
      version: z.number(),
      status: z.string(),
      publishedAt: optionalDate,
      diagnoses: z.number(),
      inProgress: z.number(),
      found: z.number(),
      escalated: z.number(),
      findings: z.array(z.object({ stepId: z.string(), title: z.string(), count: z.number() })),
      stops: z.array(z.object({ stepId: z.string(), title: z.string(), escalated: z.number(), abandoned: z.number() })),
    }),
  ),
});
export type TreeUsageOut = z.output<typeof treeUsageSchema>;

/** GET /api/trees/usage: the company's findings per month, first-time fix, time to a finding. */
export const companyTreeUsageSchema = z.object({
  months: z.array(
    z.object({
      month: z.string(),
      total: z.number(),
      findings: z.array(z.object({ stepId: z.string(), title: z.string(), count: z.number() })),
    }),
  ),
  firstTimeFix: z.object({
    windowDays: z.number(),
    closed: z.number(),
    returned: z.number(),
    windowOpen: z.number(),
    rate: z.number().nullable(),
  }),
  timeToFinding: z.object({ medianSeconds: z.number().nullable(), diagnoses: z.number() }),
});
export type CompanyTreeUsageOut = z.output<typeof companyTreeUsageSchema>;
