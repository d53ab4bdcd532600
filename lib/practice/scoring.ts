// Scoring a practice attempt from what happened on the bench. Plain TypeScript: the server scores
// from the stored bench events (an apprentice never sends a score), and the tests score by hand-made
// event lists. Every line of the score says what it counted and why, so an apprentice can read it
// back against their path.

/** One thing the apprentice did on the bench, in the order it was done (`time` is the bench's simulated clock, s). */
export type PracticeEvent =
  | {
      kind: 'action';
      time: number;
      action: 'power-on' | 'power-off' | 'call-for-heat' | 'end-call' | 'reset-rollout' | 'wait';
      seconds?: number;
    }
  | { kind: 'measure'; time: number; mode: 'vac' | 'vdc' | 'ohm'; a: string; b: string; value: number | null }
  | { kind: 'measure'; time: number; mode: 'ohm'; lead: string; value: number | null }
  | { kind: 'measure'; time: number; mode: 'udc'; series: string; value: number | null }
  | { kind: 'measure'; time: number; mode: 'gauge'; gauge: string; value: number | null }
  | { kind: 'observe'; time: number; what: string; result: string };

export interface ScoreLine {
  key: 'finding' | 'path' | 'safety' | 'time';
  label: string;
  points: number;
  max: number;
  /** Why these points, in a sentence or two. */
  detail: string;
}

export interface Score {
  total: number;
  max: number;
  lines: ScoreLine[];
  /** Each safety lapse by itself (also summed in the safety line). */
  safetyLapses: string[];
  measurements: number;
  shortest: number;
  seconds: number;
}

export interface ScoringInput {
  events: readonly PracticeEvent[];
  /** The finding the apprentice chose, and the findings that isolate the injected fault (any of them is right). */
  chosenFinding: { id: string; title: string };
  expectedFindings: readonly { id: string; title: string }[];
  /** Measurements and observations on the shortest path that isolates the fault (the default tree's walk). */
  shortest: number;
  /** Wall-clock seconds from the start of the attempt to the finding. */
  seconds: number;
}

/** Points and limits of the score. A house rule of ours, not a figure of the trade. */
export const SCORING = {
  finding: 50,
  path: 20,
  pathPerExtra: 2,
  safety: 20,
  safetyPerLapse: 10,
  time: 10,
  /** Full time points up to this many minutes, none from `timeNoneMinutes` on, linear between. */
  timeFullMinutes: 10,
  timeNoneMinutes: 30,
  /** An AC reading below this, power off, counts as "verified dead". */
  deadVolts: 2,
} as const;

/** Points where the meter is on the line side (a verification of absence of voltage reads across these). */
const LINE_POINTS = new Set(['line-hot', 'line-neutral', 'line-ground', 'chassis']);
/** Parts an ohmmeter reaches only by handling a rod or lead. */
const ROD_POINTS = new Set(['spark-rod', 'flame-rod', 'ground-lead']);
/** Looks at the rods, leads and burner: they are taken out or handled for it. */
const HANDLING_LOOKS = new Set(['spark-lead', 'arcing', 'spark-rod', 'flame-rod', 'burner-surface', 'carry-over']);

const isReading = (e: PracticeEvent) => e.kind === 'measure' || e.kind === 'observe';

/** Did the meter, power off, show the line side dead? The bench model answers near 0 V then. */
function verifiesDead(e: PracticeEvent, powered: boolean): boolean {
  if (e.kind !== 'measure' || e.mode !== 'vac' || powered || !('a' in e)) return false;
  if (!LINE_POINTS.has(e.a) && !LINE_POINTS.has(e.b)) return false;
  return e.value !== null && Math.abs(e.value) < SCORING.deadVolts;
}

/**
 * The safety lapses in a run of events:
 * - the meter put in series in a lead (microamps), or an ohmmeter on a rod or lead, without the power
 *   turned off and verified dead since the meter was last moved to another lead;
 * - a rollout switch reset before a finding was reached (a trip is a sign of flame leaving the
 *   combustion chamber: its cause comes first).
 */
