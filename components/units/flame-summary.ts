import { formatDate } from '@/components/calls/format';

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
export function summarizeFlame(diagnosis: FlamePoint[], afterRepair: FlamePoint[], lowLimit: number | null): string {
  if (diagnosis.length === 0 && afterRepair.length === 0) return 'No flame-signal readings on this unit yet.';
  const parts: string[] = [];
  const byDate = (a: FlamePoint, b: FlamePoint) => Date.parse(a.at) - Date.parse(b.at);
  const during = [...diagnosis].sort(byDate);
  if (during.length === 1) {
    parts.push(`One flame-signal reading during diagnosis: ${uA(during[0].value)} on ${formatDate(during[0].at)}.`);
  } else if (during.length > 1) {
    const first = during[0];
    const last = during[during.length - 1];
    const trend = last.value < first.value ? 'fell' : last.value > first.value ? 'rose' : 'held';
    parts.push(
      `During diagnosis the flame signal ${trend} from ${uA(first.value)} on ${formatDate(first.at)} to ${uA(last.value)} on ${formatDate(last.at)} over ${during.length} readings.`,
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
    parts.push(`After repair: ${after.map((p) => `${uA(p.value)} (${formatDate(p.at)})`).join(', ')}.`);
  }
  return parts.join(' ');
}
