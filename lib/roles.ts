// Roles and what each may open. Navigation is derived from this; the server checks roles itself
// in every action and handler (lib/server/guard.ts), this only decides what is shown.
export const ROLES = ['apprentice', 'technician', 'lead', 'trainer', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  apprentice: 'Apprentice',
  technician: 'Technician',
  lead: 'Lead',
  trainer: 'Trainer',
  admin: 'Admin',
};

/** Who works real service calls; leads and admins see every call of the company. */
export const FIELD_ROLES: readonly Role[] = ['apprentice', 'technician', 'lead', 'admin'];
export const CALL_SUPERVISORS: readonly Role[] = ['lead', 'admin'];

export interface NavItem {
  href: string;
  label: string;
  roles: readonly Role[];
}

export const NAV_ITEMS: readonly NavItem[] = [
  { href: '/', label: 'Home', roles: ROLES },
  { href: '/calls', label: 'Service calls', roles: FIELD_ROLES },
  { href: '/units', label: 'Units', roles: ['technician', 'lead', 'admin'] },
  { href: '/trees', label: 'Fault trees', roles: ['lead', 'admin'] },
  { href: '/practice', label: 'Practice', roles: ['apprentice', 'trainer'] },
  { href: '/admin/users', label: 'Users', roles: ['admin'] },
  { href: '/admin/company', label: 'Company', roles: ['admin'] },
];

export function navFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.includes(role));
}

export function canOpen(role: Role, pathname: string): boolean {
  const match = [...NAV_ITEMS]
    .filter((item) => item.href !== '/' && (pathname === item.href || pathname.startsWith(`${item.href}/`)))
    .sort((a, b) => b.href.length - a.href.length)[0];
  return match ? match.roles.includes(role) : true;
}
