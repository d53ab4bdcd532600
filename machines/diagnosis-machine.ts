// The diagnosis machine: one walk through one published tree version. Compiled from the graph:
// one state per step (state key = step id) inside `walk`, findings as final states of `walk`, and
// the lock-out / re-energize procedures inserted whenever the next step needs the other energy
// state (lockout/tagout: OSHA 29 CFR 1910.147; "live, dead, live": NFPA 70E, Article 120).
//
// Findings are final states of `walk`, not of the machine, so the actor stays active at a finding
// and `answer.undo` still works there.
import { assign, createActor, setup, transition, type Actor, type SnapshotFrom, type StateValue } from 'xstate';
import { findBand } from '@/lib/bands';
import { LOCK_OUT_PREFIX, RE_ENERGIZE_PREFIX, stepMap } from '@/lib/trees/graph';
import type { ActionStep, Caution, EnergyState, Step, TreeGraph, TreeVersion } from '@/lib/trees/schema';

export type DiagnosisAnswer = { stepId: string; value?: number; choice?: string; confirmed?: boolean };

export type DiagnosisEvent =
  | { type: 'answer.measure'; stepId: string; value: number }
  | { type: 'answer.choose'; stepId: string; choice: string }
  | { type: 'answer.confirm'; stepId: string }
  | { type: 'answer.undo' };

export type ProcedureKind = 'lock-out' | 're-energize';

export interface PathEntry {
  stepId: string;
  kind: 'measure' | 'inspect' | 'action';
  value?: number;
  choice?: string;
  confirmed?: boolean;
  bandIndex?: number;
  /** The tree step this answer leads to (through an inserted procedure where one was needed). */
  outcome: string;
  /** The energy state before this answer, restored by undo. */
  energyBefore: EnergyState;
}

export interface DiagnosisContext {
  treeVersionId: string;
  version: number;
  energy: EnergyState;
  path: PathEntry[];
  findingId: string | null;
}

/** The unit is taken to be powered when the technician arrives. */
export const INITIAL_ENERGY: EnergyState = 'energized';

type Route = 'direct' | ProcedureKind;

const DEFER = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

const LOCK_OUT_CAUTIONS: Caution[] = [
  {
    signal: 'WARNING',
    text: `Treat every conductor as live until you have proven it dead with a meter that you have just proven on a live source. A line-powered ignition control keeps voltage on the flame rod whenever it is powered. ${DEFER}`,
  },
];

const RE_ENERGIZE_CAUTIONS: Caution[] = [
  {
    signal: 'WARNING',
    text: `Restoring power starts the control as soon as there is a call for heat: the ~10 kV spark and the flame rod voltage return, and the gas valve may open. Keep hands clear of the burner compartment. ${DEFER}`,
  },
];

export const LOCK_OUT_CHECKLIST = [
  "Power off at the unit's disconnect (service switch or breaker)",
  'Lock and tag applied to the disconnect',
  'Meter proven on a known live source',
  'Absence of voltage verified at the unit (and at a line-powered control)',
  'Meter proven on the live source again ("live, dead, live")',
];

export const RE_ENERGIZE_CHECKLIST = [
  'Tools clear of the unit; meter leads removed or routed clear of the burner and the spark lead',
  'Panels and burner door back on',
  'Lock and tag removed by the person who placed them',
  'Power restored at the disconnect',
];

export function procedureId(kind: ProcedureKind, targetId: string): string {
  return (kind === 'lock-out' ? LOCK_OUT_PREFIX : RE_ENERGIZE_PREFIX) + targetId;
}

