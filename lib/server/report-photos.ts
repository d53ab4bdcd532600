import 'server-only';
import { listAttachmentsForCall } from '@/db/attachments';
import { thumbnailForPdf } from '@/lib/images';
import type { ReportPhoto } from '@/lib/pdf/report-document';
import type { Scope } from '@/lib/policy';
import { getObject } from '@/lib/storage/s3';

/**
 * The thumbnails of a call's photos for its PDF, read from the object store on the server (not
 * through links, which expire and which the renderer would fetch without the user's session). The
 * caller has checked that the scope reaches the call. A photo the store does not give back is left
 * out and said so in the log: the report is still made.
 */
export async function reportPhotos({ scope, callId }: { scope: Scope; callId: string }): Promise<ReportPhoto[]> {
  const rows = await listAttachmentsForCall({ companyId: scope.companyId, callId });
  const photos = await Promise.all(
    rows.map(async (a): Promise<ReportPhoto | null> => {
      try {
        return { id: a.id, data: await thumbnailForPdf(await getObject(a.thumbKey)), format: 'jpg' };
      } catch (error) {
        console.error(`report: photo ${a.id} of call ${callId} could not be read for the PDF`, error);
        return null;
      }
    }),
  );
  return photos.filter((p): p is ReportPhoto => p !== null);
}
