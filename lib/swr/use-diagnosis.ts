'use client';

import useSWR from 'swr';
import type { DiagnosisView } from '@/lib/server/diagnoses';
import { fetcher } from '@/lib/swr/fetcher';

/** A diagnosis view as JSON carries it: dates become ISO strings. */
export type DiagnosisViewJson = Omit<DiagnosisView, 'path'> & {
  path: (Omit<DiagnosisView['path'][number], 'at'> & { at: string })[];
};

/** GET /api/diagnoses/{id}: the server's path, current step, finding and contradictions. */
export function useDiagnosis(id: string | null, fallbackData?: DiagnosisViewJson) {
  return useSWR<DiagnosisViewJson>(id ? `/api/diagnoses/${id}` : null, fetcher, {
    fallbackData,
    // The wizard drives revalidation after its saves; a focus refetch mid-answer adds nothing.
    revalidateOnFocus: false,
    revalidateIfStale: false,
  });
}
