'use client';

import useSWR from 'swr';
import { fetcher } from '@/lib/swr/fetcher';
import { isolationCheckSchema, type IsolationQuery, type IsolationRowOut } from '@/lib/validations/isolation';

export function isolationCheckKey(versionId: string, query: IsolationQuery = {}): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) if (value) params.set(key, value);
  const search = params.toString();
  return `/api/tree-versions/${versionId}/isolation-check${search ? `?${search}` : ''}`;
}

/**
 * The isolation check of a version on a unit profile, read through the route's own schema. It runs
 * every fault of the library on the server, so it is fetched once per profile and again only when
 * asked (not on focus, not on a timer).
 */
export function useIsolationCheck(versionId: string, query: IsolationQuery = {}) {
  return useSWR<IsolationRowOut[]>(
    isolationCheckKey(versionId, query),
    async (url: string) => {
      const parsed = isolationCheckSchema.safeParse(await fetcher(url));
      if (!parsed.success)
        throw new Error('The isolation check answered in a form this page cannot read. Reload the page and run it again.');
      return parsed.data;
    },
    { revalidateOnFocus: false, revalidateOnReconnect: false, shouldRetryOnError: false },
  );
}
