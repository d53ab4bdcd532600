// Walks a tree version with scripted answers: a reading per measure step ("OL" for an open
// circuit on an ohms step), a choice per inspect step; action steps (including the inserted energy
// procedures) are confirmed, and unit-record branches are taken from `unit`. The machine decides
// the path, so a script only says what the unit would show. With `through: 'done'` the walk goes
// on past the finding: the repair is confirmed, a reading retaken after it comes from the script
// under "after:<step id>", and the checks are confirmed. Used by the demo seed, the tests and the
// benchmarks.
import { evaluateReading } from '@/lib/bands';
import type { Step, TreeVersion, UnitFacts } from '@/lib/trees/schema';
import { answerEvent, currentStep, phaseOf, replayAnswers, stateIdOf, type DiagnosisAnswer } from '@/machines/diagnosis-machine';

export type WalkScript = Record<string, number | string>;

export interface WalkedAnswer extends DiagnosisAnswer {
  step: Step;
  bandIndex?: number;
  bandLabel?: string;
  verdict?: string;
  /** A unit-record branch, taken from the record rather than answered. */
  auto?: boolean;
}

export function scriptedWalk(
  version: TreeVersion,
  script: WalkScript,
  { unit, through = 'finding', maxSteps = 200 }: { unit?: UnitFacts; through?: 'finding' | 'done'; maxSteps?: number } = {},
): { answers: WalkedAnswer[]; finding: Step } {
  const actor = replayAnswers(version, []).actor;
  const answers: WalkedAnswer[] = [];
  let finding: Step | null = null;
  for (let i = 0; i < maxSteps; i++) {
    const snapshot = actor.getSnapshot();
    const step = currentStep(snapshot);
    const phase = phaseOf(version, stateIdOf(snapshot.value)!);
    if (step.kind === 'finding') finding = step;
    if (phase === 'done' || (through === 'finding' && step.kind === 'finding')) return { answers, finding: finding! };
    // A reading retaken after the repair is scripted under "after:<the step it retakes>".
    const key = step.id.startsWith('recheck--') ? `after:${step.id.slice('recheck--'.length).split('--')[0]}` : step.id;
    const scripted = script[key];
    let answer: WalkedAnswer;
    if (step.kind === 'measure') {
      const overRange = scripted === 'OL';
      if (typeof scripted !== 'number' && !overRange) throw new Error(`The script has no reading for "${key}"`);
      const value = overRange ? Number.POSITIVE_INFINITY : (scripted as number);
      const evaluation = evaluateReading(step, value, snapshot.context.readings);
      answer = {
        stepId: step.id,
        ...(overRange ? { overRange: true } : { value }),
        step,
        bandIndex: evaluation.index,
        bandLabel: evaluation.band.label,
        verdict: evaluation.verdict,
      };
    } else if (step.kind === 'inspect') {
      if (typeof scripted !== 'string') throw new Error(`The script has no choice for "${step.id}"`);
      answer = { stepId: step.id, choice: scripted, step };
    } else if (step.kind === 'fact') {
      if (!unit) throw new Error(`"${step.id}" is answered from the unit record, and the walk has none`);
      answer = { stepId: step.id, choice: unit[step.fact], step, auto: true };
    } else {
      answer = { stepId: step.id, confirmed: true, step };
    }
    const made = answerEvent(step, answer, phase);
    if (!made.ok || !actor.getSnapshot().can(made.event)) throw new Error(`The machine refused the answer to "${step.id}"`);
    actor.send(made.event);
    answers.push(answer);
  }
  throw new Error(`The walk did not reach ${through === 'done' ? 'the end of the visit' : 'a finding'}`);
}
