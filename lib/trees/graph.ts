// Graph helpers over a fault tree's steps, shared by the validator, the machine compiler and tests.
import type { Step, TreeGraph } from '@/lib/trees/schema';

/** How an edge is chosen: a band of a measure step, a choice of an inspect step, or a confirmation. */
export type EdgeVia =
  { kind: 'band'; index: number } | { kind: 'choice'; value: string } | { kind: 'case'; value: string } | { kind: 'confirm' };

export interface Edge {
  from: string;
  to: string;
  via: EdgeVia;
}

/**
 * The energy changes the diagnosis can insert before a step, in the order they are done: what goes
 * off first (electricity, then gas), then what comes back (gas with its leak test, then power).
 */
export const ENERGY_CHANGES = ['lock-out', 'gas-off', 'gas-on', 're-energize'] as const;
export type EnergyChange = (typeof ENERGY_CHANGES)[number];

/**
 * An inserted procedure's state id: its changes joined by "+", "--", the step it leads to
 * ("lock-out--spark-gap", "gas-on+re-energize--inlet-pressure"). Tree step ids must not look like one.
 */
export function procedureStateId(changes: readonly EnergyChange[], targetId: string): string {
  return `${changes.join('+')}--${targetId}`;
}

/** The changes and target of a procedure state id, or null for a tree step id. */
export function parseProcedureStateId(stateId: string): { changes: EnergyChange[]; targetId: string } | null {
  const at = stateId.indexOf('--');
  if (at <= 0) return null;
  const changes = stateId.slice(0, at).split('+');
  if (!changes.every((c): c is EnergyChange => (ENERGY_CHANGES as readonly string[]).includes(c))) return null;
  return { changes: changes as EnergyChange[], targetId: stateId.slice(at + 2) };
}

export function outgoingEdges(step: Step): Edge[] {
  switch (step.kind) {
    case 'measure':
      return step.bands.flatMap((band, index) =>
        band.outcome === undefined ? [] : [{ from: step.id, to: band.outcome, via: { kind: 'band' as const, index } }],
      );
    case 'fact':
      return step.cases.map((c) => ({ from: step.id, to: c.outcome, via: { kind: 'case', value: c.value } }));
    case 'inspect':
      return step.choices.map((choice) => ({ from: step.id, to: choice.outcome, via: { kind: 'choice', value: choice.value } }));
    case 'action':
      return [{ from: step.id, to: step.outcome, via: { kind: 'confirm' } }];
    case 'finding':
      return [];
  }
}

/** Targets, each once, in the order the step lists them. */
export function successors(step: Step): string[] {
  return [...new Set(outgoingEdges(step).map((e) => e.to))];
}

/** First step per id (duplicates are the validator's business). */
export function stepMap(graph: Pick<TreeGraph, 'steps'>): Map<string, Step> {
  const map = new Map<string, Step>();
  for (const step of graph.steps) if (!map.has(step.id)) map.set(step.id, step);
  return map;
}

export function reachableFrom(graph: Pick<TreeGraph, 'steps'>, start: string): Set<string> {
  const steps = stepMap(graph);
  const seen = new Set<string>();
  const stack = [start];
  while (stack.length > 0) {
    const id = stack.pop()!;
    const step = steps.get(id);
    if (seen.has(id) || !step) continue;
    seen.add(id);
    stack.push(...successors(step));
  }
  return seen;
}

/** Every loop found by a depth-first walk, each as the ids along it with the first repeated at the end. */
export function findCycles(graph: Pick<TreeGraph, 'steps'>): string[][] {
  const steps = stepMap(graph);
  const state = new Map<string, 'open' | 'done'>();
  const cycles: string[][] = [];
  const trail: string[] = [];

  const visit = (id: string) => {
    state.set(id, 'open');
    trail.push(id);
    const step = steps.get(id);
    for (const next of step ? successors(step) : []) {
      if (!steps.has(next)) continue;
      const s = state.get(next);
      if (s === 'open') cycles.push([...trail.slice(trail.indexOf(next)), next]);
      else if (s === undefined) visit(next);
    }
    trail.pop();
    state.set(id, 'done');
  };
  for (const id of steps.keys()) if (!state.has(id)) visit(id);
  return cycles;
}
