// Band evaluation of readings and the gauge the wizard draws them on. Bands are in the quantity's
// canonical unit; `from` is inclusive, `to` exclusive, a missing limit is open.
import type { Band, MeasureStep, Quantity, Verdict } from '@/lib/trees/schema';

export interface BandMatch {
  band: Band;
  index: number;
}

export interface ReadingEvaluation extends BandMatch {
  /** Where the reading leads; undefined for a band that asks for the reading again. */
  outcome: string | undefined;
  verdict: Verdict;
  /** Where the value lies along the gauge drawn by `gaugeScale`, 0 (left) to 1 (right). */
  position: number;
}

export interface GaugeSegment {
  from?: number;
  to?: number;
  label: string;
  verdict: Verdict;
  start: number;
  end: number;
}

export interface GaugeScale {
  min: number;
  max: number;
  segments: GaugeSegment[];
}

export function bandContains(band: Pick<Band, 'from' | 'to'>, value: number): boolean {
  return (band.from === undefined || value >= band.from) && (band.to === undefined || value < band.to);
}

/**
 * The first band holding the value. A validated band list has exactly one, so "first" is only a
 * tie-break for unvalidated lists. +∞ (an ohms reading over range, "OL") lands in the band open above.
 */
export function findBand(bands: readonly Band[], value: number): BandMatch | null {
  if (Number.isNaN(value)) return null;
  const index = bands.findIndex((band) => bandContains(band, value));
  return index === -1 ? null : { band: bands[index], index };
}

/**
 * The latest reading of each measure step, in path order: what a band relative to an earlier
 * reading is measured from. An over-range reading ("OL", stored without a value) counts as +∞.
 * The server, the diagnosis machine and the wizard all take the readings of a path this way.
 */
export function latestReadings(
  answers: Iterable<{ stepId: string; value?: number | null; overRange?: boolean | null }>,
): Record<string, number> {
  const readings: Record<string, number> = {};
  for (const a of answers) {
    if (a.value !== undefined && a.value !== null) readings[a.stepId] = a.value;
    else if (a.overRange) readings[a.stepId] = Number.POSITIVE_INFINITY;
  }
  return readings;
}

/**
 * A step's bands in absolute terms: for bands relative to an earlier reading (`reference`), each
 * limit plus that reading (or the reference's fallback when the walk did not take it).
 */
export function shiftedBands(step: Pick<MeasureStep, 'bands' | 'reference'>, readings: Readonly<Record<string, number>> = {}): Band[] {
  if (!step.reference) return step.bands;
  const taken = readings[step.reference.step];
  const base = taken !== undefined && Number.isFinite(taken) ? taken : step.reference.fallback;
  return step.bands.map((b) => ({
    ...b,
    ...(b.from !== undefined ? { from: round(b.from + base) } : {}),
    ...(b.to !== undefined ? { to: round(b.to + base) } : {}),
  }));
}

/** Sums of decimal limits and readings (24.3 − 2) without binary noise (22.299999…). */
function round(x: number): number {
  return Math.round(x * 1e9) / 1e9;
}

// Readings of these are magnitudes: a gauge below zero would only waste room. DC volts and
// microamps may legitimately read negative (meter leads reversed), so they keep the padding.
const NON_NEGATIVE: ReadonlySet<Quantity> = new Set<Quantity>(['vac', 'ohm', 'length', 'pressure']);

export function gaugeScale(step: Pick<MeasureStep, 'bands' | 'quantity'>): GaugeScale {
  const limits = [...new Set(step.bands.flatMap((b) => [b.from, b.to]).filter((v): v is number => v !== undefined))].sort((a, b) => a - b);

  let min: number;
  let max: number;
  if (limits.length === 0) {
    min = 0;
    max = 1;
  } else if (limits.length === 1) {
    // One limit: show it in the middle, padded by its own magnitude.
    const pad = Math.abs(limits[0]) || 1;
    min = limits[0] - pad;
    max = limits[0] + pad;
  } else {
    // Open ends get half the finite span, so the outer bands stay visible but do not dominate.
    const pad = (limits[limits.length - 1] - limits[0]) / 2;
    min = limits[0] - pad;
    max = limits[limits.length - 1] + pad;
  }
  if (NON_NEGATIVE.has(step.quantity) && limits.length > 0 && limits[0] >= 0 && min < 0) min = 0;

  const at = (v: number) => clamp01((v - min) / (max - min));
  const segments = step.bands.map((band) => ({
    from: band.from,
    to: band.to,
    label: band.label,
    verdict: band.verdict,
    start: band.from === undefined ? 0 : at(band.from),
    end: band.to === undefined ? 1 : at(band.to),
  }));
  return { min, max, segments };
}

