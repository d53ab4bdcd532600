import { navFor, NAV_ITEMS, ROLES, type Role } from '@/lib/roles';

// What each role must see, written out by hand from the role list, so that a change to
// NAV_ITEMS that widens or narrows a role's reach fails here.
const EXPECTED: Record<Role, string[]> = {
  apprentice: ['/', '/calls', '/practice'],
  technician: ['/', '/calls', '/units'],
  // Leads and admins read practice results and prove a tree on the bench (issue 9).
  lead: ['/', '/calls', '/units', '/trees', '/practice'],
  trainer: ['/', '/practice'],
  admin: ['/', '/calls', '/units', '/trees', '/practice', '/admin/users', '/admin/company'],
};

describe('navFor', () => {
  it.each(ROLES)('gives %s exactly its own entries, in menu order', (role) => {
    expect(navFor(role).map((item) => item.href)).toEqual(EXPECTED[role]);
  });

  it('gives every role Home first', () => {
    for (const role of ROLES) expect(navFor(role)[0]).toMatchObject({ href: '/', label: 'Home' });
  });

  it('shows the admin pages to admins only', () => {
    for (const role of ROLES.filter((r) => r !== 'admin')) {
      const hrefs = navFor(role).map((item) => item.href);
      expect(hrefs.some((href) => href.startsWith('/admin'))).toBe(false);
    }
  });

  it('labels every entry', () => {
    for (const item of NAV_ITEMS) expect(item.label.trim().length).toBeGreaterThan(0);
  });
});
