import type { TreeVersionStatusOut } from '@/lib/validations/api';

export const STATUS_LABEL: Record<TreeVersionStatusOut, string> = {
  draft: 'Draft',
  in_review: 'Waiting for review',
  approved: 'Approved, not published',
  published: 'Published',
  retired: 'Retired',
};
