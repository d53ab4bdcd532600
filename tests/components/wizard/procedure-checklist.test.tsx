import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ProcedureChecklist } from '@/components/wizard/procedure-checklist';
import { LOCK_OUT_CHECKLIST } from '@/machines/diagnosis-machine';

describe('procedure checklist', () => {
  it('keeps Confirm disabled until every item is ticked', async () => {
    const user = userEvent.setup();
    const onConfirm = vi.fn();
    render(<ProcedureChecklist items={LOCK_OUT_CHECKLIST} onConfirm={onConfirm} />);
    const confirm = screen.getByRole('button', { name: 'Confirm' });
    const boxes = screen.getAllByRole('checkbox');
    expect(boxes).toHaveLength(LOCK_OUT_CHECKLIST.length);
    for (const box of boxes.slice(0, -1)) {
      await user.click(box);
      expect(confirm).toBeDisabled();
    }
    expect(screen.getByText(`${LOCK_OUT_CHECKLIST.length - 1} of ${LOCK_OUT_CHECKLIST.length} ticked`)).toBeInTheDocument();
    await user.click(boxes.at(-1)!);
    expect(confirm).toBeEnabled();
    await user.click(confirm);
    expect(onConfirm).toHaveBeenCalledTimes(1);
  });

  it('disables Confirm again when an item is unticked', async () => {
    const user = userEvent.setup();
    render(<ProcedureChecklist items={['Panels on', 'Lock removed']} onConfirm={() => {}} />);
    for (const box of screen.getAllByRole('checkbox')) await user.click(box);
    expect(screen.getByRole('button', { name: 'Confirm' })).toBeEnabled();
    await user.click(screen.getByRole('checkbox', { name: 'Panels on' }));
    expect(screen.getByRole('button', { name: 'Confirm' })).toBeDisabled();
  });

  it('lets an action without items be confirmed at once', () => {
    render(<ProcedureChecklist items={[]} onConfirm={() => {}} />);
    expect(screen.getByRole('button', { name: 'Confirm' })).toBeEnabled();
  });
});
