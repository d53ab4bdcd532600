// Consistency of a finding with the readings taken: a finding says what readings it expects
// (e.g. a dirty flame rod expects a low flame signal); a recorded reading outside that range
// contradicts it, and the wizard and the report flag the finding.
import { bandContains } from '@/lib/bands';
import type { FindingStep } from '@/lib/trees/schema';

export interface ConsistencyReading {
  stepId: string;
  /** In the step's canonical unit. */
  value: number;
  quantity?: string;
  /** ISO 8601 time the reading was taken. */
  takenAt?: string;
}

export interface Contradiction {
  stepId: string;
  value: number;
  expected: { from?: number; to?: number };
  reason: string;
  takenAt?: string;
}

/**
 * The readings that contradict the finding's expectations. Only the latest reading of each step
 * counts: a technician who re-measures after reseating a connector has replaced the earlier value.
 * "Latest" is by `takenAt` where both readings have one, otherwise by position (later in the list
 * wins), so callers should pass readings in the order they were taken.
 */
export function checkConsistency(finding: FindingStep, readings: readonly ConsistencyReading[]): Contradiction[] {
  const latest = new Map<string, ConsistencyReading>();
  for (const reading of readings) {
    if (!Number.isFinite(reading.value)) continue;
    const seen = latest.get(reading.stepId);
    if (!seen || !isEarlier(reading, seen)) latest.set(reading.stepId, reading);
  }

  const contradictions: Contradiction[] = [];
  for (const exp of finding.expects) {
    const reading = latest.get(exp.step);
    if (!reading || bandContains(exp, reading.value)) continue;
    const expected: Contradiction['expected'] = {};
    if (exp.from !== undefined) expected.from = exp.from;
    if (exp.to !== undefined) expected.to = exp.to;
    contradictions.push({
      stepId: exp.step,
      value: reading.value,
      expected,
      reason: exp.reason,
      ...(reading.takenAt ? { takenAt: reading.takenAt } : {}),
    });
  }
  return contradictions;
}

function isEarlier(candidate: ConsistencyReading, current: ConsistencyReading): boolean {
  const a = candidate.takenAt ? Date.parse(candidate.takenAt) : Number.NaN;
  const b = current.takenAt ? Date.parse(current.takenAt) : Number.NaN;
  return Number.isFinite(a) && Number.isFinite(b) && a < b;
}
