import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { ConflictView } from '@/components/trees/conflict-view';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { TreeGraph } from '@/lib/trees/schema';

// The stale-save view shows each differing field as a lead reads it, not as stored JSON: bands as
// ranges in the canonical unit with where each leads, choices as label → target, cautions by their
// signal word. The flame-signal bands are the default tree's (common practice, no source).
const copy = <T,>(v: T): T => JSON.parse(JSON.stringify(v));

function pair() {
  const mine = copy(DEFAULT_TREE_GRAPH) as TreeGraph;
  const theirs = copy(DEFAULT_TREE_GRAPH) as TreeGraph;
  const flame = mine.steps.find((s) => s.id === 'flame-signal');
  if (flame?.kind !== 'measure') throw new Error('flame-signal is a measure step');
  const low = flame.bands.findIndex((b) => b.label === 'Low flame signal');
  flame.bands[low].to = 1.5;
  flame.bands[low + 1].from = 1.5;
  flame.cautions = [...flame.cautions, { signal: 'DANGER', text: 'Keep clear of the burner flame.' }];
  const inspect = theirs.steps.find((s) => s.kind === 'inspect');
  if (inspect?.kind !== 'inspect') throw new Error('an inspect step');
  inspect.choices[0] = { ...inspect.choices[0], label: 'Renamed choice', outcome: 'f-control-not-sensing' };
  return { mine, theirs, inspect };
}

describe('ConflictView', () => {
  it('shows each differing field readably, on both sides', () => {
    const { mine, theirs, inspect } = pair();
    render(<ConflictView mine={mine} theirs={theirs} theirRevision={4} theirAuthor="Lee Lead" onResolve={() => {}} />);
    const flame = document.querySelector('[data-conflict="flame-signal"]') as HTMLElement;
    const [mineSide, theirSide] = within(flame)
      .getAllByRole('radio')
      .map((r) => r.closest('label') as HTMLElement);

    const bands = mineSide.querySelector('[data-field="bands"]')!.textContent!;
    expect(bands).toContain('[0.1, 1.5) µA "Low flame signal" (below) →');
    expect(bands).not.toMatch(/[{}]/);
    expect(theirSide.querySelector('[data-field="bands"]')!.textContent).toContain('[0.1, 2) µA "Low flame signal"');
    expect(mineSide.querySelector('[data-field="cautions"]')!.textContent).toContain('DANGER: Keep clear of the burner flame.');
    expect(within(mineSide).getByText('Bands')).toBeInTheDocument();
    // Fields both sides share are not listed.
    expect(mineSide.querySelector('[data-field="title"]')).toBeNull();

    const look = document.querySelector(`[data-conflict="${inspect.id}"]`) as HTMLElement;
    const theirChoice = within(look).getAllByRole('radio')[1].closest('label')!;
    expect(theirChoice.querySelector('[data-field="choices"]')!.textContent).toContain(
      `Renamed choice (${inspect.choices[0].value}) → f-control-not-sensing`,
    );
  });

  it('merges per step as picked', async () => {
    const user = userEvent.setup();
    const { mine, theirs, inspect } = pair();
    const onResolve = vi.fn();
    render(<ConflictView mine={mine} theirs={theirs} theirRevision={4} theirAuthor={null} onResolve={onResolve} />);
    expect(screen.getByText(/2 steps differ/)).toBeInTheDocument();
    const look = document.querySelector(`[data-conflict="${inspect.id}"]`) as HTMLElement;
    await user.click(within(look).getAllByRole('radio')[1]);
    await user.click(screen.getByRole('button', { name: 'Save the merge below' }));
    const merged = onResolve.mock.calls[0][0] as TreeGraph;
    const flame = merged.steps.find((s) => s.id === 'flame-signal');
    expect(flame?.kind === 'measure' && flame.cautions.some((c) => c.signal === 'DANGER')).toBe(true);
    const choice = merged.steps.find((s) => s.id === inspect.id);
    expect(choice?.kind === 'inspect' && choice.choices[0].label).toBe('Renamed choice');
  });
});
