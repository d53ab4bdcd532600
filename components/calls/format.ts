import type { CallStatus } from '@/lib/validations/field';

// Words and marks shared by the calls, units and report screens. A status is always a word with
// an icon beside it, never a colour alone.

export const STATUS_LABELS: Record<CallStatus, string> = {
  open: 'Open',
  diagnosing: 'Diagnosing',
  repaired: 'Repaired',
  closed: 'Closed',
  referred: 'Referred',
};

export const STATUS_ICONS: Record<CallStatus, string> = {
  open: '○',
  diagnosing: '◐',
  repaired: '●',
  closed: '✓',
  referred: '↗',
};

export const IGNITION_LABELS = { 'two-rod': 'DSI, two-rod', 'single-rod': 'DSI, single-rod' } as const;
export const FUEL_LABELS = { 'natural-gas': 'Natural gas', lp: 'LP' } as const;
export const SUPPLY_LABELS = { '24v': '24 V only', line: 'Line-powered control' } as const;

export const DIAGNOSIS_LABELS: Record<string, string> = {
  in_progress: 'In progress',
  found: 'Finding reached — repair not verified yet',
  verified: 'Repair verified',
  escalated: 'Escalated to the leads',
};

export const VERDICT_WORDS: Record<string, { word: string; icon: string }> = {
  below: { word: 'Below', icon: '▼' },
  within: { word: 'Within', icon: '●' },
  above: { word: 'Above', icon: '▲' },
};

// Dates: one format everywhere ("Dec 2, 2026" and "Dec 2, 2026, 3:41 PM EST"), always in the
// company's time zone (a company setting), never the server's or the tablet's. With the zone given,
// the server and the browser print the same text, so hydration never disagrees.

/** The zone a company starts with (the migration's default). */
export const DEFAULT_TIME_ZONE = 'America/Toronto';

type DateKind = 'date' | 'dateTime' | 'time' | 'month' | 'year';
const OPTIONS: Record<DateKind, Intl.DateTimeFormatOptions> = {
  date: { year: 'numeric', month: 'short', day: 'numeric' },
  dateTime: { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit', timeZoneName: 'short' },
  time: { hour: 'numeric', minute: '2-digit', second: '2-digit' },
  month: { year: 'numeric', month: 'short' },
  year: { year: 'numeric' },
};
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(kind: DateKind, timeZone: string): Intl.DateTimeFormat {
  const key = `${kind}|${timeZone}`;
  let f = formatters.get(key);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-US', { ...OPTIONS[kind], timeZone });
    } catch {
      // A zone this runtime does not know (the setting is validated, so only an older runtime): the default's.
      f = new Intl.DateTimeFormat('en-US', { ...OPTIONS[kind], timeZone: DEFAULT_TIME_ZONE });
    }
    formatters.set(key, f);
  }
  return f;
}

export const formatDate = (d: Date | string | number, timeZone: string) => formatter('date', timeZone).format(new Date(d));
export const formatDateTime = (d: Date | string | number, timeZone: string) => formatter('dateTime', timeZone).format(new Date(d));
export const formatTime = (d: Date | string | number, timeZone: string) => formatter('time', timeZone).format(new Date(d));
export const formatMonth = (d: Date | string | number, timeZone: string) => formatter('month', timeZone).format(new Date(d));
export const formatYear = (d: Date | string | number, timeZone: string) => formatter('year', timeZone).format(new Date(d));

/** A calendar day with no time (a due date, `YYYY-MM-DD`), in the same words as `formatDate`, never shifted by a zone. */
export const formatDay = (day: string) => formatter('date', 'UTC').format(new Date(`${day}T12:00:00Z`));

const RELATIVE = new Intl.RelativeTimeFormat('en-US', { numeric: 'auto' });

/** "5 minutes ago", "yesterday", "3 months ago". */
export function formatRelative(d: Date | string, timeZone: string, now: number = Date.now()): string {
  const seconds = (new Date(d).getTime() - now) / 1000;
  const steps: [Intl.RelativeTimeFormatUnit, number][] = [
    ['second', 60],
    ['minute', 60],
    ['hour', 24],
    ['day', 30],
    ['month', 12],
    ['year', Infinity],
  ];
  let value = seconds;
  for (const [unit, size] of steps) {
    if (Math.abs(value) < size) return RELATIVE.format(Math.round(value), unit);
    value /= size;
  }
  return formatDate(d, timeZone);
}
