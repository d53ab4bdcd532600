'use client';

import useSWR from 'swr';
import { fetcher } from '@/lib/swr/fetcher';

/** A unit as GET /api/units/{id} sends it: attributes, readings and calls (dates as ISO strings). */
export interface UnitJson {
  id: string;
  siteId: string;
  siteName: string;
  siteAddress: string;
  label: string;
  ignition: 'two-rod' | 'single-rod';
  fuel: 'natural-gas' | 'lp';
  controlSupply: '24v' | 'line';
  transformerVa: number;
  installYear: number | null;
  readings: {
    answerId: string;
    callId: string;
    stepTitle: string | null;
    quantity: string;
    value: number;
    text: string | null;
    unit: string | null;
    bandLabel: string | null;
    verdict: string | null;
    takenAt: string;
  }[];
  calls: { id: string; complaint: string; status: string; openedAt: string; technicianName: string | null }[];
}

/** One unit with its history; `null` id fetches nothing (conditional key). */
export function useUnit(id: string | null, { fallbackData }: { fallbackData?: UnitJson } = {}) {
  return useSWR<UnitJson>(id ? `/api/units/${id}` : null, fetcher, { fallbackData, revalidateOnFocus: true });
}
