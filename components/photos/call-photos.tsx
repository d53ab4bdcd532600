'use client';

import { SWRConfig } from 'swr';
import { PhotoControl } from '@/components/photos/photo-control';
import { callPhotosKey, useCallPhotos } from '@/lib/swr/use-call-photos';
import type { AttachmentListOut } from '@/lib/validations/attachments';

export interface PhotoGroupLabel {
  id: string;
  /** What the photos are of, in words: "Flame signal (DC microamps): 0.6 µA". */
  label: string;
}

/**
 * The Photos section of the call page: every photo of the call, grouped by what it is attached to —
 * the call itself, each finding, each reading or observation that has photos. Photos of a reading
 * are taken from the wizard's path; here they can be added to the call and its findings.
 */
export function CallPhotos({
  callId,
  initial,
  answers,
  findings,
}: {
  callId: string;
  initial: AttachmentListOut;
  answers: PhotoGroupLabel[];
  findings: PhotoGroupLabel[];
}) {
  const { data } = useCallPhotos(callId, { fallbackData: initial });
  const photos = (data ?? initial).photos;
  const known = new Set(answers.map((a) => a.id));
  const withPhotos = answers.filter((a) => photos.some((p) => p.answerId === a.id));
  // A photo of an answer this page does not list (an answer undone since): shown, not hidden.
  const orphans = [...new Set(photos.filter((p) => p.answerId && !known.has(p.answerId)).map((p) => p.answerId!))];
  const count = photos.length;

  return (
    // The page's list as every control's first answer, so none of them starts with "Loading photos…".
    <SWRConfig value={{ fallback: { [callPhotosKey(callId)]: initial } }}>
      <section aria-labelledby="photos-heading" className="card space-y-5" data-testid="call-photos">
        <div>
          <h2 id="photos-heading" className="text-xl font-bold">
            Photos{count > 0 ? ` (${count})` : ''}
          </h2>
          <p className="text-sm text-muted">
            Photos of a reading or an observation are added from its row in the diagnosis’s “Path so far”; they show here and in the report.
          </p>
        </div>
        <Group title="The call">
          <PhotoControl callId={callId} subject="the call" />
        </Group>
        {findings.map((f) => (
          <Group key={f.id} title={`Finding: ${f.label}`}>
            <PhotoControl callId={callId} findingId={f.id} subject={`the finding “${f.label}”`} />
          </Group>
        ))}
        {withPhotos.map((a) => (
          <Group key={a.id} title={a.label}>
            <PhotoControl callId={callId} answerId={a.id} subject={a.label} compact />
          </Group>
        ))}
        {orphans.map((id, i) => (
          <Group key={id} title={`An earlier answer ${orphans.length > 1 ? i + 1 : ''}`.trim()}>
            <PhotoControl callId={callId} answerId={id} subject="an earlier answer" compact />
          </Group>
        ))}
      </section>
    </SWRConfig>
  );
}

function Group({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="space-y-2 border-t border-line pt-4 first:border-t-0 first:pt-0">
      <h3 className="font-semibold">{title}</h3>
      {children}
    </div>
  );
}
