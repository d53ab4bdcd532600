'use server';

import { actionOf } from '@/lib/server/operation';
import { resendMailOp, sendReportEmailOp } from '@/lib/server/operations/mail';

export const sendReportEmailAction = actionOf(sendReportEmailOp, { revalidate: (input) => [`/calls/${input.id}/report`] });

export const resendMailAction = actionOf(resendMailOp);
