import { describe, expect, it } from 'vitest';
import { findingChoices, findingsWithTags, readingsToFinding } from '@/lib/practice/findings';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { TreeGraph } from '@/lib/trees/schema';

const unit = { ignition: 'two-rod', fuel: 'natural-gas', controlSupply: '24v', draft: 'induced' } as const;

// A small tree drawn for the test: start → (fact: draft) → induced: inspect → finding A / measure → finding B; natural: finding C.
const graph = {
  start: 'off',
  steps: [
    { id: 'off', kind: 'action', title: 'Power off', outcome: 'draft' },
    {
      id: 'draft',
      kind: 'fact',
      title: 'Draft',
      fact: 'draft',
      cases: [
        { value: 'induced', label: 'Induced', outcome: 'look' },
        { value: 'natural', label: 'Natural', outcome: 'f-c' },
      ],
    },
    {
      id: 'look',
      kind: 'inspect',
      title: 'Look',
      choices: [
        { value: 'a', label: 'A', outcome: 'f-a' },
        { value: 'b', label: 'B', outcome: 'meter' },
      ],
    },
    {
      id: 'meter',
      kind: 'measure',
      title: 'Meter',
      quantity: 'vac',
      points: ['x', 'y'],
      bands: [
        { to: 1, outcome: 'f-b' },
        { from: 1, outcome: 'f-a' },
      ],
    },
    { id: 'f-a', kind: 'finding', title: 'A', tags: ['power', 'a'] },
    { id: 'f-b', kind: 'finding', title: 'B', tags: ['power', 'b'] },
    { id: 'f-c', kind: 'finding', title: 'C', tags: [] },
  ],
} as unknown as TreeGraph;

describe('readingsToFinding', () => {
  it('counts readings only, takes the unit-record case of the unit, and the fewest of two paths', () => {
    expect(readingsToFinding(graph, 'f-a', unit)).toBe(1);
    expect(readingsToFinding(graph, 'f-b', unit)).toBe(2);
    expect(readingsToFinding(graph, 'f-c', unit)).toBeNull();
    expect(readingsToFinding(graph, 'f-c', { ...unit, draft: 'natural' })).toBe(0);
  });

  it('reaches every finding of the default tree on some unit, each after at least one reading', () => {
    const units = (['two-rod', 'single-rod'] as const).flatMap((ignition) =>
      (['natural-gas', 'lp'] as const).flatMap((fuel) =>
        (['24v', 'line'] as const).flatMap((controlSupply) =>
          (['induced', 'natural'] as const).map((draft) => ({ ignition, fuel, controlSupply, draft })),
        ),
      ),
    );
    for (const f of findingChoices(DEFAULT_TREE_GRAPH)) {
      const counts = units.map((u) => readingsToFinding(DEFAULT_TREE_GRAPH, f.id, u)).filter((n): n is number => n !== null);
      expect(counts.length, f.id).toBeGreaterThan(0);
      expect(Math.min(...counts), f.id).toBeGreaterThanOrEqual(1);
    }
  });
});

describe('findingChoices', () => {
  it('lists the findings of a tree with their titles', () => {
    expect(findingChoices(graph)).toEqual([
      { id: 'f-a', title: 'A' },
      { id: 'f-b', title: 'B' },
      { id: 'f-c', title: 'C' },
    ]);
  });
});

describe('findingsWithTags', () => {
  it('keeps the findings that carry every tag, none for no tags', () => {
    expect(findingsWithTags(graph, ['power']).map((f) => f.id)).toEqual(['f-a', 'f-b']);
    expect(findingsWithTags(graph, ['power', 'b']).map((f) => f.id)).toEqual(['f-b']);
    expect(findingsWithTags(graph, ['power', 'c'])).toEqual([]);
    expect(findingsWithTags(graph, [])).toEqual([]);
  });
});
