// What changed between two versions of a fault tree: steps added and removed, steps changed field
// by field (a measure step's bands as ranges), and outcomes rewired (a band, choice, case or
// confirmation that now leads somewhere else). Works on drafts too, whose graphs may not yet pass
// the schema: steps are read as plain objects, and anything not understood compares as JSON.
import { momentLabel, observationText, probeText } from '@/lib/trees/probe-words';
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

export interface FieldTextOptions {
  /**
   * Say where each band, choice and case leads. The conflict view does (a different target is a
   * difference to pick between); the diff leaves it out and lists those edges as rewiring.
   */
  targets?: boolean;
}

const where = (v: unknown) => (typeof v === 'string' && v !== '' ? v : 'not connected');

function bandsText(step: Obj, { targets }: FieldTextOptions = {}): string {
  const bands = Array.isArray(step.bands) ? step.bands : [];
  return bands
    .map((b) => {
      const band = `${bandRange(b, step.quantity)} (${text(isObj(b) ? b.verdict : '')})`;
      if (!targets || !isObj(b)) return band;
      return typeof b.askAgain === 'string' ? `${band} → measure again: ${b.askAgain}` : `${band} → ${where(b.outcome)}`;
    })
    .join('\n');
}

const lines = (v: unknown) => (Array.isArray(v) ? v.map(text).join('\n') : text(v));

const NEED: Record<string, string> = { on: 'on', off: 'off', any: 'either' };

/** What one field of a step says, for a person: bands as ranges with units, cautions by signal word, and so on. */
export function fieldText(step: unknown, field: string, options: FieldTextOptions = {}): string {
  if (!isObj(step)) return '';
  const value = step[field];
  if (value === undefined) return '';
  switch (field) {
    case 'bands':
      return bandsText(step, options);
    case 'choices':
    case 'cases': {
      const list = Array.isArray(value) ? value : [];
      return list
        .map((c) => {
          if (!isObj(c)) return text(c);
          const label = field === 'cases' ? text(c.value) : `${text(c.label)} (${text(c.value)})`;
          return options.targets ? `${label} → ${where(c.outcome)}` : label;
        })
        .join('\n');
    }
    case 'cautions':
      return (Array.isArray(value) ? value : []).map((c) => (isObj(c) ? `${text(c.signal)}: ${text(c.text)}` : text(c))).join('\n');
    case 'energy':
      if (typeof value === 'string') return value;
      return isObj(value)
        ? `electricity ${NEED[text(value.electric)] ?? text(value.electric)}, gas ${NEED[text(value.gas)] ?? text(value.gas)}`
        : text(value);
    case 'handles':
      return Array.isArray(value) ? (value.length ? `parts fed by ${value.map(text).join(' and ')}` : 'no parts') : text(value);
    case 'points':
      return Array.isArray(value) ? value.map(text).join(' – ') : text(value);
    case 'checklist':
    case 'parts':
    case 'verification':
    case 'tags':
    case 'aids':
      return lines(value);
    case 'probe':
      return probeText(value);
    case 'at':
      return typeof value === 'string' ? momentLabel(value) : text(value);
    case 'observe': {
      const choices = Array.isArray(step.choices) ? step.choices.filter(isObj) : [];
      return observationText(value, (v) => {
        const choice = choices.find((c) => c.value === v);
        return choice ? `${text(choice.label)} (${v})` : `${v} (no such choice)`;
      });
    }
    case 'timeline':
      return value === true ? 'shown beside the step' : value === false ? 'not shown' : text(value);
    case 'reference':
      return isObj(value)
        ? `offsets from the reading of ${text(value.step)} (stands in when not read: ${text(value.fallback)})`
        : text(value);
    case 'note':
      return isObj(value) ? `${text(value.label)}${value.required === true ? ' (required)' : ''}` : text(value);
    case 'expects':
      return (Array.isArray(value) ? value : [])
        .map((e) => (isObj(e) ? `${text(e.step)} in [${limit(e.from, '−∞')}, ${limit(e.to, '+∞')}): ${text(e.reason)}` : text(e)))
        .join('\n');
    case 'outcome':
      return where(value);
    default:
      return typeof value === 'number' || typeof value === 'boolean' ? String(value) : text(value);
  }
}

/** The fields of a step, each as a person reads it (see fieldText); never the id, and the outcome only with `targets`. */
export function stepFieldTexts(step: unknown, options: FieldTextOptions = {}): Map<string, string> {
  const fields = new Map<string, string>();
  if (!isObj(step)) return fields;
  for (const key of Object.keys(step)) {
    if (key === 'id' || (key === 'outcome' && !options.targets)) continue;
    fields.set(key, fieldText(step, key, options));
  }
  return fields;
}

/** A field's name as a person reads it. */
export const FIELD_LABELS: Record<string, string> = {
  kind: 'Kind',
  title: 'Title',
  instruction: 'Instruction',
  cautions: 'Cautions',
  why: 'Why this step',
  energy: 'Energy it needs',
  handles: 'Parts it handles',
  timeline: 'Ignition sequence',
  quantity: 'Quantity',
  points: 'Test points',
  bands: 'Bands',
  reference: 'Relative to',
  bandsNote: 'Where the bands come from',
  aids: 'Aids',
  probe: 'Where the meter goes',
  at: 'When in the sequence',
  choices: 'Choices',
  note: 'Note',
  observe: 'What is observed',
  fact: 'Fact of the unit record',
  cases: 'Cases',
  checklist: 'Checklist',
  outcome: 'Leads to',
  explanation: 'Explanation',
  remedy: 'Remedy',
  parts: 'Parts',
  verification: 'Verification checks',
  tags: 'Tags',
  expects: 'Readings it expects',
};

export const fieldLabel = (field: string) => FIELD_LABELS[field] ?? field;

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
  const fields = stepFieldTexts(step);
  for (const key of WIRING) fields.delete(key);
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
