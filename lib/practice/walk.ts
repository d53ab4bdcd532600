// A practice diagnosis answers the tree's steps from the bench: which of the bench's readings
// answers a measure step (its probe: the meter function and the points, the lead, the gauge) and
// how a reading shown on the display compares with one entered. Plain TypeScript, shared by the
// server (which refuses a reading the bench never gave) and the practice wizard (which fills the
// step with the bench's reading), so both judge alike.
import type { MeasureStep, Observation } from '@/lib/trees/schema';

/** The meter function a measure step's quantity is read on at the bench (`gauge`: a manometer or gap gauge). */
export const MODE_OF: Record<MeasureStep['quantity'], 'vac' | 'vdc' | 'ohm' | 'udc' | 'gauge'> = {
  vac: 'vac',
  vdc: 'vdc',
  ohm: 'ohm',
  udc: 'udc',
  pressure: 'gauge',
  length: 'gauge',
};

const MODE_WORDS = { vac: 'V AC', vdc: 'V DC', ohm: 'Ω', udc: 'µA DC', gauge: 'the gauge' } as const;

/** A measurement as the bench took it (the payload of a stored bench event, or the request the screen sent). */
export type BenchRequest = { mode: string; a?: string; b?: string; series?: string; lead?: string; gauge?: string };

/** Does this measurement answer the step: its probe, or without one its meter function? */
export function readingAnswers(step: Pick<MeasureStep, 'quantity' | 'probe'>, request: Readonly<Record<string, unknown>>): boolean {
  const probe = step.probe;
  if (request.mode !== MODE_OF[step.quantity]) return false;
  if (!probe) return true;
  if ('a' in probe) return (request.a === probe.a && request.b === probe.b) || (request.a === probe.b && request.b === probe.a);
  if ('series' in probe) return request.series === probe.series;
  if ('lead' in probe) return request.lead === probe.lead;
  return request.gauge === probe.gauge;
}

/**
 * An entered reading against the one the meter showed, read off its display: within the display's
 * last digit (0.01) or half a percent, whichever is wider. An over-range entry (+∞) matches an
 * over-range display (null) only.
 */
export function sameReading(entered: number, shown: number | null): boolean {
  if (shown === null) return !Number.isFinite(entered);
  if (!Number.isFinite(entered)) return false;
  return Math.abs(entered - shown) <= Math.max(0.011, 0.006 * Math.abs(shown));
}

const MOMENT_WORDS: Record<string, string> = {
  now: '',
  call: ' with a call for heat, before the trial',
  proving: ' during the trial for ignition',
  'after-proving': ' once the flame is proven and the burners run',
};

/** Where the step's reading is taken, in words: "V AC across xfmr-hot and xfmr-common during the trial for ignition". */
export function probeText(step: Pick<MeasureStep, 'quantity' | 'probe' | 'at'>): string {
  const mode = MODE_OF[step.quantity];
  const moment = MOMENT_WORDS[step.at ?? 'now'] ?? '';
  const probe = step.probe;
  if (!probe) return `${MODE_WORDS[mode]}${moment}`;
  if ('a' in probe) return `${MODE_WORDS[mode]} across ${probe.a} and ${probe.b}${moment}`;
  if ('series' in probe) return `µA DC with the meter in series in the ${probe.series}${moment}`;
  if ('lead' in probe) return `Ω of the ${probe.lead} end to end, disconnected${moment}`;
  return `the ${probe.gauge} gauge${moment}`;
}

/** When to look, in words, for an inspect step that observes. */
export function observeText(observe: Pick<Observation, 'what' | 'at'>): string {
  return `the ${observe.what.replace(/-/g, ' ')}${MOMENT_WORDS[observe.at ?? 'now'] ?? ''}`;
}
