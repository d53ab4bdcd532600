import { checkConsistency } from '@/lib/consistency';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { FindingStep } from '@/lib/trees/schema';

const finding = (id: string) => {
  const step = DEFAULT_TREE_GRAPH.steps.find((s) => s.id === id);
  if (step?.kind !== 'finding') throw new Error(`no finding ${id}`);
  return step as FindingStep;
};

describe('checkConsistency with the default tree', () => {
  const dirtyRod = finding('f-dirty-flame-rod');

  it('flags a good flame signal against a dirty-rod finding', () => {
    // Common practice, no source (TRADE.md): a few µA is a good signal; a dirty rod gives less than about 2 µA.
    expect(checkConsistency(dirtyRod, [{ stepId: 'flame-signal', value: 4.5, quantity: 'udc' }])).toEqual([
      { stepId: 'flame-signal', value: 4.5, expected: { to: 2 }, reason: expect.any(String) },
    ]);
  });

  it('accepts a low flame signal for a dirty-rod finding', () => {
    expect(checkConsistency(dirtyRod, [{ stepId: 'flame-signal', value: 0.8 }])).toEqual([]);
  });

  it('treats the expectation limits as the bands do: from inclusive, to exclusive', () => {
    expect(checkConsistency(dirtyRod, [{ stepId: 'flame-signal', value: 2 }])).toHaveLength(1);
    expect(checkConsistency(dirtyRod, [{ stepId: 'flame-signal', value: 1.99 }])).toEqual([]);
  });

  it('ignores readings of steps the finding has no expectation about', () => {
    expect(checkConsistency(dirtyRod, [{ stepId: 'line-voltage', value: 0 }])).toEqual([]);
  });

  it('counts only the latest reading of a step', () => {
    const readings = [
      { stepId: 'flame-signal', value: 4.5, takenAt: '2025-01-10T10:05:00Z' },
      { stepId: 'flame-signal', value: 0.8, takenAt: '2025-01-10T10:00:00Z' },
    ];
    // The 4.5 µA reading was taken last, even though it comes first in the list.
    expect(checkConsistency(dirtyRod, readings)).toMatchObject([{ value: 4.5, takenAt: '2025-01-10T10:05:00Z' }]);
    // Without times, the later one in the list wins.
    expect(
      checkConsistency(dirtyRod, [
        { stepId: 'flame-signal', value: 4.5 },
        { stepId: 'flame-signal', value: 0.8 },
      ]),
    ).toEqual([]);
  });

  it('checks every expectation of a finding', () => {
    const pressure = finding('f-gas-valve-not-opening');
    const flagged = checkConsistency(pressure, [
      { stepId: 'inlet-pressure', value: 2 },
      { stepId: 'manifold-pressure', value: 3.4 },
      { stepId: 'lp-inlet-pressure', value: 11.8 },
    ]);
    expect(flagged.map((c) => [c.stepId, c.expected])).toEqual([
      ['inlet-pressure', { from: 4.5 }],
      ['manifold-pressure', { to: 0.5 }],
    ]);
    // No line power: the unit supply reads low, so 0 V is consistent and 120 V is not.
    const noPower = finding('f-no-line-power');
    expect(checkConsistency(noPower, [{ stepId: 'line-voltage', value: 0 }])).toEqual([]);
    expect(checkConsistency(noPower, [{ stepId: 'line-voltage', value: 120 }])).toHaveLength(1);
  });
});
