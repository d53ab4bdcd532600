'use client';

import clsx from 'clsx';
import { useEffect, useRef, useState, type ChangeEvent } from 'react';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { removePhoto, sizeText, type UploadTarget } from '@/components/photos/upload';
import { addUploads, dismissUpload, retryUpload, useUnsettledUploads, useUploads } from '@/components/photos/upload-queue';
import { useCallPhotos } from '@/lib/swr/use-call-photos';
import { PHOTO_ACCEPT, type AttachmentOut } from '@/lib/validations/attachments';

/** Which of the call's photos belong to this control's target. */
export function photosOf(photos: AttachmentOut[], target: Omit<UploadTarget, 'callId'>): AttachmentOut[] {
  if (target.answerId) return photos.filter((p) => p.answerId === target.answerId || p.answerClientId === target.answerId);
  if (target.findingId) return photos.filter((p) => p.findingId === target.findingId && p.answerId === null);
  return photos.filter((p) => p.answerId === null && p.findingId === null);
}

export interface PhotoControlProps extends UploadTarget {
  /** What the photos show, for the buttons' and pictures' names: "Flame signal", "the call". */
  subject: string;
  /** Smaller, for a row of the path so far: no empty-state sentence. */
  compact?: boolean;
  /** Why photos cannot be added here yet (an answer not saved yet); the buttons wait. */
  disabledReason?: string | null;
}

/**
 * Photos of a call, a reading or observation, or a finding: taken with the tablet's camera or
 * chosen from files (several at once), each sent with its own progress bar; a failed one stays
 * listed with the reason and a retry until the user lets it go; thumbnails of what is stored,
 * removable with a confirmation while the call is open.
 */