export function safetyLapses(events: readonly PracticeEvent[]): string[] {
  const lapses: string[] = [];
  let powered = false;
  // Power was turned off and the line side read dead, since the last time the meter's series lead changed.
  let verifiedSincePowerOff = false;
  let seriesIn: string | null = null;
  for (const e of events) {
    if (e.kind === 'action') {
      if (e.action === 'power-on') powered = true;
      if (e.action === 'power-off') {
        powered = false;
        verifiedSincePowerOff = false;
        // Power off is when a meter in series would be taken out; a new insertion needs a new check.
        seriesIn = null;
      }
      if (e.action === 'reset-rollout') {
        lapses.push(
          `Rollout switch reset at ${formatClock(e.time)} before a finding: a tripped rollout means flame left the combustion chamber; find the cause (vent, flue, heat exchanger, over-firing) before any reset.`,
        );
      }
      continue;
    }
    if (verifiesDead(e, powered)) {
      verifiedSincePowerOff = true;
      continue;
    }
    if (e.kind === 'measure' && e.mode === 'udc') {
      if (seriesIn !== e.series) {
        if (!verifiedSincePowerOff) {
          lapses.push(
            `Meter put in series in ${e.series} (reading at ${formatClock(e.time)}) without first turning the power off and verifying it dead with the meter: a lead is handled to break it.`,
          );
        }
        seriesIn = e.series;
        // The next lead handled needs its own power-off and check.
        verifiedSincePowerOff = false;
      }
      continue;
    }
    const handled =
      e.kind === 'measure' && e.mode === 'gauge'
        ? e.gauge === 'spark-gap'
          ? 'The spark gap gauged'
          : null
        : e.kind === 'measure' && e.mode === 'ohm'
          ? 'lead' in e
            ? `Resistance of the ${e.lead}`
            : ROD_POINTS.has(e.a) || ROD_POINTS.has(e.b)
              ? `Resistance of ${e.a}–${e.b}`
              : null
          : e.kind === 'observe' && HANDLING_LOOKS.has(e.what)
            ? `A look at the ${e.what}`
            : null;
    if (handled && (powered || !verifiedSincePowerOff)) {
      lapses.push(
        `${handled} at ${formatClock(e.time)} without the power off and verified dead first: the rods and leads are handled for it.`,
      );
    }
  }
  return lapses;
}

export function formatClock(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

function plural(n: number, one: string, many = `${one}s`) {
  return `${n} ${n === 1 ? one : many}`;
}

export function scoreAttempt(input: ScoringInput): Score {
  const lines: ScoreLine[] = [];
  const right = input.expectedFindings.some((f) => f.id === input.chosenFinding.id);
  const expectedTitles = input.expectedFindings.map((f) => `“${f.title}”`).join(' or ') || 'a finding of the fault';
  lines.push({
    key: 'finding',
    label: 'The finding',
    points: right ? SCORING.finding : 0,
    max: SCORING.finding,
    detail: right
      ? `“${input.chosenFinding.title}” isolates the fault that was injected.`
      : `“${input.chosenFinding.title}” was chosen; the injected fault leads to ${expectedTitles}.`,
  });

  const measurements = input.events.filter(isReading).length;
  const extra = Math.max(0, measurements - input.shortest);
  const pathPoints = Math.max(0, SCORING.path - extra * SCORING.pathPerExtra);
  lines.push({
    key: 'path',
    label: 'Measurements and observations',
    points: pathPoints,
    max: SCORING.path,
    detail:
      extra === 0
        ? `${plural(measurements, 'reading')} taken; the shortest isolating path takes ${input.shortest}.`
        : `${plural(measurements, 'reading')} taken against ${input.shortest} on the shortest isolating path: ${plural(extra, 'extra reading')}, ${SCORING.pathPerExtra} points each.`,
  });

  const lapses = safetyLapses(input.events);
  lines.push({
    key: 'safety',
    label: 'Safety',
    points: Math.max(0, SCORING.safety - lapses.length * SCORING.safetyPerLapse),
    max: SCORING.safety,
    detail:
      lapses.length === 0
        ? 'Power was off and verified before any rod or lead was handled, and no rollout switch was reset.'
        : `${plural(lapses.length, 'lapse')}, ${SCORING.safetyPerLapse} points each: ${lapses.join(' ')}`,
  });

  const minutes = input.seconds / 60;
  const span = SCORING.timeNoneMinutes - SCORING.timeFullMinutes;
  const timeShare = minutes <= SCORING.timeFullMinutes ? 1 : Math.max(0, (SCORING.timeNoneMinutes - minutes) / span);
  const timePoints = Math.round(SCORING.time * timeShare);
  lines.push({
    key: 'time',
    label: 'Time',
    points: timePoints,
    max: SCORING.time,
    detail: `${formatClock(input.seconds)} from start to finding; full points up to ${SCORING.timeFullMinutes} min, none from ${SCORING.timeNoneMinutes} min.`,
  });

  return {
    total: lines.reduce((sum, l) => sum + l.points, 0),
    max: lines.reduce((sum, l) => sum + l.max, 0),
    lines,
    safetyLapses: lapses,
    measurements,
    shortest: input.shortest,
    seconds: Math.round(input.seconds),
  };
}