export function gaugePosition(scale: Pick<GaugeScale, 'min' | 'max'>, value: number): number {
  return clamp01((value - scale.min) / (scale.max - scale.min));
}

/**
 * Throws when no band holds the value: a validated step's bands cover the whole number line.
 * `readings` are the walk's earlier readings, for bands relative to one of them.
 */
export function evaluateReading(step: MeasureStep, value: number, readings?: Readonly<Record<string, number>>): ReadingEvaluation {
  const bands = shiftedBands(step, readings);
  const match = findBand(bands, value);
  if (!match) {
    throw new Error(`No band of step "${step.id}" holds the value ${value}`);
  }
  return {
    ...match,
    outcome: match.band.outcome,
    verdict: match.band.verdict,
    position: gaugePosition(gaugeScale({ bands, quantity: step.quantity }), value),
  };
}

function describe(band: Pick<Band, 'from' | 'to' | 'label'>, index: number): string {
  const from = band.from === undefined ? '−∞' : String(band.from);
  const to = band.to === undefined ? '+∞' : String(band.to);
  return `band ${index + 1} "${band.label}" [${from}, ${to})`;
}

/**
 * Problems that keep the bands from covering the whole number line exactly once. Bands must be
 * listed from lowest to highest, the first open below, the last open above, each ending where the
 * next begins.
 */
export function checkBandCoverage(bands: readonly Pick<Band, 'from' | 'to' | 'label'>[]): string[] {
  const problems: string[] = [];
  if (bands.length === 0) return ['There are no bands'];

  bands.forEach((band, i) => {
    if (band.from !== undefined && band.to !== undefined && band.from >= band.to) {
      problems.push(`${describe(band, i)} starts at or above where it ends`);
    }
  });

  const first = bands[0];
  const last = bands[bands.length - 1];
  if (first.from !== undefined) {
    problems.push(`The first band must be open below (no "from"): ${describe(first, 0)} leaves values below ${first.from} uncovered`);
  }
  if (last.to !== undefined) {
    problems.push(
      `The last band must be open above (no "to"): ${describe(last, bands.length - 1)} leaves values from ${last.to} up uncovered`,
    );
  }

  for (let i = 1; i < bands.length; i++) {
    const prev = bands[i - 1];
    const band = bands[i];
    const prevFrom = prev.from ?? -Infinity;
    const from = band.from ?? -Infinity;
    if (from < prevFrom) {
      problems.push(`Bands are out of order: ${describe(band, i)} starts below ${describe(prev, i - 1)}`);
      continue;
    }
    if (prev.to === undefined) {
      problems.push(`${describe(prev, i - 1)} is open above, so it overlaps ${describe(band, i)}`);
      continue;
    }
    if (band.from === undefined) {
      problems.push(`${describe(band, i)} is open below, so it overlaps ${describe(prev, i - 1)}`);
      continue;
    }
    if (band.from > prev.to) {
      problems.push(
        `Gap between ${describe(prev, i - 1)} and ${describe(band, i)}: values from ${prev.to} to ${band.from} fall in no band`,
      );
    } else if (band.from < prev.to) {
      problems.push(`${describe(prev, i - 1)} overlaps ${describe(band, i)} between ${band.from} and ${prev.to}`);
    }
  }
  return problems;
}

function clamp01(x: number): number {
  if (Number.isNaN(x)) return 0;
  return Math.min(1, Math.max(0, x));
}
