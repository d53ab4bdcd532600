import { routeOf } from '@/lib/server/operation';
import { getNotificationSettingsOp, updateNotificationSettingsOp } from '@/lib/server/operations/mail';

// GET /api/me/notifications – which e-mail notifications the signed-in user receives
export const GET = routeOf(getNotificationSettingsOp);

// PUT /api/me/notifications – turns kinds of notification on or off ({ "sign-off": false, … })
export const PUT = routeOf(updateNotificationSettingsOp);
