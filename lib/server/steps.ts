import 'server-only';
import { CANONICAL_UNITS, type FindingStep, type Step } from '@/lib/trees/schema';

/** A step as the API and the wizard receive it. */
export type ApiStep = ReturnType<typeof toApiStep>;

function apiBase(step: Step) {
  return {
    id: step.id,
    kind: step.kind,
    title: step.title,
    instruction: step.instruction,
    cautions: step.cautions,
    ...(step.why ? { why: step.why } : {}),
    energy: step.energy,
  };
}

export function toApiStep(step: Step) {
  const base = apiBase(step);
  switch (step.kind) {
    case 'measure':
      return {
        ...base,
        quantity: step.quantity,
        unit: CANONICAL_UNITS[step.quantity],
        points: step.points,
        bands: step.bands.map((b) => ({
          ...(b.from !== undefined ? { from: b.from } : {}),
          ...(b.to !== undefined ? { to: b.to } : {}),
          label: b.label,
          verdict: b.verdict,
          outcome: b.outcome,
        })),
        ...(step.bandsNote ? { bandsNote: step.bandsNote } : {}),
        aids: step.aids,
      };
    case 'inspect':
      return { ...base, choices: step.choices.map((c) => ({ value: c.value, label: c.label })) };
    case 'action':
      return { ...base, checklist: step.checklist };
    case 'finding':
      return toApiFinding(step);
  }
}

export function toApiFinding(step: FindingStep) {
  return {
    ...apiBase(step),
    kind: step.kind,
    explanation: step.explanation,
    remedy: step.remedy,
    parts: step.parts,
    verification: step.verification,
    tags: step.tags,
  };
}
