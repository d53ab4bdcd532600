'use client';

import useSWR from 'swr';
import { fetcher } from '@/lib/swr/fetcher';
import { attachmentListSchema, type AttachmentListOut } from '@/lib/validations/attachments';

export const callPhotosKey = (callId: string) => `/api/calls/${callId}/attachments`;

async function fetchPhotos(url: string): Promise<AttachmentListOut> {
  return attachmentListSchema.parse(await fetcher(url));
}

/**
 * The photos of a call and whether they may still change, from GET /api/calls/{id}/attachments.
 * Every photo control on a page shares this one key, so an upload in one shows in the others.
 */
export function useCallPhotos(callId: string, { fallbackData }: { fallbackData?: AttachmentListOut } = {}) {
  return useSWR<AttachmentListOut>(callPhotosKey(callId), fetchPhotos, { fallbackData, revalidateOnFocus: true, keepPreviousData: true });
}
