import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ProcedureChecklist } from '@/components/wizard/procedure-checklist';

// A checklist of our own, so the test does not move when the tree's procedures are revised.
const LOCK_OUT_CHECKLIST = [
  'Power off at the disconnect',
  'Lock and tag applied',
  'Meter proven on a live source',
  'Absence of voltage verified',
  'Meter proven again',
];

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

describe('procedure checklist: ticks kept on the device', () => {
  const items = ['Power off at the disconnect', 'Lock and tag applied', 'Absence of voltage verified'];
  beforeEach(() => localStorage.clear());

  it('keeps the ticks across a reload (unmount and render again with the same key)', async () => {
    const user = userEvent.setup();
    const first = render(<ProcedureChecklist items={items} storageKey="d-1:lock-out--a" onConfirm={() => {}} />);
    await user.click(screen.getByRole('checkbox', { name: items[0] }));
    await user.click(screen.getByRole('checkbox', { name: items[2] }));
    first.unmount();

    render(<ProcedureChecklist items={items} storageKey="d-1:lock-out--a" onConfirm={() => {}} />);
    expect(screen.getByRole('checkbox', { name: items[0] })).toBeChecked();
    expect(screen.getByRole('checkbox', { name: items[1] })).not.toBeChecked();
    expect(screen.getByRole('checkbox', { name: items[2] })).toBeChecked();
    expect(screen.getByText('2 of 3 ticked')).toBeInTheDocument();
    expect(JSON.parse(localStorage.getItem('pg-checklist:d-1:lock-out--a')!)).toEqual([items[0], items[2]]);
  });

  it('keeps each diagnosis and step apart', async () => {
    const user = userEvent.setup();
    const first = render(<ProcedureChecklist items={items} storageKey="d-1:lock-out--a" onConfirm={() => {}} />);
    await user.click(screen.getByRole('checkbox', { name: items[0] }));
    first.unmount();
    const second = render(<ProcedureChecklist items={items} storageKey="d-2:lock-out--a" onConfirm={() => {}} />);
    expect(screen.getByRole('checkbox', { name: items[0] })).not.toBeChecked();
    second.unmount();
    render(<ProcedureChecklist items={items} storageKey="d-1:re-energize--b" onConfirm={() => {}} />);
    expect(screen.getByRole('checkbox', { name: items[0] })).not.toBeChecked();
  });

  it('clears the ticks once the step is confirmed', async () => {
    const user = userEvent.setup();
    const onConfirm = vi.fn();
    const first = render(<ProcedureChecklist items={items} storageKey="d-1:lock-out--a" onConfirm={onConfirm} />);
    for (const box of screen.getAllByRole('checkbox')) await user.click(box);
    await user.click(screen.getByRole('button', { name: 'Confirm' }));
    expect(onConfirm).toHaveBeenCalledTimes(1);
    expect(localStorage.getItem('pg-checklist:d-1:lock-out--a')).toBeNull();
    first.unmount();
    render(<ProcedureChecklist items={items} storageKey="d-1:lock-out--a" onConfirm={onConfirm} />);
    for (const box of screen.getAllByRole('checkbox')) expect(box).not.toBeChecked();
  });

  it('ignores stored ticks that are not items of this step, and unreadable storage', () => {
    localStorage.setItem('pg-checklist:d-1:x', JSON.stringify(['Something else', items[1], 7]));
    const first = render(<ProcedureChecklist items={items} storageKey="d-1:x" onConfirm={() => {}} />);
    expect(screen.getByText('1 of 3 ticked')).toBeInTheDocument();
    first.unmount();
    localStorage.setItem('pg-checklist:d-1:y', '{not json');
    render(<ProcedureChecklist items={items} storageKey="d-1:y" onConfirm={() => {}} />);
    expect(screen.getByText('0 of 3 ticked')).toBeInTheDocument();
  });

  it('stores nothing without a key', async () => {
    const user = userEvent.setup();
    render(<ProcedureChecklist items={items} onConfirm={() => {}} />);
    await user.click(screen.getByRole('checkbox', { name: items[0] }));
    expect(screen.getByRole('checkbox', { name: items[0] })).toBeChecked();
    expect(localStorage.length).toBe(0);
  });
});

describe('procedure checklist: storage refused', () => {
  afterEach(() => vi.restoreAllMocks());

  it('still ticks, in memory, when the device refuses to store', async () => {
    const user = userEvent.setup();
    vi.spyOn(Storage.prototype, 'setItem').mockImplementation(() => {
      throw new DOMException('full', 'QuotaExceededError');
    });
    render(<ProcedureChecklist items={['Panels on', 'Lock removed']} storageKey="d-9:full" onConfirm={() => {}} />);
    await user.click(screen.getByRole('checkbox', { name: 'Panels on' }));
    expect(screen.getByRole('checkbox', { name: 'Panels on' })).toBeChecked();
    expect(screen.getByText('1 of 2 ticked')).toBeInTheDocument();
  });
});
