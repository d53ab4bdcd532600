import { formatDate, formatMonth, formatYear } from '@/components/calls/format';

export interface FlamePoint {
  at: string;
  value: number;
}

export interface FlameBand {
  from: number | null;
  to: number | null;
  label: string;
  verdict: string;
}

/** Where "getting low" starts: the lower edge of the band a healthy signal falls in. */
export function lowLimitOf(bands: FlameBand[]): number | null {
  const within = bands.find((b) => b.verdict === 'within' && b.from !== null);
  return within?.from ?? null;
}

const uA = (v: number) => `${Number(v.toFixed(2))} µA`;

/**
 * The plot in words, for screen readers and for anyone who reads faster than they read charts:
 * first and last reading during diagnosis, the direction, how many were low, and the after-repair values.
 */
export function summarizeFlame(diagnosis: FlamePoint[], afterRepair: FlamePoint[], lowLimit: number | null, timeZone: string): string {
  if (diagnosis.length === 0 && afterRepair.length === 0) return 'No flame-signal readings on this unit yet.';
  const parts: string[] = [];
  const byDate = (a: FlamePoint, b: FlamePoint) => Date.parse(a.at) - Date.parse(b.at);
  const during = [...diagnosis].sort(byDate);
  if (during.length === 1) {
    parts.push(`One flame-signal reading during diagnosis: ${uA(during[0].value)} on ${formatDate(during[0].at, timeZone)}.`);
  } else if (during.length > 1) {
    const first = during[0];
    const last = during[during.length - 1];
    const trend = last.value < first.value ? 'fell' : last.value > first.value ? 'rose' : 'held';
    parts.push(
      `During diagnosis the flame signal ${trend} from ${uA(first.value)} on ${formatDate(first.at, timeZone)} to ${uA(last.value)} on ${formatDate(last.at, timeZone)} over ${during.length} readings.`,
    );
  }
  if (lowLimit !== null && during.length > 0) {
    const low = during.filter((p) => p.value < lowLimit).length;
    parts.push(
      low === 0
        ? `None was below ${uA(lowLimit)}.`
        : `${low} of ${during.length} ${during.length === 1 ? 'was' : 'were'} below ${uA(lowLimit)} (getting low).`,
    );
  }
  const after = [...afterRepair].sort(byDate);
  if (after.length > 0) {
    parts.push(`After repair: ${after.map((p) => `${uA(p.value)} (${formatDate(p.at, timeZone)})`).join(', ')}.`);
  }
  return parts.join(' ');
}

const DAY = 86_400_000;

export interface TimeAxis {
  domain: [number, number];
  ticks: number[];
  /** The label of a tick, in the company's time zone. */
  label: (t: number) => string;
}

/**
 * The time axis of the plot, by how long the readings span: one day of readings (a single visit)
 * gets one tick at that visit, labelled with its date, in the middle of the axis; up to about two
 * years gets months; longer gets years. Month and year ticks sit at noon UTC on the first, which is
 * the same month and year in every time zone, so a label never names the month before.
 */
export function timeAxis(times: number[], timeZone: string): TimeAxis | null {
  if (times.length === 0) return null;
  const min = Math.min(...times);
  const max = Math.max(...times);
  const span = max - min;
  if (formatDate(min, timeZone) === formatDate(max, timeZone)) {
    const mid = (min + max) / 2;
    return { domain: [mid - 15 * DAY, mid + 15 * DAY], ticks: [mid], label: (t) => formatDate(t, timeZone) };
  }
  const pad = Math.max(span * 0.05, 15 * DAY);
  const domain: [number, number] = [min - pad, max + pad];
  const ticks: number[] = [];
  if (span <= 730 * DAY) {
    const start = new Date(domain[0]);
    const months = Math.round(span / (30 * DAY));
    const step = months <= 8 ? 1 : months <= 16 ? 2 : 3;
    for (let i = 1; ; i++) {
      const t = Date.UTC(start.getUTCFullYear(), start.getUTCMonth() + i, 1, 12);
      if (t > domain[1]) break;
      if ((start.getUTCMonth() + i) % step === 0) ticks.push(t);
    }
    return { domain, ticks, label: (t) => formatMonth(t, timeZone) };
  }
  for (let y = new Date(domain[0]).getUTCFullYear() + 1; Date.UTC(y, 0, 1, 12) <= domain[1]; y++) ticks.push(Date.UTC(y, 0, 1, 12));
  return { domain, ticks, label: (t) => formatYear(t, timeZone) };
}
