import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { NO_HEAT_DSI_R2 } from '@/lib/trees/builtin/no-heat-dsi-r2';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { showsIgnitionTimeline, treeGraphSchema } from '@/lib/trees/schema';

// "What the wizard shows comes from the tree": a step says whether the ignition sequence is shown
// beside it, so a tree a lead writes gets the same help as the built-in one.

const r1 = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);
const r2 = treeGraphSchema.parse(NO_HEAT_DSI_R2.graph);
const r3 = DEFAULT_TREE_GRAPH;

/** The steps of revisions 1 and 2 that showed the sequence before steps said so themselves. */
const BEFORE_THE_ATTRIBUTE = [
  'spark-observe',
  'valve-voltage',
  'control-valve-output',
  'inlet-pressure',
  'manifold-pressure',
  'lp-inlet-pressure',
  'lp-manifold-pressure',
  'burners-light',
];

describe('the ignition-timeline attribute of a step', () => {
  it('decides for a step of any id', () => {
    expect(showsIgnitionTimeline({ id: 'our-own-spark-look', timeline: true })).toBe(true);
    expect(showsIgnitionTimeline({ id: 'spark-observe', timeline: false })).toBe(false);
    expect(showsIgnitionTimeline({ id: 'our-own-spark-look' })).toBe(false);
  });

  it('survives the schema, and a graph without it parses as before (published graphs never change)', () => {
    const graph = JSON.parse(JSON.stringify(r2));
    graph.steps[0].timeline = true;
    expect(treeGraphSchema.parse(graph).steps[0].timeline).toBe(true);
    expect('timeline' in treeGraphSchema.parse(r2).steps[1]).toBe(false);
  });

  it('still shows the sequence on the sequence steps of revisions 1 and 2, which predate it', () => {
    const shown = [...r1.steps, ...r2.steps].filter(showsIgnitionTimeline).map((s) => s.id);
    expect(new Set(shown)).toEqual(new Set(BEFORE_THE_ATTRIBUTE));
    expect([...r1.steps, ...r2.steps].some((s) => s.timeline !== undefined)).toBe(false);
  });

  it('revision 3 says it on its own steps: every step read at a moment of the trial shows the sequence, no other does', () => {
    for (const step of r3.steps) {
      const atTrial =
        (step.kind === 'measure' && (step.at === 'proving' || step.at === 'after-proving')) ||
        (step.kind === 'inspect' && (step.observe?.at === 'proving' || step.observe?.at === 'after-proving'));
      expect(showsIgnitionTimeline(step), step.id).toBe(atTrial);
      expect(step.timeline ?? false, step.id).toBe(atTrial);
    }
    // The fallback list answers for none of revision 3's steps: each sequence step of revision 2 says it itself.
    for (const id of BEFORE_THE_ATTRIBUTE.filter((id) => r3.steps.some((s) => s.id === id))) {
      expect(r3.steps.find((s) => s.id === id)!.timeline, id).toBe(true);
    }
  });
});
