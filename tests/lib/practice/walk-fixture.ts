// A small tree of our own with machine-readable probes and an observation (demo bands, not the
// trade's figures): the 24 V secondary, a look at the spark, the fuse's load side, three findings.
// The practice wizard's component test and the walk helpers' tests walk it.
import { treeGraphSchema, type TreeVersion } from '@/lib/trees/schema';

export const PROBED_VERSION: TreeVersion = {
  id: 'tv-practice',
  version: 1,
  graph: treeGraphSchema.parse({
    start: 'secondary',
    steps: [
      {
        id: 'secondary',
        kind: 'measure',
        title: 'Transformer secondary',
        why: 'No 24 V, nothing downstream can work.',
        energy: 'energized',
        quantity: 'vac',
        points: ['R', 'C'],
        probe: { a: 'xfmr-hot', b: 'xfmr-common' },
        bands: [
          { to: 18, label: 'Low', verdict: 'below', outcome: 'f-no-24v' },
          { from: 18, label: 'Present', verdict: 'within', outcome: 'spark-look' },
        ],
      },
      {
        id: 'spark-look',
        kind: 'inspect',
        title: 'Spark during the trial',
        energy: 'energized',
        choices: [
          { value: 'spark', label: 'Spark at the gap', outcome: 'f-other' },
          { value: 'no-spark', label: 'No spark', outcome: 'past-fuse' },
        ],
        observe: { what: 'spark', at: 'proving', choices: { 'at-gap': 'spark', none: 'no-spark' } },
      },
      {
        id: 'past-fuse',
        kind: 'measure',
        title: 'Load side of the fuse',
        energy: 'energized',
        quantity: 'vac',
        points: ['fuse out', 'C'],
        probe: { a: 'fuse-out', b: 'xfmr-common' },
        bands: [
          { to: 2, label: 'None', verdict: 'below', outcome: 'f-fuse' },
          { from: 2, label: 'Present', verdict: 'within', outcome: 'f-other' },
        ],
      },
      {
        id: 'f-fuse',
        kind: 'finding',
        title: 'Fuse open',
        energy: 'any',
        tags: ['power', 'blown-fuse'],
        explanation: 'x',
        remedy: 'y',
        verification: ['z'],
      },
      { id: 'f-no-24v', kind: 'finding', title: 'No 24 V', energy: 'any', explanation: 'x', remedy: 'y', verification: ['z'] },
      { id: 'f-other', kind: 'finding', title: 'Something else', energy: 'any', explanation: 'x', remedy: 'y', verification: ['z'] },
    ],
  }),
};

/** The same tree with no probe on its first step: that step keeps the keypad. */
export const UNPROBED_VERSION: TreeVersion = {
  ...PROBED_VERSION,
  id: 'tv-practice-unprobed',
  graph: {
    ...PROBED_VERSION.graph,
    steps: PROBED_VERSION.graph.steps.map((s) => (s.id === 'secondary' && s.kind === 'measure' ? { ...s, probe: undefined } : s)),
  },
};
