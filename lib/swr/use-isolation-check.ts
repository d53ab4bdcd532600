'use client';

import useSWR from 'swr';
import { fetcher } from '@/lib/swr/fetcher';
import { isolationCheckSchema, type IsolationRowOut } from '@/lib/validations/trees';

export const isolationCheckKey = (versionId: string) => `/api/tree-versions/${versionId}/isolation-check`;

/**
 * The isolation check of a version, read through its schema. It runs every fault of the library on
 * the server, so it is fetched once and again only when asked (not on focus, not on a timer).
 */
export function useIsolationCheck(versionId: string) {
  return useSWR<IsolationRowOut[]>(
    isolationCheckKey(versionId),
    async (url: string) => {
      const parsed = isolationCheckSchema.safeParse(await fetcher(url));
      if (!parsed.success)
        throw new Error('The isolation check answered in a form this page cannot read. Reload the page and run it again.');
      return parsed.data;
    },
    {
      revalidateOnFocus: false,
      revalidateOnReconnect: false,
      shouldRetryOnError: false,
    },
  );
}
