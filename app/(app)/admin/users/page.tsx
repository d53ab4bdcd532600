import type { Metadata } from 'next';
import { UsersAdmin } from '@/components/admin/users-admin';
import { pageScope } from '@/lib/server/operation';
import { listCompanyUsers } from '@/lib/server/users';
import { adminUserSchema } from '@/lib/validations/api';
import { createUserAction, updateUserAction } from '../actions';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  const { user: admin, scope } = await pageScope('users.list');
  const users = adminUserSchema.array().parse(await listCompanyUsers({ companyId: scope.companyId }));
  return (
    <div className="space-y-6">
      <div>
        <h1 className="page-title">Users</h1>
        <p className="text-muted">
          Everyone who signs in for {admin.companyName}: a role change or deactivation ends that person&apos;s sessions at once.
        </p>
      </div>
      <UsersAdmin users={users} currentUserId={admin.id} createUser={createUserAction} updateUser={updateUserAction} />
    </div>
  );
}