export function PhotoControl({ callId, answerId, findingId, subject, compact = false, disabledReason = null }: PhotoControlProps) {
  const { data, error: listError, isLoading, mutate } = useCallPhotos(callId);
  const target: UploadTarget = { callId, answerId, findingId };
  const items = useUploads(target);
  const [removing, setRemoving] = useState<AttachmentOut | null>(null);
  const [removeBusy, setRemoveBusy] = useState(false);
  const [removeError, setRemoveError] = useState<string | null>(null);
  const [announce, setAnnounce] = useState('');
  // Compact: one "Add photo" that opens the two ways, so a long list of rows stays readable.
  const [choosing, setChoosing] = useState(!compact);
  const camera = useRef<HTMLInputElement>(null);
  const files = useRef<HTMLInputElement>(null);

  const shown = data ? photosOf(data.photos, target) : [];
  const editable = data?.editable ?? false;
  const canAdd = editable && !disabledReason;

  // Leaving the page with photos still on their way, or failed and not let go, asks first.
  const unsettled = useUnsettledUploads();
  useEffect(() => {
    if (!unsettled) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [unsettled]);

  function pick(e: ChangeEvent<HTMLInputElement>) {
    const chosen = Array.from(e.target.files ?? []);
    // Cleared, so that the same photo can be chosen again after a failure.
    e.target.value = '';
    if (chosen.length === 0) return;
    addUploads({ callId, answerId, findingId }, chosen);
    setAnnounce(chosen.length === 1 ? `Sending 1 photo of ${subject}.` : `Sending ${chosen.length} photos of ${subject}.`);
  }

  async function confirmRemove() {
    if (!removing) return;
    setRemoveBusy(true);
    setRemoveError(null);
    const reason = await removePhoto(removing.id);
    setRemoveBusy(false);
    if (reason) {
      setRemoveError(reason);
      return;
    }
    setRemoving(null);
    setAnnounce('Photo removed.');
    await mutate();
  }

  const failed = items.filter((i) => i.status === 'failed').length;
  return (
    <div className={clsx('space-y-3', compact && 'space-y-2')} role="group" aria-label={`Photos: ${subject}`} data-testid="photo-control">
      {listError && !data && (
        <p className="text-base">
          <span aria-hidden>⚠ </span>The photos could not be loaded: {listError.message}{' '}
          <button type="button" className="btn-quiet underline" onClick={() => void mutate()}>
            Try again
          </button>
        </p>
      )}
      {isLoading && !data && <p className="text-base text-muted">Loading photos…</p>}
      {data && shown.length === 0 && items.length === 0 && !compact && (
        <p className="text-base text-muted">{editable ? 'No photos yet.' : 'No photos.'}</p>
      )}

      {(shown.length > 0 || items.length > 0) && (
        <ul className="flex flex-wrap gap-3" aria-label={`Photos of ${subject}`}>
          {shown.map((p, i) => (
            <li key={p.id} className="flex w-28 flex-col gap-1" data-testid="photo">
              <a
                href={p.url}
                target="_blank"
                rel="noreferrer"
                className="block h-28 w-28 overflow-hidden rounded-lg border border-line bg-sunken focus-visible:outline focus-visible:outline-2"
              >
                {/* eslint-disable-next-line @next/next/no-img-element -- a signed, per-user photo: next/image would cache it across users */}
                <img src={p.thumbnailUrl} alt={`Photo ${i + 1} of ${subject}`} className="h-full w-full object-cover" loading="lazy" />
              </a>
              {editable && (
                <button
                  type="button"
                  className="btn-quiet min-h-touch px-2 text-base underline"
                  onClick={() => {
                    setRemoveError(null);
                    setRemoving(p);
                  }}
                >
                  Remove
                  <span className="sr-only">
                    {' '}
                    photo {i + 1} of {subject}
                  </span>
                </button>
              )}
            </li>
          ))}
          {items.map((item) => (
            <li
              key={item.key}
              className={clsx(
                'flex flex-col gap-1 rounded-lg border p-2',
                item.status === 'failed' ? 'w-full border-2 border-ink sm:w-72' : 'w-28 border-line',
              )}
              data-testid="photo-upload"
              data-status={item.status}
            >
              <div className="flex items-start gap-2">
                <div className="h-24 w-24 shrink-0 overflow-hidden rounded bg-sunken">
                  {item.preview ? (
                    // eslint-disable-next-line @next/next/no-img-element -- a local preview (blob:) of the chosen file
                    <img
                      src={item.preview}
                      alt=""
                      className="h-full w-full object-cover opacity-70"
                      onError={(e) => (e.currentTarget.style.display = 'none')}
                    />
                  ) : (
                    <span aria-hidden className="flex h-full items-center justify-center font-mono text-2xl text-muted">
                      ?
                    </span>
                  )}
                </div>
                {item.status === 'failed' && (
                  <p className="min-w-0 break-words text-base" role="alert">
                    <span className="font-semibold">
                      <span aria-hidden>✗ </span>Not stored
                    </span>{' '}
                    <span className="block break-all text-sm text-muted">
                      {item.file.name || 'photo'} · {sizeText(item.file.size)}
                    </span>
                    {item.error}
                  </p>
                )}
              </div>
              {(item.status === 'waiting' || item.status === 'sending' || item.status === 'stored') && (
                <>
                  <div
                    role="progressbar"
                    aria-label={`Sending ${item.file.name || 'photo'}`}
                    aria-valuemin={0}
                    aria-valuemax={100}
                    aria-valuenow={Math.round(item.progress * 100)}
                    className="h-3 w-full overflow-hidden rounded-full border border-line bg-surface"
                  >
                    <div className="h-full bg-ink transition-[width]" style={{ width: `${Math.round(item.progress * 100)}%` }} />
                  </div>
                  <p className="text-sm text-muted">
                    {item.status === 'waiting'
                      ? 'Waiting…'
                      : item.status === 'stored'
                        ? 'Stored'
                        : item.progress >= 1
                          ? 'Checking…'
                          : `${Math.round(item.progress * 100)} %`}
                  </p>
                </>
              )}
              {item.status === 'failed' && (
                <div className="flex flex-wrap gap-2">
                  {item.retry && (
                    <button type="button" className="btn-secondary" onClick={() => retryUpload(item.key)}>
                      Try again<span className="sr-only"> to send {item.file.name || 'the photo'}</span>
                    </button>
                  )}
                  <button type="button" className="btn-quiet underline" onClick={() => dismissUpload(item.key)}>
                    {item.retry ? 'Let it go' : 'OK, remove from the list'}
                    <span className="sr-only"> ({item.file.name || 'photo'})</span>
                  </button>
                </div>
              )}
            </li>
          ))}
        </ul>
      )}

      {data && editable && compact && !choosing && (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn-secondary" disabled={!canAdd} onClick={() => setChoosing(true)}>
            <span aria-hidden>+ </span>Add photo<span className="sr-only"> of {subject}</span>
          </button>
          {disabledReason && <span className="text-base text-muted">{disabledReason}</span>}
        </div>
      )}
      {data && editable && choosing && (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn-secondary" disabled={!canAdd} onClick={() => camera.current?.click()}>
            <span aria-hidden>◉ </span>Take photo<span className="sr-only"> of {subject}</span>
          </button>
          <button type="button" className="btn-secondary" disabled={!canAdd} onClick={() => files.current?.click()}>
            Choose photos<span className="sr-only"> of {subject}</span>
          </button>
          {compact && (
            <button type="button" className="btn-quiet underline" onClick={() => setChoosing(false)}>
              Done
            </button>
          )}
          {disabledReason && <span className="text-base text-muted">{disabledReason}</span>}
          <input
            ref={camera}
            type="file"
            accept="image/*"
            capture="environment"
            multiple
            className="sr-only"
            tabIndex={-1}
            aria-hidden
            data-testid="photo-camera-input"
            onChange={pick}
          />
          <input
            ref={files}
            type="file"
            accept={PHOTO_ACCEPT}
            multiple
            className="sr-only"
            tabIndex={-1}
            aria-hidden
            data-testid="photo-file-input"
            onChange={pick}
          />
        </div>
      )}
      {data && !editable && !compact && shown.length > 0 && (
        <p className="text-sm text-muted">The call is closed: its photos are part of the record.</p>
      )}
      {failed > 0 && (
        <p className="text-base font-semibold">
          <span aria-hidden>⚠ </span>
          {failed === 1 ? '1 photo was not stored.' : `${failed} photos were not stored.`} They stay here until you try again or let them
          go.
        </p>
      )}
      <p className="sr-only" aria-live="polite">
        {announce}
      </p>

      <ConfirmDialog
        open={removing !== null}
        title="Remove this photo?"
        description={`It is deleted from ${subject} and from the report. This cannot be undone.`}
        confirmLabel="Remove photo"
        busy={removeBusy}
        busyLabel="Removing…"
        error={removeError}
        onConfirm={() => void confirmRemove()}
        onCancel={() => setRemoving(null)}
      >
        {removing && (
          // eslint-disable-next-line @next/next/no-img-element -- the photo about to go, as the user saw it
          <img src={removing.thumbnailUrl} alt="The photo to remove" className="h-32 w-32 rounded-lg object-cover" />
        )}
      </ConfirmDialog>
    </div>
  );
}
