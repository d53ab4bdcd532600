import { Time } from '@/components/ui/time-zone';
import type { AuthoringVersionOut } from '@/lib/validations/api';

/** What a reviewer asked to change when sending a version back, step by step. */
export function ReviewComments({ version }: { version: Pick<AuthoringVersionOut, 'reviewComments' | 'returnedBy' | 'returnedAt'> }) {
  return (
    <section aria-labelledby="review-comments" className="card space-y-2 border-copper">
      <h2 id="review-comments" className="text-lg font-bold">
        Sent back for changes
        {version.returnedBy && <> by {version.returnedBy.name}</>}
        {version.returnedAt && (
          <>
            , <Time value={version.returnedAt} />
          </>
        )}
      </h2>
      <ul className="list-disc space-y-1 pl-5">
        {version.reviewComments.map((c, i) => (
          <li key={i}>
            {c.stepId && <span className="font-mono font-semibold">{c.stepId}: </span>}
            {c.text}
          </li>
        ))}
      </ul>
    </section>
  );
}
