// The diagnosis machine: one visit through one published tree version. Compiled from the graph:
// one state per step (state key = step id) inside `walk`, and around them the states the visit
// needs that no author writes:
//
// - energy procedures, inserted whenever the next step needs a source (electricity, gas) in the
//   other state: lock-out, gas off, gas on (taps closed, leak test), re-energize — one state that
//   makes every change the next step needs (lockout/tagout: OSHA 29 CFR 1910.147; "live, dead,
//   live": NFPA 70E, Article 120);
// - unit-record branches (`fact` steps), answered from the unit record instead of asked;
// - after a finding: the repair (in the energy state the finding declares), readings the tree asks
//   to retake after any repair (the flame signal, with the meter put back first), the restore that
//   brings both sources back, the verification checks, and `done`.
//
// Nothing here is final but `done`, so the actor stays active at a finding and undo still works.
import { assign, createActor, setup, transition, type Actor, type SnapshotFrom, type StateValue } from 'xstate';
import { findBand, latestReadings, shiftedBands } from '@/lib/bands';
import { parseProcedureStateId, procedureStateId, stepMap, type EnergyChange } from '@/lib/trees/graph';
import type {
  ActionStep,
  Caution,
  EnergyNeed,
  EnergyState,
  FactStep,
  FindingStep,
  MeasureStep,
  Step,
  TreeGraph,
  TreeVersion,
  UnitFacts,
} from '@/lib/trees/schema';

export type DiagnosisAnswer = {
  stepId: string;
  value?: number;
  /** An ohms reading over the meter's range ("OL"): taken as +∞, which only a band open above holds. */
  overRange?: boolean;
  choice?: string;
  confirmed?: boolean;
};

export type DiagnosisEvent =
  | { type: 'answer.measure'; stepId: string; value: number }
  | { type: 'answer.choose'; stepId: string; choice: string }
  | { type: 'answer.fact'; stepId: string; value: string }
  | { type: 'answer.confirm'; stepId: string }
  | { type: 'answer.undo' };

export interface PathEntry {
  stepId: string;
  kind: 'measure' | 'inspect' | 'action' | 'fact';
  value?: number;
  choice?: string;
  confirmed?: boolean;
  bandIndex?: number;
  /** The state this answer leads to (through an inserted procedure where one was needed). */
  outcome: string;
  /** The energy state before this answer, restored by undo. */
  energyBefore: EnergyState;
}

export interface DiagnosisContext {
  treeVersionId: string;
  version: number;
  energy: EnergyState;
  path: PathEntry[];
  /** The finding reached; it stays through the repair, restore and verification. */
  findingId: string | null;
  /** The latest reading of each measure step on the path (relative bands and retaken readings use them). */
  readings: Record<string, number>;
}

/** The unit is taken to be powered, with its gas on, when the technician arrives. */
export const INITIAL_ENERGY: EnergyState = { electric: 'on', gas: 'on' };
/** What the verification needs: the unit back in service. */
const IN_SERVICE: EnergyNeed = { electric: 'on', gas: 'on' };

const DEFER = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

