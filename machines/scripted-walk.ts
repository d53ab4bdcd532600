// Walks a tree version with scripted answers: a reading per measure step, a choice per inspect
// step; action steps (including the inserted lock-out and re-energize procedures) are confirmed.
// The machine decides the path, so a script only says what the unit would show. Used by the demo
// seed, the tests and the benchmarks.
import { evaluateReading } from '@/lib/bands';
import type { Step, TreeVersion } from '@/lib/trees/schema';
import { answerEvent, currentStep, replayAnswers, type DiagnosisAnswer } from '@/machines/diagnosis-machine';

export type WalkScript = Record<string, number | string>;

export interface WalkedAnswer extends DiagnosisAnswer {
  step: Step;
  bandIndex?: number;
  bandLabel?: string;
  verdict?: string;
}

export function scriptedWalk(version: TreeVersion, script: WalkScript, maxSteps = 200): { answers: WalkedAnswer[]; finding: Step } {
  const replay = replayAnswers(version, []);
  const actor = replay.actor;
  const answers: WalkedAnswer[] = [];
  for (let i = 0; i < maxSteps; i++) {
    const step = currentStep(actor.getSnapshot());
    if (step.kind === 'finding') return { answers, finding: step };
    const scripted = script[step.id];
    let answer: WalkedAnswer;
    if (step.kind === 'measure') {
      if (typeof scripted !== 'number') throw new Error(`The script has no reading for "${step.id}"`);
      const evaluation = evaluateReading(step, scripted);
      answer = {
        stepId: step.id,
        value: scripted,
        step,
        bandIndex: evaluation.index,
        bandLabel: evaluation.band.label,
        verdict: evaluation.verdict,
      };
    } else if (step.kind === 'inspect') {
      if (typeof scripted !== 'string') throw new Error(`The script has no choice for "${step.id}"`);
      answer = { stepId: step.id, choice: scripted, step };
    } else {
      answer = { stepId: step.id, confirmed: true, step };
    }
    const made = answerEvent(step, answer);
    if (!made.ok || !actor.getSnapshot().can(made.event)) throw new Error(`The machine refused the answer to "${step.id}"`);
    actor.send(made.event);
    answers.push(answer);
  }
  throw new Error('The walk did not reach a finding');
}
