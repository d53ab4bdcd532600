import type { Metadata } from 'next';
import { UsersAdmin } from '@/components/admin/users-admin';
import { requirePageUser } from '@/lib/server/guard';
import { listCompanyUsers } from '@/lib/server/users';
import { createUserAction, updateUserAction } from '../actions';

export const metadata: Metadata = { title: 'Users' };

export default async function UsersPage() {
  const admin = await requirePageUser({ roles: ['admin'] });
  const users = await listCompanyUsers({ admin });
  return (
    <div className="space-y-6">
      <div>
        <h1 className="page-title">Users</h1>
        <p className="text-muted">
          Everyone who signs in for {admin.companyName}: a role change or deactivation ends that person&apos;s sessions at once.
        </p>
      </div>
      <UsersAdmin
        users={users.map((u) => ({ ...u, createdAt: u.createdAt.toISOString() }))}
        currentUserId={admin.id}
        createUser={createUserAction}
        updateUser={updateUserAction}
      />
    </div>
  );
}