const CHANGE_TEXT: Record<EnergyChange, { title: string; checklist: string[]; caution: Caution }> = {
  'lock-out': {
    title: 'Lock out the power and verify',
    checklist: [
      "Power off at the unit's disconnect (service switch or breaker)",
      'Lock and tag applied to the disconnect',
      'Meter proven on a known live source',
      'Absence of voltage verified at the unit (and at a line-powered control)',
      'Meter proven on the live source again ("live, dead, live")',
    ],
    caution: {
      signal: 'WARNING',
      text: `Treat every conductor as live until you have proven it dead with a meter that you have just proven on a live source. A line-powered ignition control keeps voltage on the flame rod whenever it is powered. ${DEFER}`,
    },
  },
  'gas-off': {
    title: 'Turn the gas off',
    checklist: [
      "Gas valve's own control turned to off",
      "Manual shut-off valve on the unit's gas supply closed (handle across the pipe)",
      'Shut-off tagged so nobody reopens it while you work',
      'No smell of gas around the unit before you open anything',
    ],
    caution: {
      signal: 'WARNING',
      text: `Gas left on while a tap, a fitting or the burners are open escapes into the room and can ignite. If you smell gas, stop: operate no switches, make no sparks, ventilate and follow the gas emergency procedure. ${DEFER}`,
    },
  },
  'gas-on': {
    title: 'Turn the gas back on and leak-test',
    checklist: [
      'Every pressure tap you opened closed (or the manometer still on it for the next reading)',
      'Fittings and parts you removed back in place and tightened',
      "Tag removed; manual shut-off opened, then the gas valve's own control",
      'Every joint, tap and fitting you opened leak-tested with leak-detection solution or a gas detector',
    ],
    caution: {
      signal: 'WARNING',
      text: `Gas escaping from a tap or fitting left open can ignite. Test every joint you opened before the unit fires; never test with a flame. ${DEFER}`,
    },
  },
  're-energize': {
    title: 'Re-energize the unit',
    checklist: [
      'Tools clear of the unit; meter leads removed or routed clear of the burner and the spark lead',
      'Panels and burner door back on',
      'Lock and tag removed by the person who placed them',
      'Power restored at the disconnect',
    ],
    caution: {
      signal: 'WARNING',
      text: `Restoring power starts the control as soon as there is a call for heat: the ~10 kV spark and the flame rod voltage return, and the gas valve may open. Keep hands clear of the burner compartment. ${DEFER}`,
    },
  },
};

/** What must change, in the order it is done, to bring `energy` to what `need` asks; empty when nothing must. */
export function changesFor(need: EnergyNeed, energy: EnergyState): EnergyChange[] {
  const changes: EnergyChange[] = [];
  if (need.electric === 'off' && energy.electric === 'on') changes.push('lock-out');
  if (need.gas === 'off' && energy.gas === 'on') changes.push('gas-off');
  if (need.gas === 'on' && energy.gas === 'off') changes.push('gas-on');
  if (need.electric === 'on' && energy.electric === 'off') changes.push('re-energize');
  return changes;
}

export function applyChanges(energy: EnergyState, changes: readonly EnergyChange[]): EnergyState {
  const next = { ...energy };
  for (const change of changes) {
    if (change === 'lock-out') next.electric = 'off';
    if (change === 're-energize') next.electric = 'on';
    if (change === 'gas-off') next.gas = 'off';
    if (change === 'gas-on') next.gas = 'on';
  }
  return next;
}

const ALL_ENERGIES: EnergyState[] = [
  { electric: 'on', gas: 'on' },
  { electric: 'off', gas: 'on' },
  { electric: 'on', gas: 'off' },
  { electric: 'off', gas: 'off' },
];

/** Every route into a step with this need: "direct" or a change set, each once. */
function routesFor(need: EnergyNeed): string[] {
  const keys = new Set(ALL_ENERGIES.map((e) => routeKey(need, e)));
  // Procedures first, so a transition that needs one is never shadowed by "direct".
  return [...keys].sort((a, b) => (a === 'direct' ? 1 : 0) - (b === 'direct' ? 1 : 0));
}

function routeKey(need: EnergyNeed, energy: EnergyState): string {
  const changes = changesFor(need, energy);
  return changes.length === 0 ? 'direct' : changes.join('+');
}

function stateFor(route: string, targetId: string): string {
  return route === 'direct' ? targetId : procedureStateId(route.split('+') as EnergyChange[], targetId);
}

/** The inserted procedure before `target`, as the API returns it. */
export function procedureStep(changes: readonly EnergyChange[], target: Step): ActionStep {
  const texts = changes.map((c) => CHANGE_TEXT[c]);
  const off = changes.filter((c) => c === 'lock-out' || c === 'gas-off');
  const on = changes.filter((c) => c === 'gas-on' || c === 're-energize');
  const instruction = [
    off.length > 0 &&
      `The next step, "${target.title}", has you work where ${off.map((c) => (c === 'lock-out' ? 'power' : 'gas')).join(' and ')} must be off.`,
    on.length > 0 && `The next step, "${target.title}", needs ${on.map((c) => (c === 'gas-on' ? 'gas' : 'power')).join(' and ')} back on.`,
    changes.includes('lock-out') && 'Isolate the unit, lock and tag the disconnect, and verify the absence of voltage with a proven meter.',
    changes.includes('gas-on') && 'Close what you opened and leak-test it before the gas flows to the burners.',
  ]
    .filter(Boolean)
    .join(' ');
  return {
    id: procedureStateId(changes, target.id),
    kind: 'action',
    title: texts.map((t) => t.title).join(', then '),
    instruction,
    cautions: texts.map((t) => t.caution),
    why: 'Energy goes off before anyone handles a part it feeds, and comes back only when nobody and nothing is in the way — gas first, tested for leaks, then power, by the person whose lock is on the disconnect.',
    energy: { electric: 'any', gas: 'any' },
    handles: [],
    checklist: texts.flatMap((t) => t.checklist),
    outcome: target.id,
  };
}

