import 'server-only';
import { randomUUID } from 'node:crypto';
import {
  countAttachmentsForCall,
  deleteAttachmentRow,
  findAnswerOfCall,
  findFindingOfCall,
  getAttachment,
  insertAttachment,
  listAttachmentsForCall,
  type Attachment,
} from '@/db/attachments';
import { CLOSED_STATUSES, getCall } from '@/db/calls';
import { AppError } from '@/lib/errors';
import { processImage } from '@/lib/images';
import type { Scope } from '@/lib/policy';
import { deleteObject, getObject, putObject, signedGetUrl } from '@/lib/storage/s3';
import { PHOTOS_PER_CALL, type UploadFields } from '@/lib/validations/attachments';
import type { CallStatus } from '@/lib/validations/field';

// Photos of service calls: checked and re-drawn (lib/images.ts), stored under generated keys in
// the object store (lib/storage/s3.ts), listed from PostgreSQL (db/attachments.ts). Whoever
// reaches the call reaches its photos; they are added and removed only while the call is open.

export function attachmentView(a: Attachment) {
  return {
    id: a.id,
    url: `/api/attachments/${a.id}`,
    thumbnailUrl: `/api/attachments/${a.id}?size=thumb`,
    answerId: a.answerId,
    answerClientId: a.answerClientId,
    findingId: a.diagnosisId,
    width: a.width,
    height: a.height,
    size: a.size,
    ownerName: a.ownerName,
    createdAt: a.createdAt,
  };
}

const closed = (status: string) => CLOSED_STATUSES.includes(status as CallStatus);

export async function listCallAttachments({ scope, callId }: { scope: Scope; callId: string }) {
  const call = await getCall({ scope, id: callId });
  const photos = await listAttachmentsForCall({ companyId: scope.companyId, callId: call.id });
  return { photos: photos.map(attachmentView), editable: !closed(call.status) };
}

/** 404 for a call out of the scope's reach, 409 for a closed one: checked before an upload's body is read. */
export async function assertCallTakesPhotos({ scope, callId }: { scope: Scope; callId: string }) {
  const call = await getCall({ scope, id: callId });
  if (closed(call.status))
    throw new AppError('conflict', 'This call is closed: photos can no longer be added. A lead or an admin can reopen it.');
}

export async function uploadAttachment({
  scope,
  callId,
  fields,
  file,
}: {
  scope: Scope;
  callId: string;
  fields: UploadFields;
  file: Buffer;
}) {
  const call = await getCall({ scope, id: callId });
  if (closed(call.status))
    throw new AppError('conflict', 'This call is closed: photos can no longer be added. A lead or an admin can reopen it.');
  let answerId: string | null = null;
  let diagnosisId: string | null = null;
  if (fields.answerId) {
    const answer = await findAnswerOfCall({ companyId: scope.companyId, callId: call.id, answerId: fields.answerId });
    if (!answer)
      throw new AppError('bad_request', 'That reading or observation is not part of this call.', {
        fieldErrors: { answerId: ['Not an answer of this call.'] },
      });
    answerId = answer.id;
  }
  if (fields.findingId) {
    const finding = await findFindingOfCall({ companyId: scope.companyId, callId: call.id, diagnosisId: fields.findingId });
    if (!finding)
      throw new AppError('bad_request', 'That finding is not part of this call.', {
        fieldErrors: { findingId: ['Not a finding of this call.'] },
      });
    diagnosisId = finding.id;
  }
  if ((await countAttachmentsForCall({ companyId: scope.companyId, callId: call.id })) >= PHOTOS_PER_CALL) {
    throw new AppError('conflict', `A call holds at most ${PHOTOS_PER_CALL} photos. Remove one first.`);
  }
  const image = await processImage(file);
  const id = randomUUID();
  const base = `companies/${scope.companyId}/calls/${call.id}/${id}`;
  const key = `${base}/display.webp`;
  const thumbKey = `${base}/thumb.webp`;
  try {
    await putObject(key, image.display.data, 'image/webp');
    await putObject(thumbKey, image.thumb.data, 'image/webp');
  } catch (error) {
    console.error('attachments: the object store refused a photo', error);
    await Promise.allSettled([deleteObject(key), deleteObject(thumbKey)]);
    throw new AppError('unavailable', 'The photo store did not answer. Nothing was stored; try again in a moment.', {
      headers: { 'Retry-After': '5' },
    });
  }
  try {
    await insertAttachment({
      id,
      companyId: scope.companyId,
      callId: call.id,
      answerId,
      diagnosisId,
      ownerId: scope.userId,
      key,
      thumbKey,
      contentType: 'image/webp',
      size: image.display.data.length,
      originalSize: image.original.size,
      width: image.display.width,
      height: image.display.height,
    });
  } catch (error) {
    await Promise.allSettled([deleteObject(key), deleteObject(thumbKey)]);
    throw error;
  }
  return { id, url: `/api/attachments/${id}`, thumbnailUrl: `/api/attachments/${id}?size=thumb` };
}

/** A short-lived signed link to the photo (or its thumbnail), for a user who reaches its call. */
export async function attachmentLink({ scope, id, size }: { scope: Scope; id: string; size: 'display' | 'thumb' }) {
  const a = await getAttachment({ scope, id });
  return { url: await signedGetUrl(size === 'thumb' ? a.thumbKey : a.key) };
}

/** The photo's bytes, for the app's own pages (whose Content-Security-Policy loads images only from the app). */
export async function attachmentBytes({ scope, id, size }: { scope: Scope; id: string; size: 'display' | 'thumb' }) {
  const a = await getAttachment({ scope, id });
  try {
    return { data: await getObject(size === 'thumb' ? a.thumbKey : a.key), contentType: a.contentType };
  } catch (error) {
    console.error('attachments: the object store did not give a photo back', error);
    throw new AppError('unavailable', 'The photo store did not answer. Try again in a moment.', { headers: { 'Retry-After': '5' } });
  }
}

export async function removeAttachment({ scope, id }: { scope: Scope; id: string }) {
  const a = await getAttachment({ scope, id });
  if (closed(a.callStatus)) throw new AppError('conflict', 'This call is closed: its photos are part of the record and stay.');
  await deleteAttachmentRow({ companyId: scope.companyId, id: a.id });
  // The row is gone first: a photo whose object could not be deleted is unreachable, never shown half-removed.
  await Promise.allSettled([deleteObject(a.key), deleteObject(a.thumbKey)]);
  return { id: a.id, removed: true as const };
}