/** The inserted procedure step before `target`, as the API returns it. */
export function procedureStep(kind: ProcedureKind, target: Step): ActionStep {
  if (kind === 'lock-out') {
    return {
      id: procedureId(kind, target.id),
      kind: 'action',
      title: 'Lock out and verify',
      instruction: `The next step, "${target.title}", has you handle parts that may be live. Isolate the unit, lock and tag the disconnect, and verify the absence of voltage with a proven meter: live, dead, live.`,
      cautions: LOCK_OUT_CAUTIONS,
      why: 'Lockout/tagout (OSHA 29 CFR 1910.147) keeps the unit from being energized while you work on it; proving the meter before and after the test shows a dead reading is real (NFPA 70E).',
      energy: 'any',
      checklist: LOCK_OUT_CHECKLIST,
      outcome: target.id,
    };
  }
  return {
    id: procedureId(kind, target.id),
    kind: 'action',
    title: 'Re-energize the unit',
    instruction: `The next step, "${target.title}", is a live check. Make the unit safe to power, then restore power.`,
    cautions: RE_ENERGIZE_CAUTIONS,
    why: 'Power goes back on only when nobody and nothing is in the way, and only by the person whose lock is on the disconnect.',
    energy: 'any',
    checklist: RE_ENERGIZE_CHECKLIST,
    outcome: target.id,
  };
}

function routeTo(target: Step | undefined, energy: EnergyState): Route {
  if (target?.energy === 'locked-out' && energy === 'energized') return 'lock-out';
  if (target?.energy === 'energized' && energy === 'locked-out') return 're-energize';
  return 'direct';
}

function stateFor(route: Route, targetId: string): string {
  return route === 'direct' ? targetId : procedureId(route, targetId);
}

type AnswerParams = { stepId: string; kind: PathEntry['kind']; outcome: string; bandIndex?: number };

function makeSetup(steps: Map<string, Step>) {
  return setup({
    types: {
      context: {} as DiagnosisContext,
      events: {} as DiagnosisEvent,
      input: {} as { treeVersionId: string; version: number },
    },
    guards: {
      isStep: ({ event }, params: { stepId: string }) => 'stepId' in event && event.stepId === params.stepId,
      bandRoute: ({ context, event }, params: { stepId: string; index: number; outcome: string; route: Route }) => {
        if (event.type !== 'answer.measure' || event.stepId !== params.stepId) return false;
        const step = steps.get(params.stepId);
        if (step?.kind !== 'measure' || typeof event.value !== 'number') return false;
        return (
          findBand(step.bands, event.value)?.index === params.index && routeTo(steps.get(params.outcome), context.energy) === params.route
        );
      },
      choiceRoute: ({ context, event }, params: { stepId: string; choice: string; outcome: string; route: Route }) =>
        event.type === 'answer.choose' &&
        event.stepId === params.stepId &&
        event.choice === params.choice &&
        routeTo(steps.get(params.outcome), context.energy) === params.route,
      confirmRoute: ({ context, event }, params: { stepId: string; outcome: string; route: Route }) =>
        event.type === 'answer.confirm' &&
        event.stepId === params.stepId &&
        routeTo(steps.get(params.outcome), context.energy) === params.route,
      lastAnswerWas: ({ context }, params: { stateId: string }) => context.path.at(-1)?.stepId === params.stateId,
    },
    actions: {
      recordAnswer: assign({
        path: ({ context, event }, params: AnswerParams) => {
          const entry: PathEntry = { stepId: params.stepId, kind: params.kind, outcome: params.outcome, energyBefore: context.energy };
          if (event.type === 'answer.measure') entry.value = event.value;
          if (event.type === 'answer.choose') entry.choice = event.choice;
          if (event.type === 'answer.confirm') entry.confirmed = true;
          if (params.bandIndex !== undefined) entry.bandIndex = params.bandIndex;
          return [...context.path, entry];
        },
      }),
      setEnergy: assign({ energy: (_, params: { energy: EnergyState }) => params.energy }),
      enterFinding: assign({ findingId: (_, params: { findingId: string }) => params.findingId }),
      undoLast: assign(({ context }) => {
        const last = context.path.at(-1);
        return last ? { path: context.path.slice(0, -1), energy: last.energyBefore, findingId: null } : {};
      }),
    },
  });
}

type DiagnosisSetup = ReturnType<typeof makeSetup>;
type MachineConfig = Parameters<DiagnosisSetup['createMachine']>[0];
type StatesConfig = NonNullable<MachineConfig['states']>;
type StateConfig = StatesConfig[string];

const graphs = new WeakMap<object, TreeGraph>();