// ── The states after a finding ────────────────────────────────────────────────────────────────
const RECONNECT = 'reconnect--';
const RECHECK = 'recheck--';
const VERIFY = 'verify--';
const DONE = 'done--';

type VisitPhase = 'walk' | 'procedure' | 'repair' | 'reconnect' | 'recheck' | 'verify' | 'done';

/** Which part of the visit a state id belongs to. */
export function phaseOf(source: DiagnosisMachine | TreeGraph | TreeVersion, stateId: string): VisitPhase {
  if (parseProcedureStateId(stateId)) return 'procedure';
  if (stateId.startsWith(RECONNECT)) return 'reconnect';
  if (stateId.startsWith(RECHECK)) return 'recheck';
  if (stateId.startsWith(VERIFY)) return 'verify';
  if (stateId.startsWith(DONE)) return 'done';
  return stepsOf(graphOf(source)).get(stateId)?.kind === 'finding' ? 'repair' : 'walk';
}

/** Whether a state comes after the finding (an energy procedure counts as the part of the visit it leads to). */
export function isAfterFinding(source: DiagnosisMachine | TreeGraph | TreeVersion, stateId: string): boolean {
  const procedure = parseProcedureStateId(stateId);
  const phase = phaseOf(source, procedure ? procedure.targetId : stateId);
  return phase !== 'walk' && phase !== 'procedure';
}

/** The measure steps retaken after a repair, with the step that sets the meter up again. */
function retakesOf(graph: TreeGraph, steps: Map<string, Step>): { measure: MeasureStep; reconnect?: ActionStep }[] {
  return (graph.afterRepair ?? []).flatMap((r) => {
    const measure = steps.get(r.measure);
    const reconnect = r.reconnect ? steps.get(r.reconnect) : undefined;
    if (measure?.kind !== 'measure') return [];
    return [{ measure, reconnect: reconnect?.kind === 'action' ? reconnect : undefined }];
  });
}

function retakeIds(measureId: string, findingId: string) {
  return { reconnect: `${RECONNECT}${measureId}--${findingId}`, recheck: `${RECHECK}${measureId}--${findingId}` };
}

function reconnectStep(step: ActionStep, measure: MeasureStep, finding: FindingStep): ActionStep {
  return {
    ...step,
    id: retakeIds(measure.id, finding.id).reconnect,
    title: `${step.title} (for the reading after the repair)`,
    instruction: `${step.instruction} If it is still connected from before the repair, check it is still as described.`,
    outcome: retakeIds(measure.id, finding.id).recheck,
  };
}

function recheckStep(step: MeasureStep, finding: FindingStep, next: string): MeasureStep {
  return {
    ...step,
    id: retakeIds(step.id, finding.id).recheck,
    title: `${step.title} after the repair`,
    why: 'The same reading as before the repair, taken the same way: it shows the repair worked and goes into the unit history.',
    energy: IN_SERVICE,
    reference: undefined,
    bands: step.bands.map((b) => (b.outcome === undefined ? b : { ...b, outcome: next })),
  };
}

function verifyStep(finding: FindingStep): ActionStep {
  return {
    id: `${VERIFY}${finding.id}`,
    kind: 'action',
    title: 'Verify the repair',
    instruction: `Run the unit and tick each check as you see it hold. Tick only what you have seen: a check that does not hold means the repair is not done.`,
    cautions: [],
    why: 'A repair is finished when the unit is seen to work through several full heat cycles, not when the part is in.',
    energy: IN_SERVICE,
    handles: [],
    checklist: finding.verification,
    outcome: `${DONE}${finding.id}`,
  };
}

