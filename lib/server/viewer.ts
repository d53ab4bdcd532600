import 'server-only';
import type { Viewer } from '@/db/calls';
import type { CurrentUser } from '@/lib/server/guard';

export const viewerOf = (user: CurrentUser): Viewer => ({ id: user.id, companyId: user.companyId, role: user.role });
