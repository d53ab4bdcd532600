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

export const DIAGNOSIS_LABELS: Record<string, string> = { in_progress: 'In progress', found: 'Finding reached', escalated: 'Escalated' };

export const VERDICT_WORDS: Record<string, { word: string; icon: string }> = {
  below: { word: 'Below', icon: '▼' },
  within: { word: 'Within', icon: '●' },
  above: { word: 'Above', icon: '▲' },
};

const DATE = new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric' });
const DATE_TIME = new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });
const TIME = new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit', second: '2-digit' });
const RELATIVE = new Intl.RelativeTimeFormat('en-US', { numeric: 'auto' });

export const formatDate = (d: Date | string) => DATE.format(new Date(d));
export const formatDateTime = (d: Date | string) => DATE_TIME.format(new Date(d));
export const formatTime = (d: Date | string) => TIME.format(new Date(d));

/** "5 minutes ago", "yesterday", "3 months ago". */
export function formatRelative(d: Date | string, now: number = Date.now()): string {
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
  return formatDate(d);
}
