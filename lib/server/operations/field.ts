import 'server-only';
import { z } from 'zod';
import { createSite, listSites } from '@/db/sites';
import { createUnit, listUnits, updateUnitFacts } from '@/db/units';
import {
  findCalls,
  finishCall,
  getCallDetail,
  getUnitWithHistory,
  openCall,
  reassignCall,
  reopenClosedCall,
  saveRepair,
} from '@/lib/server/calls';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import { callDetailSchema, serviceCallSchema, siteOutSchema, unitHistorySchema, unitOutSchema } from '@/lib/validations/api';
import {
  assignCallSchema,
  callFilterSchema,
  callSchema,
  closeCallSchema,
  reopenCallSchema,
  repairSchema,
  siteSchema,
  unitFactsShape,
  unitSchema,
} from '@/lib/validations/field';

// GET /api/sites
export const listSitesOp = defineOperation({
  name: 'sites.list',
  input: noInput,
  output: z.array(siteOutSchema),
  handler: async ({ scope }) => listSites({ companyId: scope.companyId }),
});

// POST /api/sites · createSiteAction
export const createSiteOp = defineOperation({
  name: 'sites.create',
  input: siteSchema,
  output: siteOutSchema,
  handler: async ({ scope, input }) => createSite({ companyId: scope.companyId, ...input }),
});

// GET /api/units
export const listUnitsOp = defineOperation({
  name: 'units.list',
  input: noInput,
  output: z.array(unitOutSchema),
  handler: async ({ scope }) => listUnits({ companyId: scope.companyId }),
});

// POST /api/units · createUnitAction
export const createUnitOp = defineOperation({
  name: 'units.create',
  input: unitSchema,
  output: unitOutSchema,
  handler: async ({ scope, input }) => createUnit({ companyId: scope.companyId, input }),
});

// PATCH /api/units/{id} · correctUnitAction: what the unit record says of its ignition, fuel,
// control supply or draft, corrected at the unit. A diagnosis keeps the branches it already took.
export const correctUnitOp = defineOperation({
  name: 'units.correct',
  input: z
    .strictObject({ ...unitFactsShape, id: recordId }, { error: 'Send the corrected facts of the unit record as a JSON object.' })
    .refine((f) => Object.keys(unitFactsShape).some((k) => f[k as keyof typeof unitFactsShape] !== undefined), {
      message: 'Say which fact of the unit record to correct.',
    }),
  output: unitOutSchema,
  handler: async ({ scope, input }) => {
    const { id, ...facts } = input;
    return updateUnitFacts({ companyId: scope.companyId, id, facts });
  },
});

// GET /api/units/{id}
export const getUnitOp = defineOperation({
  name: 'units.get',
  input: z.object({ id: recordId }),
  output: unitHistorySchema,
  handler: async ({ scope, input }) => {
    const { unit, readings, calls } = await getUnitWithHistory({ scope, id: input.id });
    return { ...unit, readings, calls };
  },
});

// GET /api/calls?status=&technician=
export const listCallsOp = defineOperation({
  name: 'calls.list',
  input: callFilterSchema,
  output: z.array(serviceCallSchema),
  handler: async ({ scope, input }) => findCalls({ scope, ...input }),
});

// POST /api/calls · createCallAction
export const createCallOp = defineOperation({
  name: 'calls.create',
  input: callSchema,
  output: serviceCallSchema,
  handler: async ({ scope, input }) => openCall({ scope, input }),
});

// GET /api/calls/{id}
export const getCallOp = defineOperation({
  name: 'calls.get',
  input: z.object({ id: recordId }),
  output: callDetailSchema,
  handler: async ({ scope, input }) => {
    const { call, unit, diagnoses } = await getCallDetail({ scope, id: input.id });
    return {
      ...call,
      unit,
      diagnoses: diagnoses.map((d) => ({
        id: d.id,
        status: d.status,
        treeVersionId: d.treeVersionId,
        findingStepId: d.findingStepId,
        startedBy: d.userName,
        startedAt: d.startedAt,
        signedOffBy: d.signedOffByName,
      })),
    };
  },
});

// PUT /api/calls/{id}/repair · saveRepairAction
export const recordRepairOp = defineOperation({
  name: 'calls.recordRepair',
  input: repairSchema.extend({ callId: recordId }),
  output: serviceCallSchema,
  handler: async ({ scope, input: { callId, ...repair } }) => saveRepair({ scope, id: callId, input: repair }),
});

// POST /api/calls/{id}/close · closeCallAction
export const closeCallOp = defineOperation({
  name: 'calls.close',
  input: closeCallSchema.extend({ callId: recordId }),
  output: serviceCallSchema,
  handler: async ({ scope, input }) =>
    finishCall({ scope, userId: scope.userId, id: input.callId, outcome: input.outcome, reason: input.reason }),
});

// POST /api/calls/{id}/reopen · reopenCallAction
export const reopenCallOp = defineOperation({
  name: 'calls.reopen',
  input: reopenCallSchema.extend({ callId: recordId }),
  output: serviceCallSchema,
  handler: async ({ scope, input }) => reopenClosedCall({ scope, id: input.callId, reason: input.reason }),
});

// POST /api/calls/{id}/assign · assignCallAction
export const assignCallOp = defineOperation({
  name: 'calls.assign',
  input: assignCallSchema.extend({ callId: recordId }),
  output: serviceCallSchema,
  handler: async ({ scope, input }) => reassignCall({ scope, id: input.callId, technicianId: input.technicianId }),
});