/** The visit's end after `finding`, as the API names it (no answer is taken there). */
function doneStep(finding: FindingStep): ActionStep {
  return {
    id: `${DONE}${finding.id}`,
    kind: 'action',
    title: 'Repair verified',
    instruction: 'The repair is done and verified. Close the call from its page.',
    cautions: [],
    energy: { electric: 'any', gas: 'any' },
    handles: [],
    checklist: [],
    outcome: `${DONE}${finding.id}`,
  };
}

type AnswerParams = { stepId: string; kind: PathEntry['kind']; outcome: string; bandIndex?: number };

function makeSetup(steps: (id: string) => Step | undefined) {
  const routeOf = (targetId: string, energy: EnergyState) => {
    const target = steps(targetId);
    return target ? routeKey(target.energy, energy) : 'direct';
  };
  return setup({
    types: {
      context: {} as DiagnosisContext,
      events: {} as DiagnosisEvent,
      input: {} as { treeVersionId: string; version: number },
    },
    guards: {
      isStep: ({ event }, params: { stepId: string }) => 'stepId' in event && event.stepId === params.stepId,
      bandRoute: ({ context, event }, params: { stepId: string; index: number; outcome: string; route: string; tookReading?: string }) => {
        if (event.type !== 'answer.measure' || event.stepId !== params.stepId) return false;
        if (params.tookReading !== undefined && !(params.tookReading in context.readings)) return false;
        const step = steps(params.stepId);
        if (step?.kind !== 'measure' || typeof event.value !== 'number') return false;
        return (
          findBand(shiftedBands(step, context.readings), event.value)?.index === params.index &&
          routeOf(params.outcome, context.energy) === params.route
        );
      },
      choiceRoute: ({ context, event }, params: { stepId: string; choice: string; outcome: string; route: string }) =>
        (event.type === 'answer.choose' || event.type === 'answer.fact') &&
        event.stepId === params.stepId &&
        (event.type === 'answer.choose' ? event.choice : event.value) === params.choice &&
        routeOf(params.outcome, context.energy) === params.route,
      confirmRoute: ({ context, event }, params: { stepId: string; outcome: string; route: string; tookReading?: string }) =>
        event.type === 'answer.confirm' &&
        event.stepId === params.stepId &&
        (params.tookReading === undefined || params.tookReading in context.readings) &&
        routeOf(params.outcome, context.energy) === params.route,
      lastAnswerWas: ({ context }, params: { stateId: string }) => context.path.at(-1)?.stepId === params.stateId,
    },
    actions: {
      recordAnswer: assign(({ context, event }, params: AnswerParams) => {
        const entry: PathEntry = { stepId: params.stepId, kind: params.kind, outcome: params.outcome, energyBefore: context.energy };
        let readings = context.readings;
        if (event.type === 'answer.measure') {
          entry.value = event.value;
          readings = { ...readings, [params.stepId]: event.value };
        }
        if (event.type === 'answer.choose') entry.choice = event.choice;
        if (event.type === 'answer.fact') entry.choice = event.value;
        if (event.type === 'answer.confirm') entry.confirmed = true;
        if (params.bandIndex !== undefined) entry.bandIndex = params.bandIndex;
        return { path: [...context.path, entry], readings };
      }),
      changeEnergy: assign({ energy: ({ context }, params: { changes: EnergyChange[] }) => applyChanges(context.energy, params.changes) }),
      enterFinding: assign({ findingId: (_, params: { findingId: string }) => params.findingId }),
      undoLast: assign(({ context }) => {
        const last = context.path.at(-1);
        if (!last) return {};
        const path = context.path.slice(0, -1);
        const readings = latestReadings(path);
        // The finding stays only while the undone answer came after it (the repair or the checks).
        const findingId = path.some((e) => e.outcome === context.findingId) ? context.findingId : null;
        return { path, energy: last.energyBefore, readings, findingId };
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
  const synthesized = new Map<string, Step>();
  const lookup = (id: string) => steps.get(id) ?? synthesized.get(id);
  const diagnosisSetup = makeSetup(lookup);

  const walk: StatesConfig = {};
  // Procedure states needed before each target: change set → state id.
  const procedures = new Map<string, { changes: EnergyChange[]; targetId: string }>();
  const into = (targetId: string) => {
    const target = lookup(targetId);
    const routes = target ? routesFor(target.energy) : ['direct'];
    for (const route of routes) {
      if (route === 'direct') continue;
      const changes = route.split('+') as EnergyChange[];
      procedures.set(procedureStateId(changes, targetId), { changes, targetId });
    }
    return routes;
  };
  const confirmTo = (stepId: string, outcome: string, kind: PathEntry['kind'], tookReading?: string) =>
    into(outcome).map((route) => ({
      guard: { type: 'confirmRoute' as const, params: { stepId, outcome, route, ...(tookReading ? { tookReading } : {}) } },
      target: stateFor(route, outcome),
      actions: { type: 'recordAnswer' as const, params: { stepId, kind, outcome } },
    }));

  const retakes = retakesOf(graph, steps);
  const findings = graph.steps.filter((s): s is FindingStep => s.kind === 'finding');
  // Synthesized steps first, so that routes into them know their energy needs.
  for (const finding of findings) {
    synthesized.set(`${VERIFY}${finding.id}`, verifyStep(finding));
    synthesized.set(`${DONE}${finding.id}`, doneStep(finding));
    retakes.forEach((r, i) => {
      const next = retakes[i + 1] ? retakeIds(retakes[i + 1].measure.id, finding.id).recheck : `${VERIFY}${finding.id}`;
      synthesized.set(retakeIds(r.measure.id, finding.id).recheck, recheckStep(r.measure, finding, next));
      if (r.reconnect) synthesized.set(retakeIds(r.measure.id, finding.id).reconnect, reconnectStep(r.reconnect, r.measure, finding));
    });
  }
  /** Where the visit goes after the repair or a retaken reading: the next retake the walk took a reading for, else the checks. */
  const afterRepairFrom = (stepId: string, findingId: string, fromIndex: number) => [
    ...retakes.slice(fromIndex).flatMap((r) => {
      const ids = retakeIds(r.measure.id, findingId);
      return confirmTo(stepId, r.reconnect ? ids.reconnect : ids.recheck, 'action', r.measure.id);
    }),
    ...confirmTo(stepId, `${VERIFY}${findingId}`, 'action'),
  ];

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
              band.outcome === undefined
                ? []
                : into(band.outcome).map((route) => ({
                    guard: { type: 'bandRoute' as const, params: { stepId: step.id, index, outcome: band.outcome!, route } },
                    target: stateFor(route, band.outcome!),
                    actions: {
                      type: 'recordAnswer' as const,
                      params: { stepId: step.id, kind: 'measure' as const, outcome: band.outcome!, bandIndex: index },
                    },
                  })),
            ),
          },
        };
        break;
      case 'inspect':
      case 'fact': {
        const options = step.kind === 'inspect' ? step.choices : step.cases;
        const event = step.kind === 'inspect' ? 'answer.choose' : 'answer.fact';
        state = {
          tags,
          meta,
          on: {
            [event]: options.flatMap((choice) =>
              into(choice.outcome).map((route) => ({
                guard: { type: 'choiceRoute' as const, params: { stepId: step.id, choice: choice.value, outcome: choice.outcome, route } },
                target: stateFor(route, choice.outcome),
                actions: { type: 'recordAnswer' as const, params: { stepId: step.id, kind: step.kind, outcome: choice.outcome } },
              })),
            ),
          },
        };
        break;
      }
      case 'action':
        state = { tags, meta, on: { 'answer.confirm': confirmTo(step.id, step.outcome, 'action') } };
        break;
      case 'finding':
        // The repair: confirmed once done, then on to the retaken readings and the checks.
        state = {
          tags,
          meta,
          entry: { type: 'enterFinding', params: { findingId: step.id } },
          on: { 'answer.confirm': afterRepairFrom(step.id, step.id, 0) },
        };
        break;
    }
    walk[step.id] = state;
  }

  for (const finding of findings) {
    retakes.forEach((r, i) => {
      const ids = retakeIds(r.measure.id, finding.id);
      // After this reading: the next retake the walk took a reading for (its set-up first), else the checks.
      const after = [
        ...retakes.slice(i + 1).map((n) => {
          const next = retakeIds(n.measure.id, finding.id);
          return { to: n.reconnect ? next.reconnect : next.recheck, tookReading: n.measure.id as string | undefined };
        }),
        { to: `${VERIFY}${finding.id}`, tookReading: undefined },
      ];
      if (r.reconnect) {
        walk[ids.reconnect] = {
          tags: ['action', 'after-repair'],
          meta: { step: synthesized.get(ids.reconnect) },
          on: { 'answer.confirm': confirmTo(ids.reconnect, ids.recheck, 'action') },
        };
      }
      const recheck = synthesized.get(ids.recheck) as MeasureStep;
      walk[ids.recheck] = {
        tags: ['measure', 'after-repair'],
        meta: { step: recheck },
        on: {
          'answer.measure': recheck.bands.flatMap((band, index) =>
            band.outcome === undefined
              ? []
              : after.flatMap(({ to, tookReading }) =>
                  into(to).map((route) => ({
                    guard: {
                      type: 'bandRoute' as const,
                      params: { stepId: ids.recheck, index, outcome: to, route, ...(tookReading ? { tookReading } : {}) },
                    },
                    target: stateFor(route, to),
                    actions: {
                      type: 'recordAnswer' as const,
                      params: { stepId: ids.recheck, kind: 'measure' as const, outcome: to, bandIndex: index },
                    },
                  })),
                ),
          ),
        },
      };
    });
    const verifyId = `${VERIFY}${finding.id}`;
    walk[verifyId] = {
      tags: ['action', 'after-repair'],
      meta: { step: synthesized.get(verifyId) },
      on: { 'answer.confirm': confirmTo(verifyId, `${DONE}${finding.id}`, 'action') },
    };
    walk[`${DONE}${finding.id}`] = { type: 'final', tags: ['done'], meta: { step: synthesized.get(`${DONE}${finding.id}`) } };
  }

  const start = steps.get(graph.start);
  const initialRoute = start ? routeKey(start.energy, INITIAL_ENERGY) : 'direct';
  if (initialRoute !== 'direct') into(graph.start);

  for (const [id, { changes, targetId }] of procedures) {
    walk[id] = {
      tags: ['action', 'procedure'],
      meta: { step: procedureStep(changes, lookup(targetId)!) },
      on: {
        'answer.confirm': {
          guard: { type: 'isStep', params: { stepId: id } },
          target: targetId,
          actions: [
            { type: 'recordAnswer', params: { stepId: id, kind: 'action', outcome: targetId } },
            { type: 'changeEnergy', params: { changes } },
          ],
        },
      },
    };
  }

  const machine = diagnosisSetup.createMachine({
    id: 'diagnosis',
    context: ({ input }) => ({
      treeVersionId: input?.treeVersionId ?? treeVersion.id,
      version: input?.version ?? treeVersion.version,
      energy: INITIAL_ENERGY,
      path: [],
      findingId: null,
      readings: {},
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

/** The Step of any state id: a tree step, an inserted procedure, or a state after a finding. */
export function getStep(source: DiagnosisMachine | TreeGraph | TreeVersion, stateId: string): Step | undefined {
  const graph = graphOf(source);
  const steps = stepsOf(graph);
  const direct = steps.get(stateId);
  if (direct) return direct;
  const procedure = parseProcedureStateId(stateId);
  if (procedure) {
    const target = getStep(graph, procedure.targetId);
    // Only the change set a step's need can call for (a stored state id is never trusted blindly).
    if (target && ALL_ENERGIES.some((e) => changesFor(target.energy, e).join('+') === procedure.changes.join('+'))) {
      return procedureStep(procedure.changes, target);
    }
    return undefined;
  }
  const finding = (id: string) => {
    const s = steps.get(id);
    return s?.kind === 'finding' ? s : undefined;
  };
  if (stateId.startsWith(VERIFY)) {
    const f = finding(stateId.slice(VERIFY.length));
    return f && verifyStep(f);
  }
  if (stateId.startsWith(DONE)) {
    const f = finding(stateId.slice(DONE.length));
    return f && doneStep(f);
  }
  for (const prefix of [RECONNECT, RECHECK]) {
    if (!stateId.startsWith(prefix)) continue;
    const rest = stateId.slice(prefix.length);
    const retakes = retakesOf(graph, steps);
    for (const [i, r] of retakes.entries()) {
      if (!rest.startsWith(`${r.measure.id}--`)) continue;
      const f = finding(rest.slice(r.measure.id.length + 2));
      if (!f) return undefined;
      const next = retakes[i + 1] ? retakeIds(retakes[i + 1].measure.id, f.id).recheck : `${VERIFY}${f.id}`;
      if (prefix === RECHECK) return recheckStep(r.measure, f, next);
      return r.reconnect ? reconnectStep(r.reconnect, r.measure, f) : undefined;
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

/** The event that gives `answer` to the step of `stateId`, or why it cannot. */
export function answerEvent(
  step: Step,
  answer: DiagnosisAnswer,
  phase: VisitPhase = 'walk',
): { ok: true; event: DiagnosisEvent } | { ok: false; error: string } {
  if (answer.stepId !== step.id) return { ok: false, error: `The answer is for "${answer.stepId}" but the diagnosis is at "${step.id}"` };
  if (phase === 'done') return { ok: false, error: 'The visit is finished: the repair is verified.' };
  switch (step.kind) {
    case 'measure':
      if (answer.overRange) {
        return step.quantity === 'ohm'
          ? { ok: true, event: { type: 'answer.measure', stepId: step.id, value: Number.POSITIVE_INFINITY } }
          : { ok: false, error: `"${step.id}" is not a resistance reading, so it has no "OL"` };
      }
      return typeof answer.value === 'number' && Number.isFinite(answer.value)
        ? { ok: true, event: { type: 'answer.measure', stepId: step.id, value: answer.value } }
        : { ok: false, error: `"${step.id}" needs a reading` };
    case 'inspect':
      return typeof answer.choice === 'string'
        ? { ok: true, event: { type: 'answer.choose', stepId: step.id, choice: answer.choice } }
        : { ok: false, error: `"${step.id}" needs a choice` };
    case 'fact':
      return typeof answer.choice === 'string'
        ? { ok: true, event: { type: 'answer.fact', stepId: step.id, value: answer.choice } }
        : { ok: false, error: `"${step.id}" is answered from the unit record` };
    case 'action':
      return answer.confirmed === false
        ? { ok: false, error: `"${step.id}" must be confirmed` }
        : { ok: true, event: { type: 'answer.confirm', stepId: step.id } };
    case 'finding':
      // At a finding, the answer is "the repair is done".
      return answer.confirmed === true
        ? { ok: true, event: { type: 'answer.confirm', stepId: step.id } }
        : { ok: false, error: `Confirm the repair of "${step.id}" once it is done` };
  }
}

// Compiling is the costly part. A tree version is immutable once published, so one machine per
// version id serves every diagnosis of it; the graph object is checked too, so a draft whose graph
// was edited (same id, new graph) is compiled again.
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
  /** The machine's state id: a tree step, an inserted procedure or a state after the finding. */
  stateId: string;
  energy: EnergyState;
  findingId: string | null;
}

export function walkStateOf(snapshot: DiagnosisSnapshot): WalkState {
  return { stateId: stateIdOf(snapshot.value)!, energy: snapshot.context.energy, findingId: snapshot.context.findingId };
}

/** A unit-record branch the diagnosis answered by itself. */
export interface AutoAnswer {
  stepId: string;
  fact: FactStep['fact'];
  value: string;
}

/** Answers unit-record branches from `unit` until a step that needs the technician. */
function answerFacts(machine: DiagnosisMachine, snapshot: DiagnosisSnapshot, unit: UnitFacts | undefined) {
  const autos: AutoAnswer[] = [];
  let current = snapshot;
  for (;;) {
    const step = currentStep(current);
    if (step.kind !== 'fact' || !unit) return { snapshot: current, autos };
    const value = unit[step.fact];
    const event: DiagnosisEvent = { type: 'answer.fact', stepId: step.id, value };
    if (!current.can(event)) throw new Error(`The unit-record branch "${step.id}" has no case for ${step.fact} = ${value}`);
    [current] = transition(machine, current, event);
    autos.push({ stepId: step.id, fact: step.fact, value });
  }
}

/** Where a new diagnosis of this version starts, with the unit-record branches taken on the way. */
export function startState(treeVersion: TreeVersion, unit?: UnitFacts): { state: WalkState; autos: AutoAnswer[] } {
  const machine = machineFor(treeVersion);
  const initial = createActor(machine, { input: { treeVersionId: treeVersion.id, version: treeVersion.version } }).getSnapshot();
  const { snapshot, autos } = answerFacts(machine, initial, unit);
  return { state: walkStateOf(snapshot), autos };
}

/**
 * One answer from a known state: the same machine and guards as a replay, one transition (plus
 * the unit-record branches after it) instead of the whole path. `readings` are the earlier
 * readings the current step's bands are relative to, if any.
 */
export function advance(
  treeVersion: TreeVersion,
  state: WalkState,
  answer: DiagnosisAnswer,
  { unit, readings = {} }: { unit?: UnitFacts; readings?: Record<string, number> } = {},
): { ok: true; state: WalkState; step: Step; autos: AutoAnswer[] } | { ok: false; error: string } {
  const machine = machineFor(treeVersion);
  const step = getStep(machine, state.stateId);
  if (!step) return { ok: false, error: `"${state.stateId}" is not a step of this tree version` };
  const made = answerEvent(step, answer, phaseOf(machine, state.stateId));
  if (!made.ok) return made;
  const snapshot = machine.resolveState({
    value: { walk: state.stateId },
    context: {
      treeVersionId: treeVersion.id,
      version: treeVersion.version,
      energy: state.energy,
      path: [],
      findingId: state.findingId,
      readings,
    },
  });
  if (!snapshot.can(made.event)) return { ok: false, error: `The answer to "${answer.stepId}" leads nowhere in this tree version` };
  const [next] = transition(machine, snapshot, made.event);
  const { snapshot: settled, autos } = answerFacts(machine, next, unit);
  const nextState = walkStateOf(settled);
  return { ok: true, state: nextState, step: getStep(machine, nextState.stateId)!, autos };
}

export type ReplayResult =
  | { ok: true; actor: DiagnosisActor; snapshot: DiagnosisSnapshot }
  | { ok: false; index: number; error: string; actor: DiagnosisActor; snapshot: DiagnosisSnapshot };

/**
 * Resumes a diagnosis from its saved answers. Unit-record branches are taken from the answers
 * when they hold one for it, else from `unit` when given. Stops at the first answer the machine
 * refuses and says which; the snapshot is then the state before that answer.
 */
export function replayAnswers(
  treeVersion: TreeVersion,
  answers: readonly DiagnosisAnswer[],
  { unit }: { unit?: UnitFacts } = {},
): ReplayResult {
  const machine = machineFor(treeVersion);
  const actor = createActor(machine, { input: { treeVersionId: treeVersion.id, version: treeVersion.version } });
  actor.start();
  const settle = (next?: DiagnosisAnswer) => {
    // A branch the answers do not hold is taken from the unit record.
    for (;;) {
      const step = currentStep(actor.getSnapshot());
      if (step.kind !== 'fact' || !unit || next?.stepId === step.id) return;
      actor.send({ type: 'answer.fact', stepId: step.id, value: unit[step.fact] });
      if (currentStep(actor.getSnapshot()).id === step.id) return;
    }
  };
  for (const [index, answer] of answers.entries()) {
    settle(answer);
    const snapshot = actor.getSnapshot();
    const stateId = stateIdOf(snapshot.value)!;
    const made = answerEvent(currentStep(snapshot), answer, phaseOf(machine, stateId));
    if (!made.ok) return { ok: false, index, error: made.error, actor, snapshot };
    if (!snapshot.can(made.event)) {
      return { ok: false, index, error: `The answer to "${answer.stepId}" leads nowhere in this tree version`, actor, snapshot };
    }
    actor.send(made.event);
  }
  settle();
  return { ok: true, actor, snapshot: actor.getSnapshot() };
}
