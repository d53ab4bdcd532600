// Every path of a tree version through the whole visit, explored with the diagnosis machine itself:
// each band (a value inside it, relative bands shifted by the walk's own readings; "OL" for an
// ohms band open above), each choice, each confirmation, and the unit-record branches for every
// combination of unit facts — through the finding, the repair, the readings after it, the restore
// and the checks, to `done`.
import { transition } from 'xstate';
import { shiftedBands } from '@/lib/bands';
import { UNIT_FACTS, type Band, type EnergyState, type Step, type TreeVersion, type UnitFact, type UnitFacts } from '@/lib/trees/schema';
import {
  createDiagnosisMachine,
  currentStep,
  phaseOf,
  stateIdOf,
  type DiagnosisAnswer,
  type DiagnosisEvent,
  type DiagnosisSnapshot,
} from '@/machines/diagnosis-machine';
import { createActor } from 'xstate';

export interface Visit {
  stateId: string;
  step: Step;
  /** The energy the diagnosis was in on entering the state. */
  energy: EnergyState;
  phase: ReturnType<typeof phaseOf>;
}

export interface Walk {
  unit: UnitFacts;
  /** The answers, unit-record branches included (as `choice`, `auto: true`). */
  answers: (DiagnosisAnswer & { auto?: boolean })[];
  visits: Visit[];
  findingId: string;
}

/** A value inside the band (not on its limits). */
export function inside(band: Pick<Band, 'from' | 'to'>): number {
  if (band.from !== undefined && band.to !== undefined) return Math.round(((band.from + band.to) / 2) * 1e6) / 1e6;
  if (band.to !== undefined) return band.to > 0 ? band.to / 2 : band.to - 1;
  if (band.from !== undefined) return band.from > 0 ? band.from * 2 : band.from + 1;
  return 0;
}

/** Every combination of the unit facts. */
export function allUnits(): UnitFacts[] {
  let units: Partial<UnitFacts>[] = [{}];
  for (const fact of Object.keys(UNIT_FACTS) as UnitFact[]) {
    units = units.flatMap((u) => UNIT_FACTS[fact].map((v) => ({ ...u, [fact]: v })));
  }
  return units as UnitFacts[];
}

/** The answers that lead on from a step, each with its machine event. */
type Option = { answer: DiagnosisAnswer & { auto?: boolean }; event: DiagnosisEvent };

function options(step: Step, snap: DiagnosisSnapshot, unit: UnitFacts): Option[] {
  switch (step.kind) {
    case 'measure': {
      const bands = shiftedBands(step, snap.context.readings);
      return bands.flatMap((b): Option[] => {
        if (b.outcome === undefined) return [];
        if (step.quantity === 'ohm' && b.to === undefined) {
          return [
            {
              answer: { stepId: step.id, overRange: true },
              event: { type: 'answer.measure', stepId: step.id, value: Number.POSITIVE_INFINITY },
            },
          ];
        }
        const value = inside(b);
        return [{ answer: { stepId: step.id, value }, event: { type: 'answer.measure', stepId: step.id, value } }];
      });
    }
    case 'inspect':
      return step.choices.map((c) => ({
        answer: { stepId: step.id, choice: c.value },
        event: { type: 'answer.choose', stepId: step.id, choice: c.value },
      }));
    case 'fact': {
      const value = unit[step.fact];
      return [{ answer: { stepId: step.id, choice: value, auto: true }, event: { type: 'answer.fact', stepId: step.id, value } }];
    }
    case 'action':
    case 'finding':
      return [{ answer: { stepId: step.id, confirmed: true }, event: { type: 'answer.confirm', stepId: step.id } }];
  }
}

export function explore(version: TreeVersion, units: UnitFacts[] = allUnits()): Walk[] {
  const machine = createDiagnosisMachine(version);
  const walks: Walk[] = [];
  for (const unit of units) {
    const start = createActor(machine, { input: { treeVersionId: version.id, version: version.version } }).getSnapshot();
    const visit = (snap: DiagnosisSnapshot, answers: Walk['answers'], visits: Visit[], energy: EnergyState) => {
      const step = currentStep(snap);
      const stateId = stateIdOf(snap.value)!;
      const here = [...visits, { stateId, step, energy, phase: phaseOf(machine, stateId) }];
      if (phaseOf(machine, stateId) === 'done') {
        walks.push({ unit, answers, visits: here, findingId: snap.context.findingId! });
        return;
      }
      const next = options(step, snap, unit);
      if (next.length === 0) throw new Error(`No way on from ${stateId}`);
      for (const { answer, event } of next) {
        if (!snap.can(event)) throw new Error(`${stateId} refuses ${JSON.stringify(event)}`);
        const [after] = transition(machine, snap, event);
        if (here.length > 200) throw new Error(`A walk longer than 200 states at ${stateId}`);
        visit(after, [...answers, answer], here, after.context.energy);
      }
    };
    visit(start, [], [], start.context.energy);
  }
  return walks;
}

/** The walk's answers the technician gives (unit-record branches left out). */
export const manualAnswers = (w: Pick<Walk, 'answers'>) => w.answers.filter((a) => !a.auto);

/** The visits up to (not including) the first one of `stateId`, or null when the walk never enters it. */
export function visitsBefore(w: Walk, stateId: string): Visit[] | null {
  const i = w.visits.findIndex((v) => v.stateId === stateId);
  return i === -1 ? null : w.visits.slice(0, i);
}
