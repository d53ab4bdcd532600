// Validation of a fault-tree graph before it is saved or published: the schema first, then the
// rules a diagnosis relies on (one start, every target present, every step reachable, no loops,
// every path ending at a finding, bands covering the number line exactly once).
import type { z } from 'zod';
import { checkBandCoverage } from '@/lib/bands';
import { findCycles, LOCK_OUT_PREFIX, outgoingEdges, reachableFrom, RE_ENERGIZE_PREFIX, stepMap } from '@/lib/trees/graph';
import { treeGraphSchema, type TreeGraph } from '@/lib/trees/schema';

export interface GraphProblem {
  stepId?: string;
  message: string;
}

export type GraphValidation = { ok: true; graph: TreeGraph } | { ok: false; problems: GraphProblem[] };

export function validateGraph(input: unknown): GraphValidation {
  const parsed = treeGraphSchema.safeParse(input);
  if (!parsed.success) {
    return { ok: false, problems: parsed.error.issues.map((issue) => schemaProblem(input, issue)) };
  }
  const problems = checkGraph(parsed.data);
  return problems.length === 0 ? { ok: true, graph: parsed.data } : { ok: false, problems };
}

/** The rules beyond the schema, on a graph that already parsed. */
export function checkGraph(graph: TreeGraph): GraphProblem[] {
  const problems: GraphProblem[] = [];
  const steps = stepMap(graph);

  const seen = new Set<string>();
  for (const step of graph.steps) {
    if (seen.has(step.id)) problems.push({ stepId: step.id, message: `The step id "${step.id}" is used more than once` });
    seen.add(step.id);
    if (step.id.startsWith(LOCK_OUT_PREFIX) || step.id.startsWith(RE_ENERGIZE_PREFIX)) {
      problems.push({
        stepId: step.id,
        message: `Step ids starting with "${LOCK_OUT_PREFIX}" or "${RE_ENERGIZE_PREFIX}" are reserved for the procedures the diagnosis inserts`,
      });
    }
  }

  if (!steps.has(graph.start)) {
    problems.push({ stepId: graph.start, message: `The start step "${graph.start}" does not exist` });
  }

  for (const step of graph.steps) {
    const edges = outgoingEdges(step);
    if (step.kind !== 'finding' && edges.length === 0) {
      problems.push({ stepId: step.id, message: `Step "${step.id}" has no outcome: every path must end at a finding` });
    }
    for (const edge of edges) {
      if (!steps.has(edge.to)) {
        problems.push({ stepId: step.id, message: `Step "${step.id}" leads to "${edge.to}", which does not exist` });
      }
    }

    if (step.kind === 'measure') {
      for (const p of checkBandCoverage(step.bands)) problems.push({ stepId: step.id, message: `Bands of "${step.id}": ${p}` });
    }

    if (step.kind === 'inspect') {
      const values = new Set<string>();
      for (const choice of step.choices) {
        if (values.has(choice.value)) {
          problems.push({ stepId: step.id, message: `Step "${step.id}" has the choice "${choice.value}" more than once` });
        }
        values.add(choice.value);
      }
    }

    if (step.kind === 'finding') {
      for (const exp of step.expects) {
        const target = steps.get(exp.step);
        if (!target) {
          problems.push({ stepId: step.id, message: `Finding "${step.id}" expects a reading of "${exp.step}", which does not exist` });
        } else if (target.kind !== 'measure') {
          problems.push({
            stepId: step.id,
            message: `Finding "${step.id}" expects a reading of "${exp.step}", which is not a measure step`,
          });
        }
        if (exp.from === undefined && exp.to === undefined) {
          problems.push({ stepId: step.id, message: `Finding "${step.id}" expects "${exp.step}" without a limit` });
        } else if (exp.from !== undefined && exp.to !== undefined && exp.from >= exp.to) {
          problems.push({
            stepId: step.id,
            message: `Finding "${step.id}" expects "${exp.step}" between ${exp.from} and ${exp.to}, an empty range`,
          });
        }
      }
    }
  }

  if (steps.has(graph.start)) {
    const reachable = reachableFrom(graph, graph.start);
    for (const id of steps.keys()) {
      if (!reachable.has(id)) problems.push({ stepId: id, message: `Step "${id}" cannot be reached from the start "${graph.start}"` });
    }
  }

  for (const cycle of findCycles(graph)) {
    problems.push({ stepId: cycle[0], message: `Steps form a loop: ${cycle.join(' → ')}` });
  }

  return problems;
}

function schemaProblem(input: unknown, issue: z.core.$ZodIssue): GraphProblem {
  const path = issue.path.map(String).join('.');
  const message = path ? `${path}: ${issue.message}` : issue.message;
  const [head, index] = issue.path;
  if (head === 'steps' && typeof index === 'number') {
    const raw = (input as { steps?: unknown[] })?.steps?.[index];
    const id = (raw as { id?: unknown } | undefined)?.id;
    if (typeof id === 'string' && id.length > 0) return { stepId: id, message };
  }
  return { message };
}
