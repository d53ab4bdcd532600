// Pure edits of a fault-tree graph held by the editor: the outgoing slots of a step (a band, a
// choice, a case, the confirmation), connecting and disconnecting them, adding, renaming and
// deleting steps, keeping a measure step's bands contiguous, the top-down layout and the problems
// shown live. An unconnected slot has the outcome "" until the lead connects it.
import dagre from '@dagrejs/dagre';
import { checkGraph, validateGraph, type GraphProblem } from '@/lib/trees/validate';
import { treeGraphSchema, UNIT_FACTS, type Band, type Step, type StepKind, type TreeGraph } from '@/lib/trees/schema';

/** One outgoing slot of a step: where a band, choice, case or confirmation leads. */
export interface Slot {
  /** The React Flow handle id: "band:2", "choice:no-spark", "case:lp", "confirm". */
  id: string;
  label: string;
  /** The step it leads to; "" when not connected yet. */
  target: string;
}

export function slotsOf(step: Step): Slot[] {
  switch (step.kind) {
    case 'measure':
      return step.bands.flatMap((band, i) =>
        band.askAgain !== undefined ? [] : [{ id: `band:${i}`, label: band.label, target: band.outcome ?? '' }],
      );
    case 'inspect':
      return step.choices.map((c) => ({ id: `choice:${c.value}`, label: c.label, target: c.outcome }));
    case 'fact':
      return step.cases.map((c) => ({ id: `case:${c.value}`, label: c.value, target: c.outcome }));
    case 'action':
      return [{ id: 'confirm', label: 'Done', target: step.outcome }];
    case 'finding':
      return [];
  }
}

function replaceStep(graph: TreeGraph, id: string, next: Step): TreeGraph {
  return { ...graph, steps: graph.steps.map((s) => (s.id === id ? next : s)) };
}

/** Points one slot of a step at `target` ("" disconnects it). Unknown steps or slots leave the graph as it is. */
export function setSlotTarget(graph: TreeGraph, stepId: string, slotId: string, target: string): TreeGraph {
  const step = graph.steps.find((s) => s.id === stepId);
  if (!step) return graph;
  const [kind, key] = slotId.includes(':') ? [slotId.slice(0, slotId.indexOf(':')), slotId.slice(slotId.indexOf(':') + 1)] : [slotId, ''];
  switch (step.kind) {
    case 'measure': {
      if (kind !== 'band') return graph;
      const index = Number(key);
      if (!step.bands[index]) return graph;
      const bands = step.bands.map((b, i) => (i === index ? { ...b, outcome: target, askAgain: undefined } : b));
      return replaceStep(graph, stepId, { ...step, bands });
    }
    case 'inspect':
      if (kind !== 'choice') return graph;
      return replaceStep(graph, stepId, { ...step, choices: step.choices.map((c) => (c.value === key ? { ...c, outcome: target } : c)) });
    case 'fact':
      if (kind !== 'case') return graph;
      return replaceStep(graph, stepId, { ...step, cases: step.cases.map((c) => (c.value === key ? { ...c, outcome: target } : c)) });
    case 'action':
      return kind === 'confirm' ? replaceStep(graph, stepId, { ...step, outcome: target }) : graph;
    case 'finding':
      return graph;
  }
}

/** Every slot pointing at `from` points at `to` instead ("" disconnects). */
function retarget(step: Step, from: string, to: string): Step {
  const swap = (id: string) => (id === from ? to : id);
  switch (step.kind) {
    case 'measure':
      return { ...step, bands: step.bands.map((b) => (b.outcome === from ? { ...b, outcome: to } : b)), reference: step.reference };
    case 'inspect':
      return { ...step, choices: step.choices.map((c) => ({ ...c, outcome: swap(c.outcome) })) };
    case 'fact':
      return { ...step, cases: step.cases.map((c) => ({ ...c, outcome: swap(c.outcome) })) };
    case 'action':
      return { ...step, outcome: swap(step.outcome) };
    case 'finding':
      return step;
  }
}

