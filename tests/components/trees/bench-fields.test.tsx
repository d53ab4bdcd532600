import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { TreeEditor } from '@/components/trees/editor/tree-editor';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';

// The editor's fields for what the bench answers a step with (probe, moment, observation, the
// ignition-sequence attribute), on a small tree of our own so the checks do not depend on how the
// built-in tree is written. Each change goes into the graph the editor reports, and the validator's
// messages about the new fields reach the live problem list.

beforeAll(() => {
  globalThis.ResizeObserver ??= class {
    observe() {}
    unobserve() {}
    disconnect() {}
  } as unknown as typeof ResizeObserver;
  (globalThis as { DOMMatrixReadOnly?: unknown }).DOMMatrixReadOnly ??= class {
    m22 = 1;
  };
});

beforeEach(() => window.localStorage.clear());

const any = { electric: 'any', gas: 'any' } as const;
const GRAPH: TreeGraph = treeGraphSchema.parse({
  start: 'signal',
  steps: [
    {
      id: 'signal',
      kind: 'measure',
      title: 'Flame signal',
      energy: { electric: 'on', gas: 'on' },
      quantity: 'udc',
      points: ['Flame-rod lead', 'Control terminal'],
      bands: [
        { to: 2, label: 'Low', verdict: 'below', outcome: 'spark' },
        { from: 2, label: 'Good', verdict: 'within', outcome: 'done' },
      ],
    },
    {
      id: 'spark',
      kind: 'inspect',
      title: 'Watch the spark',
      energy: { electric: 'on', gas: 'on' },
      choices: [
        { value: 'sparks', label: 'Sparks at the gap', outcome: 'done' },
        { value: 'no-spark', label: 'No spark', outcome: 'done' },
      ],
    },
    {
      id: 'done',
      kind: 'finding',
      title: 'Found',
      energy: any,
      explanation: 'Something.',
      remedy: 'Fix it.',
      verification: ['Several heat cycles'],
    },
  ],
});

function openStep(id: string) {
  const node = document.querySelector(`.react-flow__node[data-id="${id}"]`);
  expect(node).not.toBeNull();
  fireEvent.click(node!);
  return screen.getByRole('form', { name: `Step ${id}` });
}

const stepOf = (spy: ReturnType<typeof vi.fn>, id: string) => (spy.mock.calls.at(-1)![0] as TreeGraph).steps.find((s) => s.id === id)!;

describe('the bench fields of the step panel', { timeout: 60_000 }, () => {
  it('sets a measure step’s probe from the ways that fit its quantity, and its moment', async () => {
    const user = userEvent.setup();
    const onChange = vi.fn();
    render(<TreeEditor versionId="b1" revision={1} savedGraph={GRAPH} onGraphChange={onChange} />);
    const panel = openStep('signal');
    const how = within(panel).getByLabelText('How the reading is taken');
    // Microamps: only the meter in series (the validator's rule), besides "not said".
    expect(
      within(how)
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['Not said (the bench cannot answer this step)', 'Meter in series in a lead']);
    await user.selectOptions(how, 'series');
    await user.selectOptions(within(panel).getByLabelText('In series in'), 'ground-lead');
    await user.selectOptions(within(panel).getByLabelText('When in the sequence it is read'), 'after-proving');
    await waitFor(() => expect(stepOf(onChange, 'signal')).toMatchObject({ probe: { series: 'ground-lead' }, at: 'after-proving' }));
    expect(screen.getByText(/No problems/)).toBeInTheDocument();

    // Another quantity: the series probe no longer fits; it stays shown and the problem is listed.
    await user.selectOptions(within(panel).getByLabelText('Quantity'), 'vdc');
    expect(await within(screen.getByTestId('problems')).findByText(/only microamps are read with the meter in series/)).toBeInTheDocument();
    expect(
      within(within(panel).getByLabelText('How the reading is taken')).getByRole('option', { name: /does not fit/ }),
    ).toBeInTheDocument();
    await user.selectOptions(within(panel).getByLabelText('How the reading is taken'), 'leads');
    await user.selectOptions(within(panel).getByLabelText('First lead on'), 'xfmr-hot');
    await user.selectOptions(within(panel).getByLabelText('Second lead on'), 'xfmr-hot');
    expect(await within(screen.getByTestId('problems')).findByText(/the meter's two leads are on the same point/)).toBeInTheDocument();
    await user.selectOptions(within(panel).getByLabelText('Second lead on'), 'xfmr-common');
    await waitFor(() => expect(stepOf(onChange, 'signal')).toMatchObject({ probe: { a: 'xfmr-hot', b: 'xfmr-common' } }));
    await waitFor(() => expect(screen.queryByTestId('problems')).toBeNull());
  });

  it('sets an inspect step’s observation, with a choice per result, and flags a mapping to a choice that is gone', async () => {
    const user = userEvent.setup();
    const onChange = vi.fn();
    render(<TreeEditor versionId="b2" revision={1} savedGraph={GRAPH} onGraphChange={onChange} />);
    const panel = openStep('spark');
    await user.click(within(panel).getByLabelText('The bench answers this step by observing'));
    await user.selectOptions(within(panel).getByLabelText('What is observed'), 'spark');
    await user.selectOptions(within(panel).getByLabelText('When'), 'proving');
    await user.selectOptions(within(panel).getByLabelText('Sparks across the gap'), 'sparks');
    await user.selectOptions(within(panel).getByLabelText('None'), 'no-spark');
    await waitFor(() =>
      expect(stepOf(onChange, 'spark')).toMatchObject({
        observe: { what: 'spark', at: 'proving', choices: { 'at-gap': 'sparks', none: 'no-spark' } },
      }),
    );
    expect(screen.getByText(/No problems/)).toBeInTheDocument();

    // The choice the observation points at gets another id: the validator's message is listed.
    const id = within(panel).getByLabelText('Choice 1 id');
    await user.clear(id);
    await user.click(id);
    await user.paste('sparking');
    expect(
      await within(screen.getByTestId('problems')).findByText(/maps "at-gap" to "sparks", which is not one of its choices/),
    ).toBeInTheDocument();
  });

  it('turns the ignition sequence on beside a step', async () => {
    const user = userEvent.setup();
    const onChange = vi.fn();
    render(<TreeEditor versionId="b3" revision={1} savedGraph={GRAPH} onGraphChange={onChange} />);
    const panel = openStep('spark');
    const box = within(panel).getByLabelText('Show the ignition sequence beside this step');
    expect(box).not.toBeChecked();
    await user.click(box);
    await waitFor(() => expect(stepOf(onChange, 'spark')).toMatchObject({ timeline: true }));
    expect(box).toBeChecked();
  });
});
