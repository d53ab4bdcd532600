import { PHOTO_MAX_BYTES } from '@/lib/validations/attachments';
import { uploadedSchema } from '@/lib/validations/attachments';
import type { z } from 'zod';

// One photo to POST /api/calls/{id}/attachments by XMLHttpRequest: fetch reports no upload
// progress, and the control shows a bar per file.

export type Uploaded = z.output<typeof uploadedSchema>;

export type UploadResult =
  | { ok: true; photo: Uploaded }
  /** `retry`: whether sending the same file again can help (a dropped connection, a busy server), or not (too large, not an image). */
  | { ok: false; status: number; message: string; retry: boolean };

export interface UploadTarget {
  callId: string;
  /** A reading or observation: the answer's id or the client id the wizard made for it. */
  answerId?: string;
  /** A finding: the id of the diagnosis that reached it. */
  findingId?: string;
}

const MB = 1024 * 1024;

export function sizeText(bytes: number): string {
  return bytes >= MB ? `${(bytes / MB).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} KB`;
}

/** What can be said before a byte is sent; null when the file may go (the server checks it again, by its content). */
export function precheck(file: File): string | null {
  if (file.size === 0) return 'This file is empty: nothing to send.';
  if (file.size > PHOTO_MAX_BYTES)
    return `This file is ${sizeText(file.size)}: a photo may be at most ${PHOTO_MAX_BYTES / MB} MB. Take it again at a lower resolution.`;
  if (file.type && !file.type.startsWith('image/')) return 'This is not a photo: choose a JPEG, PNG, WebP or AVIF image.';
  return null;
}

/** A refusal in words, from the server's own message where it gave one. */
function failure(status: number, body: string): UploadResult {
  let message: string | null = null;
  try {
    message = (JSON.parse(body) as { error?: { message?: string } })?.error?.message ?? null;
  } catch {
    // Not JSON (a proxy's page): fall back on the status.
  }
  switch (status) {
    case 0:
      return { ok: false, status, retry: true, message: 'No connection to the server: the photo was not sent.' };
    case 401:
      return { ok: false, status, retry: true, message: 'Your session ended: sign in again (in another tab), then try again.' };
    case 413:
      return { ok: false, status, retry: false, message: message ?? `This photo is too large: at most ${PHOTO_MAX_BYTES / MB} MB.` };
    case 415:
      return { ok: false, status, retry: false, message: message ?? 'This file is not a photo the app can read.' };
    case 400:
    case 403:
    case 404:
      return { ok: false, status, retry: false, message: message ?? 'The server refused this photo.' };
    case 409:
      return { ok: false, status, retry: false, message: message ?? 'This photo can no longer be added.' };
    default:
      return { ok: false, status, retry: true, message: message ?? `The server answered ${status}: the photo was not stored.` };
  }
}

export function uploadPhoto(
  target: UploadTarget,
  file: File,
  onProgress: (fraction: number) => void,
): { done: Promise<UploadResult>; abort: () => void } {
  const xhr = new XMLHttpRequest();
  const done = new Promise<UploadResult>((resolve) => {
    const form = new FormData();
    form.set('file', file, file.name || 'photo');
    if (target.answerId) form.set('answerId', target.answerId);
    if (target.findingId) form.set('findingId', target.findingId);
    xhr.open('POST', `/api/calls/${encodeURIComponent(target.callId)}/attachments`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      if (xhr.status === 201) {
        const parsed = uploadedSchema.safeParse(
          (() => {
            try {
              return JSON.parse(xhr.responseText);
            } catch {
              return null;
            }
          })(),
        );
        if (parsed.success) return resolve({ ok: true, photo: parsed.data });
        return resolve({
          ok: false,
          status: 201,
          retry: false,
          message: 'The photo was stored, but the answer could not be read: reload the page.',
        });
      }
      resolve(failure(xhr.status, xhr.responseText));
    };
    xhr.onerror = () => resolve(failure(0, ''));
    xhr.onabort = () => resolve({ ok: false, status: 0, retry: true, message: 'The upload was stopped.' });
    xhr.send(form);
  });
  return { done, abort: () => xhr.abort() };
}

/** DELETE /api/attachments/{id}: null when removed, otherwise the reason in words. */
export async function removePhoto(id: string): Promise<string | null> {
  try {
    const res = await fetch(`/api/attachments/${encodeURIComponent(id)}`, {
      method: 'DELETE',
      headers: { accept: 'application/json' },
      credentials: 'same-origin',
    });
    if (res.ok) return null;
    try {
      const body = (await res.json()) as { error?: { message?: string } };
      if (body?.error?.message) return body.error.message;
    } catch {
      // fall through
    }
    return `The server answered ${res.status}: the photo was not removed.`;
  } catch {
    return 'No connection to the server: the photo was not removed.';
  }
}
