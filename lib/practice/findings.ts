// What a practice attempt needs from a fault tree: the findings an apprentice may choose from, and the
// fewest readings the tree takes to reach a finding on a given unit (the "shortest isolating path"
// a score counts extra readings against). Plain TypeScript over the tree graph.
import { outgoingEdges, stepMap } from '@/lib/trees/graph';
import type { TreeGraph, UnitFacts } from '@/lib/trees/schema';

export interface FindingChoice {
  id: string;
  title: string;
}

export function findingChoices(graph: Pick<TreeGraph, 'steps'>): FindingChoice[] {
  return graph.steps.filter((s) => s.kind === 'finding').map((s) => ({ id: s.id, title: s.title }));
}

/**
 * The fewest measure and inspect steps on a path from the tree's start to `findingId`, taking at
 * each unit-record branch the case of `unit`; action steps (power off, lock out) cost nothing here
 * because a score counts them as safety, not as readings. Null when the finding cannot be reached.
 */
export function readingsToFinding(graph: Pick<TreeGraph, 'steps' | 'start'>, findingId: string, unit: UnitFacts): number | null {
  const steps = stepMap(graph);
  const cost = new Map<string, number>([[graph.start, 0]]);
  // 0-1 breadth-first search: a free edge goes to the front of the queue, a reading to the back.
  const queue: string[] = [graph.start];
  const done = new Set<string>();
  while (queue.length) {
    const id = queue.shift()!;
    if (done.has(id)) continue;
    done.add(id);
    const step = steps.get(id);
    if (!step) continue;
    if (id === findingId) return cost.get(id)!;
    const here = cost.get(id)!;
    const weight = step.kind === 'measure' || step.kind === 'inspect' ? 1 : 0;
    const edges =
      step.kind === 'fact'
        ? step.cases.filter((c) => c.value === unit[step.fact]).map((c) => c.outcome)
        : outgoingEdges(step).map((e) => e.to);
    for (const to of edges) {
      const next = here + weight;
      if (next < (cost.get(to) ?? Infinity)) {
        cost.set(to, next);
        if (weight === 0) queue.unshift(to);
        else queue.push(to);
      }
    }
  }
  return null;
}

/** The findings that carry every one of `tags`: those that isolate a bench fault with these expected tags. */
export function findingsWithTags(graph: Pick<TreeGraph, 'steps'>, tags: readonly string[]): FindingChoice[] {
  if (tags.length === 0) return [];
  return graph.steps
    .filter((s) => s.kind === 'finding' && tags.every((t) => s.tags.includes(t)))
    .map((s) => ({ id: s.id, title: s.title }));
}
