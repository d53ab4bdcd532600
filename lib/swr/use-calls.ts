'use client';

import useSWR from 'swr';
import { fetcher } from '@/lib/swr/fetcher';
import type { ServiceCallOut } from '@/lib/validations/api';
import type { CallStatus } from '@/lib/validations/field';

/** A service call as GET /api/calls sends it: the output schema's type, dates as ISO strings. */
export type CallRow = ServiceCallOut;

export interface CallFilter {
  status?: CallStatus;
  /** A user id, or 'me'. */
  technician?: string;
}

export function callsKey({ status, technician }: CallFilter = {}): string {
  const params = new URLSearchParams();
  if (status) params.set('status', status);
  if (technician) params.set('technician', technician);
  const query = params.toString();
  return query ? `/api/calls?${query}` : '/api/calls';
}

/** The calls list: refreshed every 30 s and when the tab regains focus, so a dispatched call shows up. */
export function useCalls(filter: CallFilter = {}, { fallbackData }: { fallbackData?: CallRow[] } = {}) {
  return useSWR<CallRow[]>(callsKey(filter), fetcher, {
    fallbackData,
    refreshInterval: 30_000,
    revalidateOnFocus: true,
    keepPreviousData: true,
  });
}
