import { describe, expect, it } from 'vitest';
import {
  deleteStep,
  editableGraph,
  editorProblems,
  layoutGraph,
  mergeGraphs,
  moveBoundary,
  newStep,
  removeBand,
  renameStep,
  setSlotTarget,
  slotsOf,
  splitBand,
  stepConflicts,
} from '@/components/trees/editor/graph-edit';
import { checkBandCoverage } from '@/lib/bands';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { Band, MeasureStep, TreeGraph } from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';

const flame = () => DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'flame-signal') as MeasureStep;

describe('band edits keep the bands contiguous', () => {
  it('moving a boundary moves the end of one band and the start of the next together', () => {
    const bands = moveBoundary(flame().bands, 2, 1.5);
    expect(bands[2].to).toBe(1.5);
    expect(bands[3].from).toBe(1.5);
    expect(checkBandCoverage(bands)).toEqual([]);
  });

  it('splitting a band makes two bands meeting at the split point, covering the same range', () => {
    const bands = splitBand(flame().bands, 3, 5);
    expect(bands).toHaveLength(5);
    expect(bands[3]).toMatchObject({ from: 2, to: 5 });
    expect(bands[4]).toMatchObject({ from: 5, outcome: 'f-control-not-sensing' });
    expect(bands[4].to).toBeUndefined();
    expect(checkBandCoverage(bands)).toEqual([]);
  });

  it('refuses a split outside the band', () => {
    expect(splitBand(flame().bands, 2, 7)).toEqual(flame().bands);
  });

  it('removing a band hands its range to the neighbour, the first band stays open below', () => {
    const middle = removeBand(flame().bands, 2);
    expect(middle[1]).toMatchObject({ from: 0, to: 2 });
    expect(checkBandCoverage(middle)).toEqual([]);
    const first = removeBand(flame().bands, 0);
    expect(first[0].from).toBeUndefined();
    expect(checkBandCoverage(first)).toEqual([]);
  });

  it('a boundary moved past the next one is caught by the same coverage check the server runs', () => {
    const bands: Band[] = moveBoundary(flame().bands, 1, 3); // band 2 now runs 3 → 2
    expect(checkBandCoverage(bands).join(' ')).toMatch(/starts at or above/);
  });
});

describe('connecting and deleting steps', () => {
  it('a new inspect step has two unconnected choices and is flagged until connected and reached', () => {
    const step = newStep(DEFAULT_TREE_GRAPH, 'inspect');
    let graph: TreeGraph = { ...DEFAULT_TREE_GRAPH, steps: [...DEFAULT_TREE_GRAPH.steps, { ...step, title: 'Look at the burner' }] };
    const before = editorProblems(graph).map((p) => p.message);
    expect(before).toContain('Choice "Yes" of "new-inspect" is not connected to a step');
    expect(before).toContain('Choice "No" of "new-inspect" is not connected to a step');
    expect(before.some((m) => m.includes('cannot be reached'))).toBe(true);

    graph = setSlotTarget(graph, 'new-inspect', 'choice:yes', 'f-control-not-sensing');
    graph = setSlotTarget(graph, 'new-inspect', 'choice:no', 'carry-over');
    graph = setSlotTarget(graph, 'flame-signal', 'band:3', 'new-inspect');
    expect(editorProblems(graph)).toEqual([]);
    expect(validateGraph(graph).ok).toBe(true);
  });

  it('the default tree has no problems', () => {
    expect(editorProblems(DEFAULT_TREE_GRAPH)).toEqual([]);
  });

  it('deleting a step leaves what led to it unconnected, and says so', () => {
    const graph = deleteStep(DEFAULT_TREE_GRAPH, 'carry-over');
    expect(graph.steps.some((s) => s.id === 'carry-over')).toBe(false);
    const fs = graph.steps.find((s) => s.id === 'flame-signal') as MeasureStep;
    expect(fs.bands[1].outcome).toBe('');
    expect(editorProblems(graph).map((p) => p.message)).toContain('Band "No flame signal" of "flame-signal" is not connected to a step');
  });

  it('renaming a step renames every reference to it', () => {
    const graph = renameStep(DEFAULT_TREE_GRAPH, 'flame-signal', 'flame-current');
    expect(graph.steps.some((s) => s.id === 'flame-signal')).toBe(false);
    expect(graph.afterRepair[0].measure).toBe('flame-current');
    expect(validateGraph(graph).ok).toBe(true);
  });

  it('renaming to an id in use changes nothing', () => {
    expect(renameStep(DEFAULT_TREE_GRAPH, 'flame-signal', 'carry-over')).toBe(DEFAULT_TREE_GRAPH);
  });

  it('a band that asks again has no slot', () => {
    expect(slotsOf(flame()).map((s) => s.id)).toEqual(['band:1', 'band:2', 'band:3']);
  });
});

describe('layout', () => {
  it('lays the tree out top-down: every edge goes to a lower row', () => {
    const pos = layoutGraph(DEFAULT_TREE_GRAPH);
    for (const step of DEFAULT_TREE_GRAPH.steps) {
      for (const slot of slotsOf(step)) expect(pos.get(slot.target)!.y).toBeGreaterThan(pos.get(step.id)!.y);
    }
  });
});

describe('merging two saves of one draft', () => {
  const retitle = (g: TreeGraph, id: string, title: string): TreeGraph => ({
    ...g,
    steps: g.steps.map((s) => (s.id === id ? { ...s, title } : s)),
  });

  it('lists the steps that differ and takes each from the side picked', () => {
    const mine = retitle(DEFAULT_TREE_GRAPH, 'carry-over', 'Mine');
    const theirs = retitle(DEFAULT_TREE_GRAPH, 'flame-signal', 'Theirs');
    const conflicts = stepConflicts(mine, theirs);
    expect(conflicts.map((c) => c.stepId).sort()).toEqual(['carry-over', 'flame-signal']);
    const merged = mergeGraphs(mine, theirs, { 'carry-over': 'mine', 'flame-signal': 'theirs' });
    expect(merged.steps.find((s) => s.id === 'carry-over')?.title).toBe('Mine');
    expect(merged.steps.find((s) => s.id === 'flame-signal')?.title).toBe('Theirs');
    expect(merged.steps).toHaveLength(DEFAULT_TREE_GRAPH.steps.length);
  });

  it('keeps a step only one side added when that side is picked, and drops it otherwise', () => {
    const step = newStep(DEFAULT_TREE_GRAPH, 'finding');
    const mine = { ...DEFAULT_TREE_GRAPH, steps: [...DEFAULT_TREE_GRAPH.steps, step] };
    expect(mergeGraphs(mine, DEFAULT_TREE_GRAPH, { [step.id]: 'mine' }).steps.some((s) => s.id === step.id)).toBe(true);
    expect(mergeGraphs(mine, DEFAULT_TREE_GRAPH, { [step.id]: 'theirs' }).steps.some((s) => s.id === step.id)).toBe(false);
  });
});

describe('a stored draft that does not parse yet', () => {
  it('is given the lists the editor needs, and its problems are still listed', () => {
    const graph = editableGraph({ start: 'a', steps: [{ id: 'a', kind: 'inspect', title: 'Look' }] });
    const step = graph.steps[0];
    expect(step.kind === 'inspect' && step.choices).toEqual([]);
    expect(step.cautions).toEqual([]);
    expect(editorProblems(graph).some((p) => p.message.includes('at least two choices'))).toBe(true);
  });
});
