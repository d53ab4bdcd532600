// What changed between two versions of a fault tree: steps added and removed, steps changed field
// by field (a measure step's bands as ranges), and outcomes rewired (a band, choice, case or
// confirmation that now leads somewhere else). Works on drafts too, whose graphs may not yet pass
// the schema: steps are read as plain objects, and anything not understood compares as JSON.
import { CANONICAL_UNITS, type Quantity } from '@/lib/trees/schema';

export interface StepRef {
  stepId: string;
  kind: string;
  title: string;
}

export interface FieldChange {
  /** The step's field (`title`, `instruction`, `bands`, `cautions`, …). */
  field: string;
  before: string;
  after: string;
}

export interface StepChange extends StepRef {
  fields: FieldChange[];
}

export interface Rewiring {
  stepId: string;
  /** How the edge is chosen: `band "Low" [0, 1.5) µA`, `choice "yes"`, `case "lp"`, `confirm`. */
  via: string;
  before: string | null;
  after: string | null;
}

export interface TreeDiff {
  start: { before: string; after: string } | null;
  added: StepRef[];
  removed: StepRef[];
  changed: StepChange[];
  rewired: Rewiring[];
  /** The readings retaken after a repair (`afterRepair`), when they differ. */
  afterRepair: FieldChange | null;
}

type Obj = Record<string, unknown>;

const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const text = (v: unknown): string => (typeof v === 'string' ? v : v === undefined ? '' : JSON.stringify(v));

function stepsOf(graph: unknown): Map<string, Obj> {
  const steps = new Map<string, Obj>();
  const list = isObj(graph) && Array.isArray(graph.steps) ? graph.steps : [];
  for (const step of list) {
    if (isObj(step) && typeof step.id === 'string' && !steps.has(step.id)) steps.set(step.id, step);
  }
  return steps;
}

const refOf = (step: Obj): StepRef => ({ stepId: String(step.id), kind: text(step.kind), title: text(step.title) });

/** A number for a range: a missing limit is open. */
const limit = (v: unknown, open: string) => (typeof v === 'number' ? String(v) : open);

/** A band as a range in the step's canonical unit: `[0, 1.5) µA "Low"`. */
export function bandRange(band: unknown, quantity?: unknown): string {
  if (!isObj(band)) return text(band);
  const unit = typeof quantity === 'string' && quantity in CANONICAL_UNITS ? ` ${CANONICAL_UNITS[quantity as Quantity]}` : '';
  const from = limit(band.from, '−∞');
  const to = limit(band.to, '+∞');
  return `[${from}, ${to})${unit} "${text(band.label)}"`;
}

function bandsText(step: Obj): string {
  const bands = Array.isArray(step.bands) ? step.bands : [];
  return bands.map((b) => `${bandRange(b, step.quantity)} (${text(isObj(b) ? b.verdict : '')})`).join('; ');
}

/** The fields whose changes are outcomes (compared as rewiring), not content. */
const WIRING = new Set(['id', 'outcome']);

/** Edges of a step by a key that survives a re-ordering: a band by its label, a choice by its value. */
function edgesOf(step: Obj): Map<string, string | null> {
  const edges = new Map<string, string | null>();
  const target = (v: unknown) => (typeof v === 'string' ? v : null);
  if (Array.isArray(step.bands)) {
    for (const b of step.bands) if (isObj(b)) edges.set(`band "${text(b.label)}"`, target(b.outcome));
  }
  if (Array.isArray(step.choices)) {
    for (const c of step.choices) if (isObj(c)) edges.set(`choice "${text(c.value)}"`, target(c.outcome));
  }
  if (Array.isArray(step.cases)) {
    for (const c of step.cases) if (isObj(c)) edges.set(`case "${text(c.value)}"`, target(c.outcome));
  }
  if ('outcome' in step) edges.set('confirm', target(step.outcome));
  return edges;
}

/** A step's content without its targets, field by field, as text. */
function contentOf(step: Obj): Map<string, string> {
  const fields = new Map<string, string>();
  for (const [key, value] of Object.entries(step)) {
    if (WIRING.has(key)) continue;
    if (key === 'bands') fields.set(key, bandsText(step));
    else if (key === 'choices' || key === 'cases') {
      const list = Array.isArray(value) ? value : [];
      fields.set(key, list.map((c) => (isObj(c) ? `${text(c.value)}: ${text(c.label)}` : text(c))).join('; '));
    } else fields.set(key, text(value));
  }
  return fields;
}

export function diffGraphs(before: unknown, after: unknown): TreeDiff {
  const a = stepsOf(before);
  const b = stepsOf(after);
  const startA = isObj(before) ? text(before.start) : '';
  const startB = isObj(after) ? text(after.start) : '';
  const diff: TreeDiff = {
    start: startA === startB ? null : { before: startA, after: startB },
    added: [],
    removed: [],
    changed: [],
    rewired: [],
    afterRepair: null,
  };
  for (const [id, step] of a) if (!b.has(id)) diff.removed.push(refOf(step));
  for (const [id, step] of b) {
    const old = a.get(id);
    if (!old) {
      diff.added.push(refOf(step));
      continue;
    }
    const was = contentOf(old);
    const now = contentOf(step);
    const fields: FieldChange[] = [];
    for (const key of new Set([...was.keys(), ...now.keys()])) {
      const x = was.get(key) ?? '';
      const y = now.get(key) ?? '';
      if (x !== y) fields.push({ field: key, before: x, after: y });
    }
    if (fields.length > 0) diff.changed.push({ ...refOf(step), fields });

    const edgesBefore = edgesOf(old);
    const edgesAfter = edgesOf(step);
    for (const via of new Set([...edgesBefore.keys(), ...edgesAfter.keys()])) {
      const x = edgesBefore.has(via) ? edgesBefore.get(via)! : null;
      const y = edgesAfter.has(via) ? edgesAfter.get(via)! : null;
      if (x !== y) diff.rewired.push({ stepId: id, via, before: x, after: y });
    }
  }
  const repairA = text(isObj(before) ? (before.afterRepair ?? []) : []);
  const repairB = text(isObj(after) ? (after.afterRepair ?? []) : []);
  if (repairA !== repairB) diff.afterRepair = { field: 'afterRepair', before: repairA, after: repairB };
  return diff;
}

/** True when the two graphs differ in nothing the diff looks at. */
export function isEmptyDiff(diff: TreeDiff): boolean {
  return !diff.start && !diff.afterRepair && [diff.added, diff.removed, diff.changed, diff.rewired].every((list) => list.length === 0);
}
