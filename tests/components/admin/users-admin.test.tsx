import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { UsersAdmin, type AdminUserRow } from '@/components/admin/users-admin';

const router = { replace: vi.fn(), refresh: vi.fn(), push: vi.fn(), back: vi.fn(), forward: vi.fn(), prefetch: vi.fn() };
vi.mock('next/navigation', () => ({ useRouter: () => router }));

const ADMIN: AdminUserRow = {
  id: '5b3c1d22-7f20-4e65-9c65-2b5d8f2f3c01',
  email: 'admin@demo.test',
  name: 'Gus Abernathy',
  role: 'admin',
  active: true,
  createdAt: '2026-01-05T14:00:00.000Z',
};
const TECH: AdminUserRow = {
  id: '5b3c1d22-7f20-4e65-9c65-2b5d8f2f3c02',
  email: 'technician@demo.test',
  name: 'Dale Okonkwo',
  role: 'technician',
  active: true,
  createdAt: '2026-01-05T14:00:00.000Z',
};

function setup(updateUser = vi.fn().mockResolvedValue({ ok: true, data: {} })) {
  render(<UsersAdmin users={[ADMIN, TECH]} currentUserId={ADMIN.id} createUser={vi.fn()} updateUser={updateUser} />);
  return updateUser;
}

beforeEach(() => {
  for (const fn of Object.values(router)) fn.mockReset();
});

describe('UsersAdmin', () => {
  it('asks before a role change; cancelling changes nothing and the role shown stays', async () => {
    const user = userEvent.setup();
    const updateUser = setup();
    const select = screen.getByLabelText('Role of Dale Okonkwo');
    await user.selectOptions(select, 'lead');
    expect(screen.getByRole('dialog')).toHaveAccessibleName('Make Dale Okonkwo a lead?');
    expect(screen.getByRole('dialog')).toHaveAccessibleDescription(/signed out on every device/);
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Cancel' }));
    expect(updateUser).not.toHaveBeenCalled();
    expect(select).toHaveValue('technician');
  });

  it('changes the role once confirmed and says so', async () => {
    const user = userEvent.setup();
    const updateUser = setup();
    await user.selectOptions(screen.getByLabelText('Role of Dale Okonkwo'), 'admin');
    expect(screen.getByRole('dialog')).toHaveAccessibleName('Make Dale Okonkwo an admin?');
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Make admin' }));
    expect(await screen.findByText('Dale Okonkwo is now admin.')).toBeInTheDocument();
    expect(updateUser).toHaveBeenCalledWith({ id: TECH.id, patch: { role: 'admin' } });
    expect(router.refresh).toHaveBeenCalled();
  });

  it('asks before deactivating, and keeps the dialog open with the server’s refusal', async () => {
    const user = userEvent.setup();
    const updateUser = setup(
      vi
        .fn()
        .mockResolvedValue({ ok: false, code: 'unavailable', message: 'The server is busy. Nothing was changed; try again in a moment.' }),
    );
    await user.click(screen.getByRole('button', { name: /^Deactivate\s*Dale Okonkwo$/ }));
    const dialog = screen.getByRole('dialog');
    expect(dialog).toHaveAccessibleName('Deactivate Dale Okonkwo?');
    await user.click(within(dialog).getByRole('button', { name: 'Deactivate' }));
    await waitFor(() => expect(updateUser).toHaveBeenCalledWith({ id: TECH.id, patch: { active: false } }));
    expect(await within(dialog).findByText('The server is busy. Nothing was changed; try again in a moment.')).toBeInTheDocument();
    expect(router.refresh).not.toHaveBeenCalled();
  });

  it('asks before signing someone out everywhere', async () => {
    const user = userEvent.setup();
    const updateUser = setup();
    await user.click(screen.getByRole('button', { name: /^Sign out everywhere\s*for Dale Okonkwo$/ }));
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Sign out everywhere' }));
    expect(await screen.findByText('Dale Okonkwo is signed out everywhere.')).toBeInTheDocument();
    expect(updateUser).toHaveBeenCalledWith({ id: TECH.id, patch: { revokeSessions: true } });
  });
});
