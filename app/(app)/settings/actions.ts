'use server';

import { actionOf } from '@/lib/server/operation';
import { updateNotificationSettingsOp } from '@/lib/server/operations/mail';

export const updateNotificationSettingsAction = actionOf(updateNotificationSettingsOp, { revalidate: () => ['/settings'] });
