// The isolation check's time (issue 9): every fault of the library through the default tree, and 25
// faults through a generated 200-step tree, each in this one Node.js process (one core). Run by
// `npm run bench` (bench/run.mjs) through tsx, or alone: `npx tsx bench/isolation.ts [--json]`.
//
// The generated tree is the default tree with a run of extra steps put before its start, in the way
// of every walk: a line-voltage reading (its low band to the no-line-power finding, so that fault
// still isolates) and a look at the thermostat (either answer leads on), alternating, until the tree
// has 200 steps. Every fault then walks a hundred steps more than it would on the default tree.
import { FAULTS } from '@/lib/bench/faults';
import { isolationCheck, type IsolationRow } from '@/lib/bench/isolation';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { treeGraphSchema, type Step, type TreeGraph } from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';

const TARGET_MS = 100;
const GENERATED_STEPS = 200;
const GENERATED_FAULTS = 25;
const RUNS = 7;

export function generatedTree(size = GENERATED_STEPS): TreeGraph {
  const base = DEFAULT_TREE_GRAPH;
  const extra = size - base.steps.length;
  if (extra < 1) throw new Error(`The default tree already has ${base.steps.length} steps.`);
  const ids = Array.from({ length: extra }, (_, i) => `pad-${i + 1}`);
  const pad: Step[] = ids.map((id, i) => {
    const next = ids[i + 1] ?? base.start;
    if (i % 2 === 0) {
      return {
        id,
        kind: 'measure',
        title: `Line voltage again (${i + 1})`,
        instruction: '',
        cautions: [],
        energy: { electric: 'on', gas: 'any' },
        handles: [],
        quantity: 'vac',
        points: ['line hot', 'line neutral'],
        probe: { a: 'line-hot', b: 'line-neutral' },
        bands: [
          { to: 108, label: 'Low', verdict: 'below', outcome: 'f-no-line-power' },
          { from: 108, label: 'Normal', verdict: 'within', outcome: next },
        ],
        aids: [],
      };
    }
    return {
      id,
      kind: 'inspect',
      title: `Thermostat display (${i + 1})`,
      instruction: '',
      cautions: [],
      energy: { electric: 'any', gas: 'any' },
      handles: [],
      observe: { what: 'thermostat', choices: { calling: 'calling', 'not-calling': 'not-calling' } },
      choices: [
        { value: 'calling', label: 'Calling', outcome: next },
        { value: 'not-calling', label: 'Not calling', outcome: next },
      ],
    };
  });
  const graph = treeGraphSchema.parse({ ...base, start: ids[0], steps: [...pad, ...base.steps] });
  const checked = validateGraph(graph);
  if (!checked.ok) throw new Error(`The generated tree does not validate: ${checked.problems[0].message}`);
  return checked.graph;
}

function time(fn: () => IsolationRow[]): { ms: number; rows: IsolationRow[] } {
  fn(); // warm-up (JIT), untimed
  const samples: number[] = [];
  let rows: IsolationRow[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    rows = fn();
    samples.push(performance.now() - t0);
  }
  samples.sort((a, b) => a - b);
  return { ms: samples[Math.floor(samples.length / 2)], rows };
}

export function runIsolationBench() {
  const big = generatedTree();
  const faults = FAULTS.slice(0, GENERATED_FAULTS);
  const def = time(() => isolationCheck(DEFAULT_TREE_GRAPH));
  const gen = time(() => isolationCheck(big, { faults }));
  const walked = (rows: IsolationRow[]) => rows.reduce((n, r) => n + r.path.length, 0);
  return {
    defaultTree: {
      steps: DEFAULT_TREE_GRAPH.steps.length,
      faults: def.rows.length,
      ok: def.rows.filter((r) => r.ok).length,
      stepsWalked: walked(def.rows),
      medianMs: def.ms,
    },
    generatedTree: {
      steps: big.steps.length,
      faults: gen.rows.length,
      ok: gen.rows.filter((r) => r.ok).length,
      stepsWalked: walked(gen.rows),
      medianMs: gen.ms,
      targetMs: TARGET_MS,
      met: gen.ms <= TARGET_MS,
    },
    runs: RUNS,
  };
}

const invokedDirectly = process.argv[1]?.endsWith('isolation.ts');
if (invokedDirectly) {
  const r = runIsolationBench();
  if (process.argv.includes('--json')) {
    console.log(JSON.stringify(r));
  } else {
    const d = r.defaultTree;
    const g = r.generatedTree;
    console.log(`Isolation check (median of ${r.runs} runs after a warm-up, one process):`);
    console.log(
      `  default tree: ${d.faults} faults through ${d.steps} steps, ${d.ok}/${d.faults} isolated, ${d.stepsWalked} steps walked: ${d.medianMs.toFixed(1)} ms`,
    );
    console.log(
      `  generated tree: ${g.faults} faults through ${g.steps} steps, ${g.ok}/${g.faults} isolated, ${g.stepsWalked} steps walked: ${g.medianMs.toFixed(1)} ms (target ≤ ${g.targetMs} ms: ${g.met ? 'met' : 'missed'})`,
    );
  }
}
