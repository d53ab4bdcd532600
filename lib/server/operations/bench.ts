import 'server-only';
import { z } from 'zod';
import { benchAct, benchMeasure, benchObserve, benchSessionState, listFaultsFor, startBenchSession } from '@/lib/server/bench';
import { defineOperation } from '@/lib/server/operation';
import { noInput, recordId } from '@/lib/server/operations/shared';
import {
  benchActionOutSchema,
  benchActionSchema,
  benchFaultOutSchema,
  benchMeasureSchema,
  benchObservationOutSchema,
  benchObserveSchema,
  benchReadingOutSchema,
  benchSessionCreatedSchema,
  benchStateOutSchema,
  createBenchSessionSchema,
} from '@/lib/validations/bench';

// POST /api/bench/sessions
export const createBenchSessionOp = defineOperation({
  name: 'bench.sessions.create',
  input: createBenchSessionSchema,
  output: benchSessionCreatedSchema,
  handler: async ({ user, input }) => startBenchSession({ user, input }),
});

// GET /api/bench/sessions/{id}
export const getBenchSessionOp = defineOperation({
  name: 'bench.sessions.get',
  input: z.object({ id: recordId }),
  output: benchStateOutSchema,
  handler: async ({ user, scope, input }) => benchSessionState({ user, scope, id: input.id }),
});

// POST /api/bench/sessions/{id}/actions
export const benchActOp = defineOperation({
  name: 'bench.sessions.act',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: benchActionSchema }),
  output: benchActionOutSchema,
  handler: async ({ scope, input }) => benchAct({ scope, id: input.id }, input.body),
});

// POST /api/bench/sessions/{id}/measure
export const benchMeasureOp = defineOperation({
  name: 'bench.sessions.measure',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: benchMeasureSchema }),
  output: benchReadingOutSchema,
  handler: async ({ scope, input }) => benchMeasure({ scope, id: input.id }, input.body),
});

// POST /api/bench/sessions/{id}/observe
export const benchObserveOp = defineOperation({
  name: 'bench.sessions.observe',
  fieldsUnder: 'body',
  input: z.object({ id: recordId, body: benchObserveSchema }),
  output: benchObservationOutSchema,
  handler: async ({ scope, input }) => benchObserve({ scope, id: input.id }, input.body),
});

// GET /api/bench/faults
export const listBenchFaultsOp = defineOperation({
  name: 'bench.faults',
  input: noInput,
  output: z.array(benchFaultOutSchema),
  handler: async ({ user }) => listFaultsFor(user),
});
