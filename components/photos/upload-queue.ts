'use client';

import { useSyncExternalStore } from 'react';
import { mutate } from 'swr';
import { precheck, uploadPhoto, type UploadTarget } from '@/components/photos/upload';
import { callPhotosKey } from '@/lib/swr/use-call-photos';

// The photos on their way, kept outside the components: the wizard redraws its footer (and the
// photo controls in it) at every step, and a photo chosen a step earlier must neither stop nor
// vanish. A failed one stays listed until the user tries again or lets it go; a reload of the page
// loses the list (the browser holds the files in memory only), which the controls warn about.

/** Photos sent at the same time: more only slows each bar on a site's mobile connection. */
const PARALLEL = 2;

export type UploadStatus = 'waiting' | 'sending' | 'failed' | 'stored';

export interface UploadItem {
  key: string;
  file: File;
  preview: string | null;
  status: UploadStatus;
  progress: number;
  error?: string;
  /** Whether "Try again" can help (not for a file that is too large or not a photo). */
  retry?: boolean;
}

interface Entry extends UploadItem {
  target: UploadTarget;
}

let entries: Entry[] = [];
const snapshots = new Map<string, UploadItem[]>();
const listeners = new Set<() => void>();
const EMPTY: UploadItem[] = [];

export const targetKey = (t: UploadTarget) => `${t.callId}|${t.answerId ?? ''}|${t.findingId ?? ''}`;

function emit() {
  snapshots.clear();
  for (const l of listeners) l();
}

function patch(key: string, change: Partial<UploadItem>) {
  entries = entries.map((e) => (e.key === key ? { ...e, ...change } : e));
  emit();
}

function pump() {
  const sending = entries.filter((e) => e.status === 'sending').length;
  const next = entries.filter((e) => e.status === 'waiting').slice(0, Math.max(0, PARALLEL - sending));
  for (const entry of next) {
    patch(entry.key, { status: 'sending', progress: 0, error: undefined });
    const { done } = uploadPhoto(entry.target, entry.file, (fraction) => patch(entry.key, { progress: fraction }));
    void done.then(async (result) => {
      if (result.ok) {
        patch(entry.key, { status: 'stored', progress: 1 });
        // The thumbnail replaces the bar once the list has it.
        await mutate(callPhotosKey(entry.target.callId)).catch(() => undefined);
        dismissUpload(entry.key);
      } else {
        patch(entry.key, { status: 'failed', error: result.message, retry: result.retry });
      }
      pump();
    });
  }
}

export function addUploads(target: UploadTarget, files: File[]): void {
  const added = files.map((file): Entry => {
    const refusal = precheck(file);
    return {
      key: crypto.randomUUID(),
      target,
      file,
      preview: file.type.startsWith('image/') ? URL.createObjectURL(file) : null,
      status: refusal ? 'failed' : 'waiting',
      progress: 0,
      ...(refusal ? { error: refusal, retry: false } : {}),
    };
  });
  entries = [...entries, ...added];
  emit();
  pump();
}

export function retryUpload(key: string): void {
  patch(key, { status: 'waiting', error: undefined, progress: 0 });
  pump();
}

/** The user lets a failed photo go (or a stored one leaves the list for its thumbnail). */
export function dismissUpload(key: string): void {
  const gone = entries.find((e) => e.key === key);
  if (gone?.preview) URL.revokeObjectURL(gone.preview);
  entries = entries.filter((e) => e.key !== key);
  emit();
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function itemsOf(key: string): UploadItem[] {
  let s = snapshots.get(key);
  if (!s) {
    s = entries.filter((e) => targetKey(e.target) === key);
    if (s.length === 0) s = EMPTY;
    snapshots.set(key, s);
  }
  return s;
}

/** The photos on their way to this target, oldest first. */
export function useUploads(target: UploadTarget): UploadItem[] {
  const key = targetKey(target);
  return useSyncExternalStore(
    subscribe,
    () => itemsOf(key),
    () => EMPTY,
  );
}

/** Whether any photo on the page is still on its way or failed and not let go. */
export function useUnsettledUploads(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => entries.some((e) => e.status !== 'stored'),
    () => false,
  );
}
