// Validation of a fault-tree graph before it is saved or published: the schema first, then the
// rules a diagnosis relies on (one start, every target present, every step reachable, no loops,
// every path ending at a finding, bands covering the number line exactly once).
import type { z } from 'zod';
import { checkBandCoverage } from '@/lib/bands';
import { findCycles, outgoingEdges, reachableFrom, stepMap } from '@/lib/trees/graph';
import { GAUGES, OBSERVATIONS } from '@/lib/bench/points';
import { treeGraphSchema, UNIT_FACTS, type MeasureStep, type TreeGraph } from '@/lib/trees/schema';

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
    if (step.id.includes('--')) {
      problems.push({
        stepId: step.id,
        message: `Step ids with "--" are reserved for the steps the diagnosis inserts (procedures, the repair and its checks)`,
      });
    }
    // Nobody handles a part with its energy on: a step that has someone open, remove or connect to
    // a part must need that part's energy off, so the diagnosis isolates it first.
    for (const source of step.handles) {
      if (step.energy[source] !== 'off') {
        problems.push({
          stepId: step.id,
          message: `Step "${step.id}" handles parts fed by ${source === 'gas' ? 'gas' : 'electricity'}, so it must need ${source === 'gas' ? 'the gas' : 'the power'} off`,
        });
      }
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
      if (step.bands.every((b) => b.outcome === undefined)) {
        problems.push({ stepId: step.id, message: `Step "${step.id}" has no band that leads on: every band asks again` });
      }
      if (step.reference) {
        const ref = steps.get(step.reference.step);
        if (!ref || ref.kind !== 'measure' || ref.id === step.id) {
          problems.push({
            stepId: step.id,
            message: `Bands of "${step.id}" are relative to "${step.reference.step}", which is not another measure step`,
          });
        } else if (ref.quantity !== step.quantity) {
          problems.push({
            stepId: step.id,
            message: `Bands of "${step.id}" are relative to "${ref.id}", which measures another quantity`,
          });
        }
      }
      const probeProblem = checkProbe(step);
      if (probeProblem) problems.push({ stepId: step.id, message: probeProblem });
    }

    if (step.kind === 'fact') {
      const allowed: readonly string[] = UNIT_FACTS[step.fact];
      const values = step.cases.map((c) => c.value);
      for (const value of values) {
        if (!allowed.includes(value)) {
          problems.push({
            stepId: step.id,
            message: `Step "${step.id}": "${value}" is not a value of ${step.fact} (${allowed.join(', ')})`,
          });
        }
      }
      for (const value of allowed) {
        if (values.filter((v) => v === value).length !== 1) {
          problems.push({ stepId: step.id, message: `Step "${step.id}" needs exactly one case for ${step.fact} = ${value}` });
        }
      }
    }

    if (step.kind === 'inspect') {
      const values = new Set<string>();
      for (const choice of step.choices) {
        if (values.has(choice.value)) {
          problems.push({ stepId: step.id, message: `Step "${step.id}" has the choice "${choice.value}" more than once` });
        }
        values.add(choice.value);
      }
      if (step.observeMore?.length && !step.observe) {
        problems.push({ stepId: step.id, message: `Step "${step.id}" has further observations but no first one (observe)` });
      }
      for (const observation of [...(step.observe ? [step.observe] : []), ...(step.observeMore ?? [])]) {
        const results: readonly string[] = OBSERVATIONS[observation.what].results;
        for (const [result, choice] of Object.entries(observation.choices)) {
          if (!results.includes(result)) {
            problems.push({
              stepId: step.id,
              message: `Step "${step.id}": "${result}" is not a result of observing ${observation.what} (${results.join(', ')})`,
            });
          }
          if (!values.has(choice)) {
            problems.push({
              stepId: step.id,
              message: `Step "${step.id}": the observation maps "${result}" to "${choice}", which is not one of its choices`,
            });
          }
        }
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

  for (const retake of graph.afterRepair) {
    if (steps.get(retake.measure)?.kind !== 'measure') {
      problems.push({
        stepId: retake.measure,
        message: `The reading taken again after a repair, "${retake.measure}", is not a measure step`,
      });
    }
    if (retake.reconnect !== undefined && steps.get(retake.reconnect)?.kind !== 'action') {
      problems.push({
        stepId: retake.reconnect,
        message: `The set-up before the reading after a repair, "${retake.reconnect}", is not an action step`,
      });
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

/** A probe must take the step's quantity: the right meter function, or the gauge of that quantity. */
function checkProbe(step: MeasureStep): string | null {
  const probe = step.probe;
  if (!probe) return null;
  const where = `Step "${step.id}"`;
  if ('gauge' in probe) {
    const gauge = GAUGES[probe.gauge as keyof typeof GAUGES];
    return gauge.quantity === step.quantity
      ? null
      : `${where} measures ${step.quantity}, but its probe is the ${gauge.label.toLowerCase()}`;
  }
  if (step.quantity === 'length' || step.quantity === 'pressure') return `${where} measures ${step.quantity}: its probe must be a gauge`;
  if ('series' in probe) return step.quantity === 'udc' ? null : `${where}: only microamps are read with the meter in series`;
  if (step.quantity === 'udc') return `${where} reads microamps: its probe must put the meter in series in a lead`;
  if ('lead' in probe) return step.quantity === 'ohm' ? null : `${where}: a lead end to end is read in ohms`;
  return probe.a === probe.b ? `${where}: the meter's two leads are on the same point` : null;
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
