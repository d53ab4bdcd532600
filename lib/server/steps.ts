import 'server-only';
import {
  CANONICAL_UNITS,
  type ActionStep,
  type FactStep,
  type FindingStep,
  type InspectStep,
  type MeasureStep,
  type Step,
} from '@/lib/trees/schema';

export type ApiFindingStep = Omit<FindingStep, 'expects'>;
export type ApiStepOf = (MeasureStep & { unit: string }) | InspectStep | ActionStep | FactStep | ApiFindingStep;

/** A step as the API and the wizard receive it: a measure step with its canonical unit, a finding without its expectations. */
export function toApiStep(step: Step): ApiStepOf {
  switch (step.kind) {
    case 'measure':
      return { ...step, unit: CANONICAL_UNITS[step.quantity] };
    case 'finding':
      return toApiFinding(step);
    default:
      return step;
  }
}

export function toApiFinding(step: FindingStep): ApiFindingStep {
  const { expects: _serverOnly, ...shown } = step;
  return shown;
}
