import { findCycles, outgoingEdges, reachableFrom, successors } from '@/lib/trees/graph';
import type { EnergyNeed, Step, TreeGraph } from '@/lib/trees/schema';

const ANY: EnergyNeed = { electric: 'any', gas: 'any' };

const finding = (id: string): Step => ({
  id,
  kind: 'finding',
  title: id,
  instruction: '',
  cautions: [],
  energy: ANY,
  handles: [],
  explanation: 'e',
  remedy: 'r',
  parts: [],
  verification: ['v'],
  tags: [],
  expects: [],
});
const action = (id: string, outcome: string): Step => ({
  id,
  kind: 'action',
  title: id,
  instruction: '',
  cautions: [],
  energy: ANY,
  handles: [],
  checklist: [],
  outcome,
});
const inspect = (id: string, ...outcomes: string[]): Step => ({
  id,
  kind: 'inspect',
  title: id,
  instruction: '',
  cautions: [],
  energy: ANY,
  handles: [],
  choices: outcomes.map((o, i) => ({ value: `c${i}`, label: `c${i}`, outcome: o })),
});

describe('graph helpers', () => {
  it('lists edges with how each is chosen', () => {
    expect(outgoingEdges(inspect('a', 'x', 'y'))).toEqual([
      { from: 'a', to: 'x', via: { kind: 'choice', value: 'c0' } },
      { from: 'a', to: 'y', via: { kind: 'choice', value: 'c1' } },
    ]);
    expect(outgoingEdges(action('b', 'x'))).toEqual([{ from: 'b', to: 'x', via: { kind: 'confirm' } }]);
    expect(outgoingEdges(finding('f'))).toEqual([]);
    expect(successors(inspect('a', 'x', 'x'))).toEqual(['x']);
    // A unit-record branch leads on by its cases.
    const fact: Step = {
      id: 'u',
      kind: 'fact',
      title: 'u',
      instruction: '',
      cautions: [],
      energy: ANY,
      handles: [],
      fact: 'draft',
      cases: [
        { value: 'induced', label: 'i', outcome: 'x' },
        { value: 'natural', label: 'n', outcome: 'y' },
      ],
    };
    expect(outgoingEdges(fact).map((e) => [e.to, e.via])).toEqual([
      ['x', { kind: 'case', value: 'induced' }],
      ['y', { kind: 'case', value: 'natural' }],
    ]);
  });

  it('finds the reachable steps and the loops', () => {
    const g: TreeGraph = {
      start: 'a',
      afterRepair: [],
      steps: [inspect('a', 'b', 'f'), action('b', 'c'), action('c', 'b'), finding('f'), finding('g')],
    };
    expect(reachableFrom(g, 'a')).toEqual(new Set(['a', 'b', 'c', 'f']));
    expect(findCycles(g)).toEqual([['b', 'c', 'b']]);
    expect(findCycles({ steps: [inspect('a', 'f', 'g'), finding('f'), finding('g')] })).toEqual([]);
  });
});