/** Builds the machine of one tree version. The graph is taken to be valid (validateGraph). */
export function createDiagnosisMachine(treeVersion: TreeVersion) {
  const { graph } = treeVersion;
  const steps = stepMap(graph);
  const diagnosisSetup = makeSetup(steps);

  // Procedure states before every step that needs a definite energy state.
  const procedureTargets = new Map<string, Set<ProcedureKind>>();
  const needProcedure = (targetId: string) => {
    const target = steps.get(targetId);
    if (!target || target.energy === 'any') return;
    const set = procedureTargets.get(targetId) ?? new Set<ProcedureKind>();
    set.add(target.energy === 'locked-out' ? 'lock-out' : 're-energize');
    procedureTargets.set(targetId, set);
  };

  const walk: StatesConfig = {};
  // The routes a transition to a target can take, procedure first so it wins when the energy differs.
  const routes = (targetId: string): Route[] => {
    const need = steps.get(targetId)?.energy;
    if (need === 'locked-out') return ['lock-out', 'direct'];
    if (need === 'energized') return ['re-energize', 'direct'];
    return ['direct'];
  };

  for (const step of graph.steps) {
    if (walk[step.id]) continue;
    const tags = [step.kind];
    const meta = { step };
    let state: StateConfig;
    switch (step.kind) {
      case 'measure':
        state = {
          tags,
          meta,
          on: {
            'answer.measure': step.bands.flatMap((band, index) =>
              routes(band.outcome).map((route) => ({
                guard: { type: 'bandRoute' as const, params: { stepId: step.id, index, outcome: band.outcome, route } },
                target: stateFor(route, band.outcome),
                actions: {
                  type: 'recordAnswer' as const,
                  params: { stepId: step.id, kind: 'measure' as const, outcome: band.outcome, bandIndex: index },
                },
              })),
            ),
          },
        };
        step.bands.forEach((b) => needProcedure(b.outcome));
        break;
      case 'inspect':
        state = {
          tags,
          meta,
          on: {
            'answer.choose': step.choices.flatMap((choice) =>
              routes(choice.outcome).map((route) => ({
                guard: { type: 'choiceRoute' as const, params: { stepId: step.id, choice: choice.value, outcome: choice.outcome, route } },
                target: stateFor(route, choice.outcome),
                actions: { type: 'recordAnswer' as const, params: { stepId: step.id, kind: 'inspect' as const, outcome: choice.outcome } },
              })),
            ),
          },
        };
        step.choices.forEach((c) => needProcedure(c.outcome));
        break;
      case 'action':
        state = {
          tags,
          meta,
          on: {
            'answer.confirm': routes(step.outcome).map((route) => ({
              guard: { type: 'confirmRoute' as const, params: { stepId: step.id, outcome: step.outcome, route } },
              target: stateFor(route, step.outcome),
              actions: { type: 'recordAnswer' as const, params: { stepId: step.id, kind: 'action' as const, outcome: step.outcome } },
            })),
          },
        };
        needProcedure(step.outcome);
        break;
      case 'finding':
        state = {
          type: 'final',
          tags,
          meta,
          entry: { type: 'enterFinding', params: { findingId: step.id } },
        };
        break;
    }
    walk[step.id] = state;
  }

  const start = steps.get(graph.start);
  const initialRoute = routeTo(start, INITIAL_ENERGY);
  if (initialRoute !== 'direct') needProcedure(graph.start);

  for (const [targetId, kinds] of procedureTargets) {
    for (const kind of kinds) {
      const id = procedureId(kind, targetId);
      walk[id] = {
        tags: ['action', 'procedure'],
        meta: { step: procedureStep(kind, steps.get(targetId)!) },
        on: {
          'answer.confirm': {
            guard: { type: 'isStep', params: { stepId: id } },
            target: targetId,
            actions: [
              { type: 'recordAnswer', params: { stepId: id, kind: 'action', outcome: targetId } },
              { type: 'setEnergy', params: { energy: kind === 'lock-out' ? 'locked-out' : 'energized' } },
            ],
          },
        },
      };
    }
  }

  const machine = diagnosisSetup.createMachine({
    id: 'diagnosis',
    context: ({ input }) => ({
      treeVersionId: input?.treeVersionId ?? treeVersion.id,
      version: input?.version ?? treeVersion.version,
      energy: INITIAL_ENERGY,
      path: [],
      findingId: null,
    }),
    initial: 'walk',
    states: {
      walk: {
        initial: stateFor(initialRoute, graph.start),
        states: walk,
      },
    },
    on: {
      // Undo returns to the state of the last answer; the guard picks the state by its id.
      'answer.undo': Object.keys(walk).map((stateId) => ({
        guard: { type: 'lastAnswerWas' as const, params: { stateId } },
        target: `.walk.${stateId}`,
        actions: 'undoLast' as const,
      })),
    },
  });
  graphs.set(machine, graph);
  return machine;
}

