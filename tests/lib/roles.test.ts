import { canOpen, navFor, NAV_ITEMS, ROLES, type Role } from '@/lib/roles';

// What each role must see, written out by hand from the role list, so that a change to
// NAV_ITEMS that widens or narrows a role's reach fails here.
const EXPECTED: Record<Role, string[]> = {
  apprentice: ['/', '/calls', '/practice'],
  technician: ['/', '/calls', '/units'],
  lead: ['/', '/calls', '/units', '/trees'],
  trainer: ['/', '/practice'],
  admin: ['/', '/calls', '/units', '/trees', '/admin/users', '/admin/company'],
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

describe('canOpen', () => {
  it('refuses the admin pages and their sub-pages to non-admins', () => {
    for (const role of ['apprentice', 'technician', 'lead', 'trainer'] as const) {
      expect(canOpen(role, '/admin/users')).toBe(false);
      expect(canOpen(role, '/admin/users/123')).toBe(false);
      expect(canOpen(role, '/admin/company')).toBe(false);
    }
    expect(canOpen('admin', '/admin/users')).toBe(true);
    expect(canOpen('admin', '/admin/users/123')).toBe(true);
  });

  it('follows the navigation for each role', () => {
    for (const role of ROLES) {
      for (const item of NAV_ITEMS) {
        expect(canOpen(role, item.href), `${role} → ${item.href}`).toBe(item.roles.includes(role));
      }
    }
  });

  it('does not treat a path that only shares a prefix as a sub-page', () => {
    // '/unitsx' is not under '/units', so the units rule must not apply to it.
    expect(canOpen('trainer', '/units')).toBe(false);
    expect(canOpen('trainer', '/unitsx')).toBe(true);
  });

  it('opens Home and unlisted paths to everyone', () => {
    for (const role of ROLES) {
      expect(canOpen(role, '/')).toBe(true);
      expect(canOpen(role, '/sign-in')).toBe(true);
    }
  });
});