/** Removes a step; what led to it is left unconnected, and the start moves to the first step left. */
export function deleteStep(graph: TreeGraph, id: string): TreeGraph {
  const steps = graph.steps.filter((s) => s.id !== id).map((s) => retarget(s, id, ''));
  if (steps.length === 0) return graph;
  return {
    ...graph,
    start: graph.start === id ? steps[0].id : graph.start,
    steps,
    afterRepair: graph.afterRepair.filter((r) => r.measure !== id && r.reconnect !== id),
  };
}

/** Renames a step and everything that refers to it (outcomes, the start, references, expectations). */
export function renameStep(graph: TreeGraph, from: string, to: string): TreeGraph {
  if (from === to || graph.steps.some((s) => s.id === to)) return graph;
  const steps = graph.steps.map((s) => {
    let next = retarget(s.id === from ? { ...s, id: to } : s, from, to);
    if (next.kind === 'measure' && next.reference?.step === from) next = { ...next, reference: { ...next.reference, step: to } };
    if (next.kind === 'finding') next = { ...next, expects: next.expects.map((e) => (e.step === from ? { ...e, step: to } : e)) };
    return next;
  });
  return {
    start: graph.start === from ? to : graph.start,
    steps,
    afterRepair: graph.afterRepair.map((r) => ({
      measure: r.measure === from ? to : r.measure,
      ...(r.reconnect !== undefined ? { reconnect: r.reconnect === from ? to : r.reconnect } : {}),
    })),
  };
}

