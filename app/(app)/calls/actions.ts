'use server';

import { actionOf } from '@/lib/server/operation';
import { signOffDiagnosisOp, startDiagnosisOp } from '@/lib/server/operations/diagnoses';
import { assignCallOp, closeCallOp, createCallOp, createSiteOp, createUnitOp, reopenCallOp } from '@/lib/server/operations/field';

export const createSiteAction = actionOf(createSiteOp);

export const createUnitAction = actionOf(createUnitOp, { revalidate: () => ['/units'] });

export const createCallAction = actionOf(createCallOp, { revalidate: () => ['/calls'] });

export const startDiagnosisAction = actionOf(startDiagnosisOp, { revalidate: (input) => [`/calls/${input.callId}`] });

export const signOffAction = actionOf(signOffDiagnosisOp, { revalidate: (_, view) => [`/calls/${view.callId}`] });

export const closeCallAction = actionOf(closeCallOp, { revalidate: (input) => [`/calls/${input.callId}`, '/calls'] });

export const reopenCallAction = actionOf(reopenCallOp, { revalidate: (input) => [`/calls/${input.callId}`, '/calls'] });

export const assignCallAction = actionOf(assignCallOp, { revalidate: (input) => [`/calls/${input.callId}`, '/calls'] });
