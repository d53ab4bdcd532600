import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { localDraftKey, TreeEditor } from '@/components/trees/editor/tree-editor';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { MeasureStep, TreeGraph } from '@/lib/trees/schema';

beforeAll(() => {
  // React Flow measures its pane and nodes; jsdom has neither ResizeObserver nor DOMMatrix.
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

function lastGraph(spy: ReturnType<typeof vi.fn>): TreeGraph {
  return spy.mock.calls.at(-1)![0] as TreeGraph;
}

function openStep(id: string) {
  const node = document.querySelector(`.react-flow__node[data-id="${id}"]`);
  expect(node).not.toBeNull();
  fireEvent.click(node!);
}

// The editor lays out and validates the whole default tree on each change: heavy in jsdom on a busy machine.
describe('TreeEditor', { timeout: 60_000 }, () => {
  it('starts without problems and flags a new inspect step until its choices are connected', async () => {
    const user = userEvent.setup();
    const onChange = vi.fn();
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} onGraphChange={onChange} />);
    expect(screen.getByText(/No problems/)).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: '+ Inspect' }));
    const panel = screen.getByRole('form', { name: 'Step new-inspect' });
    const problems = within(screen.getByTestId('problems'));
    expect(problems.getByText('Choice "Yes" of "new-inspect" is not connected to a step')).toBeInTheDocument();
    expect(problems.getByText(/"new-inspect" cannot be reached/)).toBeInTheDocument();

    // Pasted, not typed: each key press re-validates the whole tree, which is slow in jsdom.
    await user.click(within(panel).getByLabelText('Title'));
    await user.paste('Burner face');
    await user.selectOptions(within(panel).getByLabelText('Choice 1 leads to'), 'f-control-not-sensing');
    await user.selectOptions(within(panel).getByLabelText('Choice 2 leads to'), 'carry-over');
    await waitFor(() => expect(problems.queryByText(/of "new-inspect" is not connected/)).toBeNull());
    const graph = lastGraph(onChange);
    const added = graph.steps.find((s) => s.id === 'new-inspect');
    expect(added).toMatchObject({ kind: 'inspect', title: 'Burner face' });
    expect(added?.kind === 'inspect' && added.choices.map((c) => c.outcome)).toEqual(['f-control-not-sensing', 'carry-over']);
    // Still unreachable: the one problem left, and it leads to the step.
    await user.click(problems.getByText(/"new-inspect" cannot be reached/));
    expect(screen.getByRole('form', { name: 'Step new-inspect' })).toBeInTheDocument();
  });

  it('moves a band boundary of the flame-signal step, keeping the bands contiguous', async () => {
    const user = userEvent.setup();
    const onChange = vi.fn();
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} onGraphChange={onChange} />);
    openStep('flame-signal');
    const panel = screen.getByRole('form', { name: 'Step flame-signal' });
    const boundary = within(panel).getByLabelText('Boundary between band 3 and band 4');
    expect(boundary).toHaveValue('2');
    await user.clear(boundary);
    await user.type(boundary, '1.5{Enter}');
    await waitFor(() => expect(onChange).toHaveBeenCalled());
    const step = lastGraph(onChange).steps.find((s) => s.id === 'flame-signal') as MeasureStep;
    expect(step.bands[2]).toMatchObject({ from: 0.1, to: 1.5 });
    expect(step.bands[3]).toMatchObject({ from: 1.5 });
    expect(screen.getByText(/No problems/)).toBeInTheDocument();
  });

  it('shows a schema error beside the field and in the problem list', async () => {
    const user = userEvent.setup();
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} />);
    openStep('flame-signal');
    const panel = screen.getByRole('form', { name: 'Step flame-signal' });
    await user.clear(within(panel).getByLabelText('Title'));
    expect(await within(panel).findByText('A step needs a title')).toBeInTheDocument();
    expect(within(screen.getByTestId('problems')).getByText('"flame-signal", title: A step needs a title')).toBeInTheDocument();
  });

  it('keeps unsaved changes on the device and restores them after a reload', async () => {
    const user = userEvent.setup();
    const first = render(<TreeEditor versionId="v9" revision={4} savedGraph={DEFAULT_TREE_GRAPH} />);
    await user.click(screen.getByRole('button', { name: '+ Finding' }));
    await waitFor(() => expect(window.localStorage.getItem(localDraftKey('v9', 4))).toContain('new-finding'));
    first.unmount();

    render(<TreeEditor versionId="v9" revision={4} savedGraph={DEFAULT_TREE_GRAPH} />);
    expect(await screen.findByText('Unsaved changes from this device were restored.')).toBeInTheDocument();
    expect(document.querySelector('.react-flow__node[data-id="new-finding"]')).not.toBeNull();
    await user.click(screen.getByRole('button', { name: 'Discard them' }));
    await waitFor(() => expect(document.querySelector('.react-flow__node[data-id="new-finding"]')).toBeNull());
    expect(window.localStorage.getItem(localDraftKey('v9', 4))).toBeNull();
  });

  it('a copy kept for another revision is not restored', () => {
    window.localStorage.setItem(
      localDraftKey('v9', 3),
      JSON.stringify({ ...DEFAULT_TREE_GRAPH, steps: DEFAULT_TREE_GRAPH.steps.slice(1) }),
    );
    render(<TreeEditor versionId="v9" revision={4} savedGraph={DEFAULT_TREE_GRAPH} />);
    expect(screen.queryByText('Unsaved changes from this device were restored.')).toBeNull();
  });

  it('deletes a step from the panel; what led to it is flagged as unconnected', async () => {
    const user = userEvent.setup();
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} />);
    openStep('carry-over');
    await user.click(screen.getByRole('button', { name: 'Delete this step' }));
    expect(
      within(screen.getByTestId('problems')).getByText('Band "No flame signal" of "flame-signal" is not connected to a step'),
    ).toBeInTheDocument();
  });

  it('opens the step named by a link (the isolation check) at first, and ignores an id it does not have', () => {
    const { unmount } = render(
      <TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} readOnly initialStepId="flame-signal" />,
    );
    expect(screen.getByRole('form', { name: 'Step flame-signal' })).toBeInTheDocument();
    unmount();
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} readOnly initialStepId="no-such-step" />);
    expect(screen.getByText('No step selected.')).toBeInTheDocument();
  });

  it('read-only shows the steps without editing controls', () => {
    render(<TreeEditor versionId="v1" revision={1} savedGraph={DEFAULT_TREE_GRAPH} readOnly />);
    expect(screen.queryByRole('button', { name: '+ Inspect' })).toBeNull();
    openStep('flame-signal');
    expect(within(screen.getByRole('form', { name: 'Step flame-signal' })).getByLabelText('Title')).toBeDisabled();
  });
});
