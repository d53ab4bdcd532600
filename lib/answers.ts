// How an answer to a step is read — the reading parsed and judged against the step's bands, the
// choice and its note, the confirmation — and refused in words when it is not one. One rule for a
// diagnosis on a call (lib/server/diagnoses.ts), a practice walk (lib/server/practice.ts) and a
// lead's dry run (components/trees/dry-run.tsx), so all three accept and refuse the same answers.
import { evaluateReading } from '@/lib/bands';
import { AppError } from '@/lib/errors';
import type { Quantity, Step, Verdict } from '@/lib/trees/schema';
import { parseReading } from '@/lib/units';

/** What the wizard sends for a step (the fields of `AnswerInput` that say what was answered). */
export interface GivenAnswer {
  text?: string | null;
  unit?: string | null;
  overRange?: boolean;
  choice?: string | null;
  note?: string | null;
  confirmed?: boolean | null;
}

/** The answer as it is kept (on the path, in the store), a machine event's payload and, for a reading, its band. */
export interface ReadAnswer {
  fields: {
    text: string | null;
    /** null for OL (over range), which the machine reads as +∞. */
    value: number | null;
    unit: string | null;
    overRange: boolean;
    quantity: Quantity | null;
    bandIndex: number | null;
    bandLabel: string | null;
    verdict: Verdict | null;
    choice: string | null;
    choiceLabel: string | null;
    confirmed: boolean | null;
  };
  machine: { value?: number; overRange?: boolean; choice?: string; confirmed?: boolean };
  /** For a reading: where it lies and the step it leads to. */
  verdict?: { band: string; outcome: string; position: number; verdict: Verdict; value: number };
}

const refused = (message: string, field: string) => new AppError('bad_request', message, { fieldErrors: { [field]: [message] } });

/**
 * Reads `given` as an answer to `step`, with the walk's earlier readings for bands relative to one.
 * Throws a `bad_request` AppError naming the field when it is not an answer to that step.
 */
export function readAnswer(step: Step, given: GivenAnswer, readings: Readonly<Record<string, number>> = {}): ReadAnswer {
  const fields: ReadAnswer['fields'] = {
    text: null,
    value: null,
    unit: null,
    overRange: false,
    quantity: null,
    bandIndex: null,
    bandLabel: null,
    verdict: null,
    choice: null,
    choiceLabel: null,
    confirmed: null,
  };
  const machine: ReadAnswer['machine'] = {};

  if (step.kind === 'measure') {
    let value: number;
    if (given.overRange) {
      // "OL": over the meter's range, an open circuit. Only a resistance reading has one.
      if (step.quantity !== 'ohm')
        throw refused('OL (over range) is only for a resistance reading. Enter the value the meter shows.', 'text');
      value = Number.POSITIVE_INFINITY;
      Object.assign(fields, { text: 'OL', unit: given.unit ?? 'Ω', overRange: true });
      machine.overRange = true;
    } else {
      const parsed = parseReading(step.quantity, given.text ?? '', given.unit ?? undefined);
      if (!parsed.ok) throw refused(parsed.message, 'text');
      value = parsed.value;
      Object.assign(fields, { text: given.text ?? null, value, unit: parsed.unit });
      machine.value = value;
    }
    let evaluation;
    try {
      evaluation = evaluateReading(step, value, readings);
    } catch {
      // Only a draft can leave a gap: the validator refuses a published tree that does.
      throw refused(`No band of "${step.title}" holds this reading: the bands of this version leave a gap.`, 'text');
    }
    // Not a reading of the unit (leads reversed, the wrong meter function): nothing is kept.
    if (evaluation.band.askAgain) throw refused(evaluation.band.askAgain, 'text');
    Object.assign(fields, {
      quantity: step.quantity,
      bandIndex: evaluation.index,
      bandLabel: evaluation.band.label,
      verdict: evaluation.verdict,
    });
    const verdict = {
      band: evaluation.band.label,
      outcome: evaluation.outcome ?? '',
      position: evaluation.position,
      verdict: evaluation.verdict,
      value: Number.isFinite(value) ? value : Number.MAX_VALUE,
    };
    return { fields, machine, verdict };
  }

  if (step.kind === 'inspect') {
    const choice = step.choices.find((c) => c.value === given.choice);
    if (!choice) throw refused(`Choose one of: ${step.choices.map((c) => c.value).join(', ')}.`, 'choice');
    if (step.note?.required && !given.note?.trim()) throw refused(`${step.note.label}: write what you saw.`, 'note');
    Object.assign(fields, { choice: choice.value, choiceLabel: choice.label, text: given.note ?? null });
    machine.choice = choice.value;
    return { fields, machine };
  }

  if (step.kind === 'action' || step.kind === 'finding') {
    if (given.confirmed !== true) {
      throw refused(step.kind === 'finding' ? 'Confirm the repair once it is done.' : 'Confirm the step once it is done.', 'confirmed');
    }
    fields.confirmed = true;
    machine.confirmed = true;
    return { fields, machine };
  }

  throw refused(`"${step.title}" is answered from the unit record, not by hand.`, 'stepId');
}
