import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { CloseCallControls, ReassignCallControl, ReopenCallControls, SignOffButton } from '@/components/calls/call-controls';

const router = { replace: vi.fn(), refresh: vi.fn(), push: vi.fn(), back: vi.fn(), forward: vi.fn(), prefetch: vi.fn() };
vi.mock('next/navigation', () => ({ useRouter: () => router }));

const CALL_ID = '4a2b0c11-6e1f-4d54-8b54-1a4c7e1e2b01';
const DIAGNOSIS_ID = '4a2b0c11-6e1f-4d54-8b54-1a4c7e1e2b02';
const TECH = { id: '4a2b0c11-6e1f-4d54-8b54-1a4c7e1e2b03', name: 'Dale Okonkwo', role: 'technician' };
const APPRENTICE = { id: '4a2b0c11-6e1f-4d54-8b54-1a4c7e1e2b04', name: 'Noor Baptiste', role: 'apprentice' };

beforeEach(() => {
  for (const fn of Object.values(router)) fn.mockReset();
});

const dialog = () => screen.getByRole('dialog');

describe('CloseCallControls', () => {
  it('asks why before referring, refuses an empty reason in words and sends nothing', async () => {
    const user = userEvent.setup();
    const closeCall = vi.fn();
    render(<CloseCallControls callId={CALL_ID} closeCall={closeCall} />);
    await user.click(screen.getByRole('button', { name: 'Refer' }));
    expect(dialog()).toHaveAccessibleName('Refer this call?');
    const reason = within(dialog()).getByLabelText('Why refer it?');
    expect(reason).toHaveFocus();
    await user.click(within(dialog()).getByRole('button', { name: 'Refer the call' }));
    expect(within(dialog()).getByText(/^Say why you refer the call/)).toBeInTheDocument();
    expect(reason).toHaveAttribute('aria-invalid', 'true');
    expect(closeCall).not.toHaveBeenCalled();
  });

  it('refers with the reason once confirmed, then refreshes the page', async () => {
    const user = userEvent.setup();
    const closeCall = vi.fn().mockResolvedValue({ ok: true, data: { status: 'referred' } });
    render(<CloseCallControls callId={CALL_ID} closeCall={closeCall} />);
    await user.click(screen.getByRole('button', { name: 'Refer' }));
    await user.type(within(dialog()).getByLabelText('Why refer it?'), 'Inducer motor on order');
    await user.click(within(dialog()).getByRole('button', { name: 'Refer the call' }));
    await waitFor(() => expect(router.refresh).toHaveBeenCalled());
    expect(closeCall).toHaveBeenCalledWith({ callId: CALL_ID, outcome: 'referred', reason: 'Inducer motor on order' });
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
  });

  it('closes only after a confirmation; Escape or Cancel changes nothing and gives the focus back', async () => {
    const user = userEvent.setup();
    const closeCall = vi.fn().mockResolvedValue({ ok: true, data: { status: 'closed' } });
    render(<CloseCallControls callId={CALL_ID} closeCall={closeCall} />);
    const opener = screen.getByRole('button', { name: 'Close call' });
    await user.click(opener);
    expect(dialog()).toHaveAccessibleName('Close this call?');
    expect(within(dialog()).getByRole('button', { name: 'Cancel' })).toHaveFocus();
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
    expect(opener).toHaveFocus();
    await user.click(opener);
    await user.click(within(dialog()).getByRole('button', { name: 'Cancel' }));
    expect(closeCall).not.toHaveBeenCalled();
    await user.click(opener);
    await user.click(within(dialog()).getByRole('button', { name: 'Close the call' }));
    await waitFor(() => expect(closeCall).toHaveBeenCalledWith({ callId: CALL_ID, outcome: 'closed' }));
  });

  it('keeps the dialog open with the server’s reason when the call may not be closed yet', async () => {
    const user = userEvent.setup();
    const closeCall = vi.fn().mockResolvedValue({
      ok: false,
      code: 'conflict',
      message: 'Record the repair and its verification before closing the call.',
    });
    render(<CloseCallControls callId={CALL_ID} closeCall={closeCall} />);
    await user.click(screen.getByRole('button', { name: 'Close call' }));
    await user.click(within(dialog()).getByRole('button', { name: 'Close the call' }));
    expect(await within(dialog()).findByText('Record the repair and its verification before closing the call.')).toBeInTheDocument();
    expect(router.refresh).not.toHaveBeenCalled();
  });
});

