// Roles, their labels, and the navigation each sees. Who may open what is the access policy's
// (lib/policy.ts); the navigation only shows what the policy lets the role open.
import { mayOpen, type PagePath } from '@/lib/policy';

export const ROLES = ['apprentice', 'technician', 'lead', 'trainer', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  apprentice: 'Apprentice',
  technician: 'Technician',
  lead: 'Lead',
  trainer: 'Trainer',
  admin: 'Admin',
};

export interface NavItem {
  href: '/' | PagePath;
  label: string;
}

export const NAV_ITEMS: readonly NavItem[] = [
  { href: '/', label: 'Home' },
  { href: '/calls', label: 'Service calls' },
  { href: '/units', label: 'Units' },
  { href: '/trees', label: 'Fault trees' },
  { href: '/practice', label: 'Practice' },
  { href: '/admin/users', label: 'Users' },
  { href: '/admin/company', label: 'Company' },
];

export function navFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.href === '/' || mayOpen(role, item.href));
}
