'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { createSite } from '@/db/sites';
import { createUnit } from '@/db/units';
import { FIELD_ROLES } from '@/lib/roles';
import { action } from '@/lib/server/guard';
import { assertField, finishCall, openCall, saveRepair, signOff } from '@/lib/server/calls';
import { startDiagnosis } from '@/lib/server/diagnoses';
import { viewerOf } from '@/lib/server/viewer';
import { callSchema, closeCallSchema, repairSchema, siteSchema, startDiagnosisSchema, unitSchema } from '@/lib/validations/field';

const callId = z.uuid({ error: 'That service call was not found.' });

export const createSiteAction = action({ roles: FIELD_ROLES, schema: siteSchema }, async ({ user, input }) => {
  assertField(viewerOf(user));
  return createSite({ companyId: user.companyId, ...input });
});

export const createUnitAction = action({ roles: FIELD_ROLES, schema: unitSchema }, async ({ user, input }) => {
  assertField(viewerOf(user));
  const unit = await createUnit({ companyId: user.companyId, input });
  revalidatePath('/units');
  return unit;
});

export const createCallAction = action({ roles: FIELD_ROLES, schema: callSchema }, async ({ user, input }) => {
  const call = await openCall({ viewer: viewerOf(user), input });
  revalidatePath('/calls');
  return { id: call.id };
});

export const startDiagnosisAction = action(
  { roles: FIELD_ROLES, schema: startDiagnosisSchema.extend({ callId }) },
  async ({ user, input }) => {
    const started = await startDiagnosis({ viewer: viewerOf(user), callId: input.callId, treeVersionId: input.treeVersionId });
    revalidatePath(`/calls/${input.callId}`);
    return { id: started.id };
  },
);

export const saveRepairAction = action({ roles: FIELD_ROLES, schema: repairSchema.extend({ callId }) }, async ({ user, input }) => {
  const { callId: id, ...repair } = input;
  const call = await saveRepair({ viewer: viewerOf(user), id, input: repair });
  revalidatePath(`/calls/${id}`);
  return { status: call.status };
});

export const signOffAction = action(
  { roles: ['technician', 'lead', 'admin'], schema: z.object({ callId, diagnosisId: z.uuid({ error: 'That diagnosis was not found.' }) }) },
  async ({ user, input }) => {
    await signOff({ viewer: viewerOf(user), diagnosisId: input.diagnosisId });
    revalidatePath(`/calls/${input.callId}`);
    return { signedOff: true };
  },
);

export const closeCallAction = action({ roles: FIELD_ROLES, schema: closeCallSchema.extend({ callId }) }, async ({ user, input }) => {
  const call = await finishCall({ viewer: viewerOf(user), id: input.callId, outcome: input.outcome });
  revalidatePath(`/calls/${input.callId}`);
  revalidatePath('/calls');
  return { status: call.status };
});