describe('SignOffButton', () => {
  it('asks for confirmation and sends the comment with the sign-off', async () => {
    const user = userEvent.setup();
    const signOff = vi.fn().mockResolvedValue({ ok: true, data: {} });
    render(<SignOffButton callId={CALL_ID} diagnosisId={DIAGNOSIS_ID} findingTitle="Dirty flame rod" signOff={signOff} />);
    await user.click(screen.getByRole('button', { name: 'Sign off this finding' }));
    expect(dialog()).toHaveAccessibleName('Sign off this finding?');
    expect(dialog()).toHaveAccessibleDescription(/“Dirty flame rod”/);
    await user.type(within(dialog()).getByLabelText('Comment (optional)'), 'Signal 0.9 µA before cleaning agrees.');
    await user.click(within(dialog()).getByRole('button', { name: 'Sign off' }));
    await waitFor(() => expect(router.refresh).toHaveBeenCalled());
    expect(signOff).toHaveBeenCalledWith({ callId: CALL_ID, diagnosisId: DIAGNOSIS_ID, comment: 'Signal 0.9 µA before cleaning agrees.' });
  });

  it('sends no comment when none is given, and nothing at all when cancelled', async () => {
    const user = userEvent.setup();
    const signOff = vi.fn().mockResolvedValue({ ok: true, data: {} });
    render(<SignOffButton callId={CALL_ID} diagnosisId={DIAGNOSIS_ID} signOff={signOff} />);
    await user.click(screen.getByRole('button', { name: 'Sign off this finding' }));
    await user.click(within(dialog()).getByRole('button', { name: 'Cancel' }));
    expect(signOff).not.toHaveBeenCalled();
    await user.click(screen.getByRole('button', { name: 'Sign off this finding' }));
    await user.click(within(dialog()).getByRole('button', { name: 'Sign off' }));
    await waitFor(() => expect(signOff).toHaveBeenCalledWith({ callId: CALL_ID, diagnosisId: DIAGNOSIS_ID }));
  });
});

describe('ReopenCallControls', () => {
  it('asks why, refuses an empty reason, and reopens with it', async () => {
    const user = userEvent.setup();
    const reopenCall = vi.fn().mockResolvedValue({ ok: true, data: { status: 'repaired' } });
    render(<ReopenCallControls callId={CALL_ID} reopenCall={reopenCall} />);
    await user.click(screen.getByRole('button', { name: 'Reopen the call' }));
    await user.click(within(dialog()).getByRole('button', { name: 'Reopen' }));
    expect(within(dialog()).getByText('Say why the call is reopened.')).toBeInTheDocument();
    expect(reopenCall).not.toHaveBeenCalled();
    await user.type(within(dialog()).getByLabelText('Why reopen it?'), 'Customer called back: no heat again');
    await user.click(within(dialog()).getByRole('button', { name: 'Reopen' }));
    await waitFor(() => expect(router.refresh).toHaveBeenCalled());
    expect(reopenCall).toHaveBeenCalledWith({ callId: CALL_ID, reason: 'Customer called back: no heat again' });
  });
});

describe('ReassignCallControl', () => {
  it('offers everyone but the current technician, says so when none is chosen, and reassigns', async () => {
    const user = userEvent.setup();
    const assignCall = vi.fn().mockResolvedValue({ ok: true, data: { technicianName: APPRENTICE.name } });
    render(<ReassignCallControl callId={CALL_ID} currentId={TECH.id} assignees={[TECH, APPRENTICE]} assignCall={assignCall} />);
    const select = screen.getByLabelText('Reassign to');
    expect(
      within(select)
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['Choose a technician', 'Noor Baptiste (Apprentice)']);
    await user.click(screen.getByRole('button', { name: 'Reassign' }));
    expect(screen.getByText('Choose a technician from the list.')).toBeInTheDocument();
    expect(assignCall).not.toHaveBeenCalled();
    await user.selectOptions(select, APPRENTICE.id);
    await user.click(screen.getByRole('button', { name: 'Reassign' }));
    expect(await screen.findByText('The call is now with Noor Baptiste.')).toBeInTheDocument();
    expect(assignCall).toHaveBeenCalledWith({ callId: CALL_ID, technicianId: APPRENTICE.id });
  });
});
