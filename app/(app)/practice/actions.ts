'use server';

import { actionOf } from '@/lib/server/operation';
import { assignScenarioOp, createScenarioOp, finishAttemptOp, startAttemptOp } from '@/lib/server/operations/practice';

export const createScenarioAction = actionOf(createScenarioOp, { revalidate: () => ['/practice', '/'] });

export const assignScenarioAction = actionOf(assignScenarioOp, { revalidate: (input) => [`/practice/scenarios/${input.id}`, '/practice'] });

export const startAttemptAction = actionOf(startAttemptOp, { revalidate: () => ['/practice'] });

export const finishAttemptAction = actionOf(finishAttemptOp, {
  revalidate: (input) => [`/practice/attempts/${input.id}`, '/practice', '/'],
});
