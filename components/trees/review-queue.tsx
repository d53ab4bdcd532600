import Link from 'next/link';
import { Time } from '@/components/ui/time-zone';
import type { WaitingReview } from '@/lib/validations/trees';

/** A lead's home: drafts other people submitted, waiting for this lead's review, and approved versions to publish. */
export function ReviewQueue({ reviews }: { reviews: WaitingReview[] }) {
  return (
    <section aria-labelledby="review-queue" className="card space-y-3">
      <h2 id="review-queue" className="text-lg font-bold">
        Fault trees waiting for you: <span className="font-mono">{reviews.length}</span>
      </h2>
      {reviews.length === 0 ? (
        <p className="text-muted">No drafts wait for your review.</p>
      ) : (
        <ul className="space-y-2">
          {reviews.map((v) => (
            <li key={v.id}>
              <Link
                href={`/trees/versions/${v.id}`}
                className="flex min-h-touch flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border border-line bg-surface px-3 py-2 hover:border-copper"
              >
                <span className="font-semibold">
                  {v.title}, version {v.version}
                </span>
                <span className="text-sm text-muted">
                  {v.status === 'in_review' ? `submitted by ${v.submittedBy ?? 'a lead'}` : 'approved, ready to publish'}
                  {v.submittedAt && (
                    <>
                      {' · '}
                      <Time value={v.submittedAt} />
                    </>
                  )}
                </span>
                <span className="ml-auto font-semibold">{v.status === 'in_review' ? 'Review' : 'Publish'} →</span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
