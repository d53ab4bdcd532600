'use client';

import { createContext, useContext } from 'react';
import { DEFAULT_TIME_ZONE, formatDate, formatDateTime, formatTime } from '@/components/calls/format';

// The company's time zone, given once by the signed-in layout, for every date a component prints.
const TimeZoneContext = createContext<string>(DEFAULT_TIME_ZONE);

export function TimeZoneProvider({ timeZone, children }: { timeZone: string; children: React.ReactNode }) {
  return <TimeZoneContext.Provider value={timeZone}>{children}</TimeZoneContext.Provider>;
}

export function useTimeZone(): string {
  return useContext(TimeZoneContext);
}

const FORMATS = { date: formatDate, dateTime: formatDateTime, time: formatTime } as const;

/** A date as the company reads it, in a <time> element that carries the exact instant for machines. */
export function Time({ value, kind = 'dateTime', className }: { value: Date | string; kind?: keyof typeof FORMATS; className?: string }) {
  const timeZone = useTimeZone();
  const iso = new Date(value).toISOString();
  return (
    <time dateTime={iso} className={className}>
      {FORMATS[kind](value, timeZone)}
    </time>
  );
}