/** A fresh id "new-inspect", "new-inspect-2", … not used in the graph. */
export function freshId(graph: TreeGraph, base: string): string {
  const taken = new Set(graph.steps.map((s) => s.id));
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

/** A new step of a kind with the least a lead must fill in; its slots start unconnected. */
export function newStep(graph: TreeGraph, kind: StepKind): Step {
  const id = freshId(graph, `new-${kind}`);
  const base = { id, title: '', instruction: '', cautions: [], energy: { electric: 'any' as const, gas: 'any' as const }, handles: [] };
  switch (kind) {
    case 'measure':
      return {
        ...base,
        kind,
        quantity: 'vac',
        points: ['', ''],
        bands: [
          { to: 1, label: 'Low', verdict: 'below', outcome: '' },
          { from: 1, label: 'Normal', verdict: 'within', outcome: '' },
        ],
        aids: [],
      };
    case 'inspect':
      return {
        ...base,
        kind,
        choices: [
          { value: 'yes', label: 'Yes', outcome: '' },
          { value: 'no', label: 'No', outcome: '' },
        ],
      };
    case 'fact':
      return { ...base, kind, fact: 'ignition', cases: UNIT_FACTS.ignition.map((value) => ({ value, label: value, outcome: '' })) };
    case 'action':
      return { ...base, kind, checklist: [], outcome: '' };
    case 'finding':
      return { ...base, kind, explanation: '', remedy: '', parts: [], verification: [''], tags: [], expects: [] };
  }
}

export function addStep(graph: TreeGraph, step: Step): TreeGraph {
  return { ...graph, steps: [...graph.steps, step] };
}

// ---- Bands: contiguous by construction. Band i ends where band i+1 starts; the first is open below
// and the last open above, so the form only ever edits the boundaries between them.

/** Moves the boundary between band `index` and band `index + 1` to `value`. */
export function moveBoundary(bands: readonly Band[], index: number, value: number): Band[] {
  if (index < 0 || index >= bands.length - 1 || !Number.isFinite(value)) return [...bands];
  return bands.map((b, i) => (i === index ? { ...b, to: value } : i === index + 1 ? { ...b, from: value } : b));
}

/** Splits band `index` at `at` into two bands; the new upper half copies the band's outcome. */
export function splitBand(bands: readonly Band[], index: number, at: number): Band[] {
  const band = bands[index];
  if (!band || !Number.isFinite(at)) return [...bands];
  if ((band.from !== undefined && at <= band.from) || (band.to !== undefined && at >= band.to)) return [...bands];
  const lower: Band = { ...band, to: at };
  const upper: Band = { ...band, from: at, label: `${band.label} (upper)` };
  return [...bands.slice(0, index), lower, upper, ...bands.slice(index + 1)];
}

/** A value inside band `index` to split at: the middle of a closed band, one unit in from an open side. */
export function splitPoint(band: Band): number {
  if (band.from !== undefined && band.to !== undefined) return (band.from + band.to) / 2;
  if (band.from !== undefined) return band.from + 1;
  if (band.to !== undefined) return band.to - 1;
  return 0;
}

/** Removes band `index`; its neighbour below (or above, for the first) takes over its range. */
export function removeBand(bands: readonly Band[], index: number): Band[] {
  if (bands.length <= 1 || !bands[index]) return [...bands];
  const removed = bands[index];
  if (index === 0) return bands.slice(1).map((b, i) => (i === 0 ? { ...b, from: undefined } : b));
  return bands.flatMap((b, i) => (i === index ? [] : i === index - 1 ? [{ ...b, to: removed.to }] : [b]));
}

// ---- Layout

export const NODE_WIDTH = 240;
export const NODE_HEIGHT = 96;

/** Top-down positions (top-left corners) of the steps, from dagre. */
export function layoutGraph(graph: TreeGraph): Map<string, { x: number; y: number }> {
  const g = new dagre.graphlib.Graph();
  g.setGraph({ rankdir: 'TB', nodesep: 40, ranksep: 80 });
  g.setDefaultEdgeLabel(() => ({}));
  const ids = new Set(graph.steps.map((s) => s.id));
  for (const step of graph.steps) g.setNode(step.id, { width: NODE_WIDTH, height: NODE_HEIGHT });
  for (const step of graph.steps) {
    for (const slot of slotsOf(step)) if (slot.target && ids.has(slot.target) && slot.target !== step.id) g.setEdge(step.id, slot.target);
  }
  dagre.layout(g);
  const out = new Map<string, { x: number; y: number }>();
  for (const step of graph.steps) {
    const node = g.node(step.id);
    out.set(step.id, { x: (node?.x ?? 0) - NODE_WIDTH / 2, y: (node?.y ?? 0) - NODE_HEIGHT / 2 });
  }
  return out;
}

// ---- Problems

const UNCONNECTED = 'x-unconnected-x';

function slotWord(slotId: string): string {
  if (slotId.startsWith('band:')) return 'Band';
  if (slotId.startsWith('choice:')) return 'Choice';
  if (slotId.startsWith('case:')) return 'Case';
  return 'The confirmation';
}

/**
 * The problems of the graph as the lead edits it: unconnected slots in plain words, then what the
 * server's validator says (the same validateGraph the server runs on save and publish).
 */
export function editorProblems(graph: TreeGraph): GraphProblem[] {
  const problems: GraphProblem[] = [];
  let patched = graph;
  for (const step of graph.steps) {
    for (const slot of slotsOf(step)) {
      if (slot.target === '') {
        problems.push({
          stepId: step.id,
          message: `${slotWord(slot.id)}${slot.id === 'confirm' ? '' : ` "${slot.label}"`} of "${step.id}" is not connected to a step`,
        });
        patched = setSlotTarget(patched, step.id, slot.id, UNCONNECTED);
      }
    }
  }
  const result = validateGraph(patched);
  if (result.ok) return problems;
  // The unconnected slots were filled with a placeholder so the graph rules still run; drop what they say about it.
  const rest = result.problems
    .filter((p) => !p.message.includes(UNCONNECTED))
    .map((p) => (p.stepId ? { ...p, message: p.message.replace(/^steps\.\d+\.([\w.]+): /, `"${p.stepId}", $1: `) } : p));
  // A field the schema refuses (an empty title) stops the server's check there; the editor's graph
  // has every list in place, so the graph rules are run as well to list everything at once.
  if (!treeGraphSchema.safeParse(patched).success) {
    try {
      const seen = new Set(rest.map((p) => p.message));
      for (const p of checkGraph(patched)) if (!p.message.includes(UNCONNECTED) && !seen.has(p.message)) rest.push(p);
    } catch {
      // A graph too malformed for the rules: the schema's problems say enough.
    }
  }
  return [...problems, ...rest];
}

// ---- Stored drafts

type Loose = Record<string, unknown>;

/**
 * A draft's graph as stored (it may not pass the schema yet) in the shape the editor works on: the
 * lists every kind has filled in, so the form and the canvas can show it and the lead can fix it.
 */
export function editableGraph(stored: { start: string; steps: Loose[]; afterRepair?: unknown[] }): TreeGraph {
  const parsed = treeGraphSchema.safeParse(stored);
  if (parsed.success) return parsed.data;
  const steps = stored.steps.map((raw) => {
    const s: Loose = { ...raw };
    s.id = typeof s.id === 'string' ? s.id : '';
    s.title = typeof s.title === 'string' ? s.title : '';
    s.instruction = typeof s.instruction === 'string' ? s.instruction : '';
    s.cautions = Array.isArray(s.cautions) ? s.cautions : [];
    s.handles = Array.isArray(s.handles) ? s.handles : [];
    const energy = (s.energy ?? {}) as Loose;
    s.energy = { electric: energy.electric ?? 'any', gas: energy.gas ?? 'any' };
    const kind = ['measure', 'inspect', 'action', 'fact', 'finding'].includes(s.kind as string) ? (s.kind as StepKind) : 'action';
    s.kind = kind;
    const list = (k: string) => (s[k] = Array.isArray(s[k]) ? s[k] : []);
    if (kind === 'measure') {
      list('bands');
      list('aids');
      s.points = Array.isArray(s.points) ? s.points : ['', ''];
      s.quantity = s.quantity ?? 'vac';
    }
    if (kind === 'inspect') list('choices');
    if (kind === 'fact') {
      list('cases');
      s.fact = s.fact ?? 'ignition';
    }
    if (kind === 'action') {
      list('checklist');
      s.outcome = typeof s.outcome === 'string' ? s.outcome : '';
    }
    if (kind === 'finding') {
      for (const k of ['parts', 'verification', 'tags', 'expects']) list(k);
      s.explanation = s.explanation ?? '';
      s.remedy = s.remedy ?? '';
    }
    return s as unknown as Step;
  });
  return {
    start: stored.start,
    steps,
    afterRepair: (Array.isArray(stored.afterRepair) ? stored.afterRepair : []) as TreeGraph['afterRepair'],
  };
}

/** How two graphs differ step by step: what only one of them has, and what both have but differently. */
export interface StepConflict {
  stepId: string;
  mine: Step | null;
  theirs: Step | null;
}

export function stepConflicts(mine: TreeGraph, theirs: TreeGraph): StepConflict[] {
  const a = new Map(mine.steps.map((s) => [s.id, s]));
  const b = new Map(theirs.steps.map((s) => [s.id, s]));
  const ids = [...new Set([...a.keys(), ...b.keys()])];
  return ids
    .filter((id) => JSON.stringify(a.get(id) ?? null) !== JSON.stringify(b.get(id) ?? null))
    .map((id) => ({ stepId: id, mine: a.get(id) ?? null, theirs: b.get(id) ?? null }));
}

/**
 * Theirs with the lead's chosen steps taken from mine: `pick` says, per conflicting step, whose
 * version to keep (a step missing from the chosen side is left out).
 */
export function mergeGraphs(mine: TreeGraph, theirs: TreeGraph, pick: Record<string, 'mine' | 'theirs'>): TreeGraph {
  const conflicts = new Map(stepConflicts(mine, theirs).map((c) => [c.stepId, c]));
  const order = [...theirs.steps.map((s) => s.id), ...mine.steps.map((s) => s.id).filter((id) => !theirs.steps.some((s) => s.id === id))];
  const steps: Step[] = [];
  for (const id of order) {
    const c = conflicts.get(id);
    const step = c ? (pick[id] === 'mine' ? c.mine : c.theirs) : (theirs.steps.find((s) => s.id === id) ?? null);
    if (step) steps.push(step);
  }
  const start =
    steps.some((s) => s.id === mine.start) && mine.start !== theirs.start && pick[mine.start] === 'mine' ? mine.start : theirs.start;
  return { start, steps, afterRepair: theirs.afterRepair };
}