export type DiagnosisMachine = ReturnType<typeof createDiagnosisMachine>;
export type DiagnosisSnapshot = SnapshotFrom<DiagnosisMachine>;
export type DiagnosisActor = Actor<DiagnosisMachine>;

// Step lookups run on every answer; one map per graph object serves them all.
const stepMaps = new WeakMap<TreeGraph, Map<string, Step>>();
function stepsOf(graph: TreeGraph): Map<string, Step> {
  let map = stepMaps.get(graph);
  if (!map) stepMaps.set(graph, (map = stepMap(graph)));
  return map;
}

function graphOf(source: DiagnosisMachine | TreeGraph | TreeVersion): TreeGraph {
  if ('graph' in source && 'version' in source) return source.graph;
  if ('steps' in source && 'start' in source) return source;
  const graph = graphs.get(source);
  if (!graph) throw new Error('Not a machine built by createDiagnosisMachine');
  return graph;
}

/** The Step of any state id: a tree step, or a synthesised lock-out / re-energize procedure. */
export function getStep(source: DiagnosisMachine | TreeGraph | TreeVersion, stateId: string): Step | undefined {
  const steps = stepsOf(graphOf(source));
  const direct = steps.get(stateId);
  if (direct) return direct;
  for (const kind of ['lock-out', 're-energize'] as const) {
    const prefix = kind === 'lock-out' ? LOCK_OUT_PREFIX : RE_ENERGIZE_PREFIX;
    if (stateId.startsWith(prefix)) {
      const target = steps.get(stateId.slice(prefix.length));
      if (target && target.energy === (kind === 'lock-out' ? 'locked-out' : 'energized')) return procedureStep(kind, target);
    }
  }
  return undefined;
}

/** The state id (= step id) inside `walk` of a snapshot's value. */
export function stateIdOf(stateValue: StateValue): string | undefined {
  if (typeof stateValue === 'string') return stateValue === 'walk' ? undefined : stateValue;
  const inner = (stateValue as { walk?: unknown }).walk;
  return typeof inner === 'string' ? inner : undefined;
}

export function currentStep(snapshot: DiagnosisSnapshot): Step {
  const id = stateIdOf(snapshot.value);
  const step = id === undefined ? undefined : getStep(snapshot.machine as DiagnosisMachine, id);
  if (!step) throw new Error(`No step for the state ${JSON.stringify(snapshot.value)}`);
  return step;
}

/** The event that gives `answer` to `step`, or why it cannot. */
export function answerEvent(step: Step, answer: DiagnosisAnswer): { ok: true; event: DiagnosisEvent } | { ok: false; error: string } {
  if (answer.stepId !== step.id) return { ok: false, error: `The answer is for "${answer.stepId}" but the diagnosis is at "${step.id}"` };
  switch (step.kind) {
    case 'measure':
      return typeof answer.value === 'number' && Number.isFinite(answer.value)
        ? { ok: true, event: { type: 'answer.measure', stepId: step.id, value: answer.value } }
        : { ok: false, error: `"${step.id}" needs a reading` };
    case 'inspect':
      return typeof answer.choice === 'string'
        ? { ok: true, event: { type: 'answer.choose', stepId: step.id, choice: answer.choice } }
        : { ok: false, error: `"${step.id}" needs a choice` };
    case 'action':
      return answer.confirmed === false
        ? { ok: false, error: `"${step.id}" must be confirmed` }
        : { ok: true, event: { type: 'answer.confirm', stepId: step.id } };
    case 'finding':
      return { ok: false, error: `The diagnosis already ended at the finding "${step.id}"` };
  }
}

