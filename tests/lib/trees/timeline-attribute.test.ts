import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { showsIgnitionTimeline, treeGraphSchema } from '@/lib/trees/schema';

// "What the wizard shows comes from the tree": a step says whether the ignition sequence is shown
// beside it, so a tree a lead writes gets the same help as the built-in one.

const r1 = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);

describe('the ignition-timeline attribute of a step', () => {
  it('decides for a step of any id', () => {
    expect(showsIgnitionTimeline({ id: 'our-own-spark-look', timeline: true })).toBe(true);
    expect(showsIgnitionTimeline({ id: 'spark-observe', timeline: false })).toBe(false);
    expect(showsIgnitionTimeline({ id: 'our-own-spark-look' })).toBe(false);
  });

  it('survives the schema, and a graph without it parses as before (published graphs never change)', () => {
    const graph = JSON.parse(JSON.stringify(DEFAULT_TREE_GRAPH));
    graph.steps[0].timeline = true;
    expect(treeGraphSchema.parse(graph).steps[0].timeline).toBe(true);
    expect('timeline' in treeGraphSchema.parse(DEFAULT_TREE_GRAPH).steps[1]).toBe(false);
  });

  it('still shows the sequence on the built-in revisions’ sequence steps, which predate it', () => {
    const shown = [...r1.steps, ...DEFAULT_TREE_GRAPH.steps].filter(showsIgnitionTimeline).map((s) => s.id);
    expect(new Set(shown)).toEqual(
      new Set([
        'spark-observe',
        'valve-voltage',
        'control-valve-output',
        'inlet-pressure',
        'manifold-pressure',
        'lp-inlet-pressure',
        'lp-manifold-pressure',
        'burners-light',
      ]),
    );
  });
});
