// The words a lead reads for a step's machine-readable probe and observation (lib/trees/schema.ts,
// in the bench's vocabulary of lib/bench/points.ts): the editor's pick lists, the diff and the
// conflict view say them the same way. A kind or result the bench gains later without a word here
// is still shown, with its id made readable.
import {
  GAUGES,
  LEADS,
  MOMENTS,
  OBSERVATIONS,
  POINT_LABELS,
  POINTS,
  SERIES_LABELS,
  SERIES_POINTS,
  type GaugeId,
  type LeadId,
  type Moment,
  type ObservationKind,
  type PointId,
  type SeriesPointId,
} from '@/lib/bench/points';
import type { Probe, Quantity } from '@/lib/trees/schema';

const readable = (id: string) => id.charAt(0).toUpperCase() + id.slice(1).replace(/-/g, ' ');

export const MOMENT_LABELS: Record<Moment, string> = {
  now: 'As the unit stands',
  call: 'With a call for heat, before the trial for ignition',
  proving: 'During the trial for ignition',
  'after-proving': 'Once the flame is proven and the unit runs',
};

export const LEAD_LABELS: Record<LeadId, string> = {
  'flame-rod-lead': 'The flame-rod lead',
  'ground-lead': 'The flame ground lead',
  'spark-lead': 'The spark (high-voltage) lead',
};

const OBSERVATION_LABELS: Partial<Record<ObservationKind, string>> = {
  spark: 'The spark at the spark rod',
  flame: 'The flame at the burners',
  inducer: 'The inducer motor',
  thermostat: 'The thermostat (is it calling?)',
  'flame-test': "The control's own flame test",
  'spark-lead': 'The spark lead (power off)',
  arcing: 'Signs of arcing (power off)',
  'spark-rod': 'The spark rod (power off)',
  'flame-rod': 'The flame rod (power off)',
  'pressure-hose': 'The pressure-switch hose (power off)',
  'pressure-port': 'The pressure-switch port (power off)',
  vent: 'The vent (power off)',
  'burner-surface': 'The burner surfaces (power off)',
  'carry-over': 'The carry-over path between burners (power off)',
  orifices: 'The burner orifices (power off)',
  trial: 'What the trial for ignition showed, since the call began',
  'flame-test-method': 'Which flame-signal test the control provides (its label)',
};

const RESULT_LABELS: Partial<Record<string, string>> = {
  'at-gap': 'Sparks across the gap',
  'heard-not-seen': 'Heard, not seen at the gap',
  'to-frame': 'Sparks to the frame',
  'all-burners': 'Lights on all burners',
  partial: 'Lights on some burners only',
  'not-running': 'Not running',
  'not-calling': 'Not calling',
  'lead-insulation': 'At the lead insulation',
  'rod-ceramic': 'At the rod ceramic',
  'rod-bent': 'Rod bent',
  'ceramic-cracked': 'Ceramic cracked',
  'out-of-flame': 'Out of the flame',
  'no-spark': 'No spark seen',
  'spark-no-flame': 'A spark, but no flame',
  'lights-drops': 'Lights, then goes out',
  'stays-lit': 'Lights and stays lit',
  'dc-test-terminals': 'DC test terminals',
  'status-light': 'A status light',
};

export const observationLabel = (kind: string) => OBSERVATION_LABELS[kind as ObservationKind] ?? readable(kind);
export const resultLabel = (result: string) => RESULT_LABELS[result] ?? readable(result);
export const momentLabel = (moment: string) => MOMENT_LABELS[moment as Moment] ?? readable(moment);

/** The observation kinds with their results, for the editor's pick lists. */
export const OBSERVATION_CHOICES = (Object.keys(OBSERVATIONS) as ObservationKind[]).map((kind) => ({
  kind,
  label: observationLabel(kind),
  results: OBSERVATIONS[kind].results as readonly string[],
}));

export const MOMENT_CHOICES = MOMENTS.map((moment) => ({ moment, label: MOMENT_LABELS[moment] }));

/** How a probe puts the meter (or gauge) on the unit. */
export type ProbeWay = 'leads' | 'series' | 'lead' | 'gauge';

export const PROBE_WAY_LABELS: Record<ProbeWay, string> = {
  leads: 'Meter leads on two circuit points',
  series: 'Meter in series in a lead',
  lead: 'A lead end to end (disconnected)',
  gauge: 'A gauge',
};

/**
 * The ways a probe can take a quantity, as the validator allows them (lib/trees/validate.ts): a
 * gauge for length and pressure, the meter in series only for microamps, a lead end to end only in
 * ohms, the two leads for volts and ohms.
 */
export function probeWaysFor(quantity: Quantity): ProbeWay[] {
  switch (quantity) {
    case 'length':
    case 'pressure':
      return ['gauge'];
    case 'udc':
      return ['series'];
    case 'ohm':
      return ['leads', 'lead'];
    default:
      return ['leads'];
  }
}

export const POINT_CHOICES = POINTS.map((id) => ({ id, label: POINT_LABELS[id] }));
export const SERIES_CHOICES = SERIES_POINTS.map((id) => ({ id, label: SERIES_LABELS[id] }));
export const LEAD_CHOICES = LEADS.map((id) => ({ id, label: LEAD_LABELS[id] }));
/** The gauges that read a quantity. */
export const gaugeChoicesFor = (quantity: Quantity) =>
  (Object.keys(GAUGES) as GaugeId[]).filter((id) => GAUGES[id].quantity === quantity).map((id) => ({ id, label: GAUGES[id].label }));

export function probeWayOf(probe: Probe): ProbeWay {
  if ('gauge' in probe) return 'gauge';
  if ('series' in probe) return 'series';
  if ('lead' in probe) return 'lead';
  return 'leads';
}

/** A probe in words: "Leads on Transformer secondary, 24 V side (R) and Control common (TR)". */
export function probeText(probe: unknown): string {
  if (typeof probe !== 'object' || probe === null) return '';
  const p = probe as Record<string, unknown>;
  const point = (id: unknown) => (typeof id === 'string' ? (POINT_LABELS[id as PointId] ?? id) : '?');
  if (typeof p.gauge === 'string') return GAUGES[p.gauge as GaugeId]?.label ?? p.gauge;
  if (typeof p.series === 'string') return SERIES_LABELS[p.series as SeriesPointId] ?? `In series in ${p.series}`;
  if (typeof p.lead === 'string') return `${LEAD_LABELS[p.lead as LeadId] ?? p.lead}, end to end (disconnected)`;
  return `Leads on ${point(p.a)} and ${point(p.b)}`;
}

/** An observation in words: what, when, and which choice each result means. */
export function observationText(observe: unknown, choiceLabel: (value: string) => string = (v) => v): string {
  if (typeof observe !== 'object' || observe === null) return '';
  const o = observe as { what?: unknown; at?: unknown; choices?: unknown };
  const what = typeof o.what === 'string' ? observationLabel(o.what) : '?';
  const when = typeof o.at === 'string' ? `, ${momentLabel(o.at).toLowerCase()}` : '';
  const map = typeof o.choices === 'object' && o.choices !== null ? Object.entries(o.choices as Record<string, unknown>) : [];
  const lines = map.map(([result, choice]) => `${resultLabel(result)} → ${choiceLabel(String(choice))}`);
  return [`${what}${when}`, ...lines].join('\n');
}