// Compiling is the costly part of a replay. A tree version is immutable once published, so one
// machine per version id serves every diagnosis of it; the graph object is checked too, so a draft
// whose graph was edited (same id, new graph) is compiled again.
const compiled = new Map<string, { graph: TreeGraph; version: number; machine: DiagnosisMachine }>();
const MAX_COMPILED = 200;

function machineFor(treeVersion: TreeVersion): DiagnosisMachine {
  const hit = compiled.get(treeVersion.id);
  if (hit && hit.graph === treeVersion.graph && hit.version === treeVersion.version) return hit.machine;
  const machine = createDiagnosisMachine(treeVersion);
  if (!hit && compiled.size >= MAX_COMPILED) compiled.delete(compiled.keys().next().value!);
  compiled.set(treeVersion.id, { graph: treeVersion.graph, version: treeVersion.version, machine });
  return machine;
}

/** Where a diagnosis stands, as kept on its row: enough to take the next answer without a replay. */
export interface WalkState {
  /** The machine's state id: a tree step or an inserted procedure. */
  stateId: string;
  energy: EnergyState;
  findingId: string | null;
}

export function walkStateOf(snapshot: DiagnosisSnapshot): WalkState {
  return { stateId: stateIdOf(snapshot.value)!, energy: snapshot.context.energy, findingId: snapshot.context.findingId };
}

/** Where a new diagnosis of this version starts (an inserted procedure when the first step needs one). */
export function startState(treeVersion: TreeVersion): WalkState {
  return walkStateOf(
    createActor(machineFor(treeVersion), { input: { treeVersionId: treeVersion.id, version: treeVersion.version } }).getSnapshot(),
  );
}

/**
 * One answer from a known state: the same machine and guards as a replay, one transition instead
 * of the whole path. The path in the machine's context (kept for undo) is not needed going forward.
 */
export function advance(
  treeVersion: TreeVersion,
  state: WalkState,
  answer: DiagnosisAnswer,
): { ok: true; state: WalkState; step: Step } | { ok: false; error: string } {
  const machine = machineFor(treeVersion);
  const step = getStep(machine, state.stateId);
  if (!step) return { ok: false, error: `"${state.stateId}" is not a step of this tree version` };
  const made = answerEvent(step, answer);
  if (!made.ok) return made;
  const snapshot = machine.resolveState({
    value: { walk: state.stateId },
    context: { treeVersionId: treeVersion.id, version: treeVersion.version, energy: state.energy, path: [], findingId: state.findingId },
  });
  if (!snapshot.can(made.event)) return { ok: false, error: `The answer to "${answer.stepId}" leads nowhere in this tree version` };
  const [next] = transition(machine, snapshot, made.event);
  const nextState = walkStateOf(next);
  return { ok: true, state: nextState, step: getStep(machine, nextState.stateId)! };
}

export type ReplayResult =
  | { ok: true; actor: DiagnosisActor; snapshot: DiagnosisSnapshot }
  | { ok: false; index: number; error: string; actor: DiagnosisActor; snapshot: DiagnosisSnapshot };

/**
 * Resumes a diagnosis from its saved answers. Stops at the first answer the machine refuses and
 * says which; the snapshot is then the state before that answer.
 */
export function replayAnswers(treeVersion: TreeVersion, answers: readonly DiagnosisAnswer[]): ReplayResult {
  const actor = createActor(machineFor(treeVersion), { input: { treeVersionId: treeVersion.id, version: treeVersion.version } });
  actor.start();
  for (const [index, answer] of answers.entries()) {
    const snapshot = actor.getSnapshot();
    const made = answerEvent(currentStep(snapshot), answer);
    if (!made.ok) return { ok: false, index, error: made.error, actor, snapshot };
    if (!snapshot.can(made.event)) {
      return { ok: false, index, error: `The answer to "${answer.stepId}" leads nowhere in this tree version`, actor, snapshot };
    }
    actor.send(made.event);
  }
  return { ok: true, actor, snapshot: actor.getSnapshot() };
}
