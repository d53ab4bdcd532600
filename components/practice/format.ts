import { FUEL_LABELS, IGNITION_LABELS, SUPPLY_LABELS } from '@/components/calls/format';
import type { UnitProfile } from '@/lib/validations/practice';

/** A bench unit profile in words. */
export function unitText(u: UnitProfile) {
  return `${IGNITION_LABELS[u.ignition]}, ${FUEL_LABELS[u.fuel]}, ${SUPPLY_LABELS[u.controlSupply]}, ${u.draft === 'induced' ? 'induced draft' : 'natural draft'}`;
}
