// @vitest-environment node
import { OPERATION_NAMES, POLICY, reachOf, rolesFor } from '@/lib/policy';
import { OPERATIONS } from '@/lib/server/operations';
import { ROLES } from '@/lib/roles';

// The policy table and the declared operations are one list: an operation without a policy row,
// or a row without an operation, is a hole in "who may do what is declared once".
describe('operations and the access policy', () => {
  it('declares exactly one operation for every policy row, and no other', () => {
    expect([...OPERATIONS.keys()].sort()).toEqual([...OPERATION_NAMES].sort());
  });

  it('marks an operation public exactly when the policy does', () => {
    for (const [name, op] of OPERATIONS) expect(op.isPublic, name).toBe(Boolean((POLICY[name] as { public?: boolean }).public));
  });

  it('gives trainers no service calls, diagnoses, units or sites', () => {
    for (const name of OPERATION_NAMES.filter((n) => /^(calls|diagnoses|units|sites)\./.test(n))) {
      expect(reachOf(name, 'trainer'), name).toBeNull();
    }
  });

  it('lets apprentices reach only their own calls and diagnoses, and no unit history', () => {
    for (const name of OPERATION_NAMES.filter((n) => /^(calls|diagnoses)\./.test(n))) {
      const reach = reachOf(name, 'apprentice');
      expect(reach === null || reach === 'own', name).toBe(true);
    }
    expect(reachOf('units.get', 'apprentice')).toBeNull();
  });

  it('keeps users and company settings for admins', () => {
    for (const name of ['users.list', 'users.create', 'users.update', 'company.update'] as const) {
      expect(rolesFor(name)).toEqual(['admin']);
    }
    expect(rolesFor('company.get')).toEqual([...ROLES]);
  });
});
