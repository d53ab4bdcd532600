import Link from 'next/link';
import { Time } from '@/components/ui/time-zone';
import type { AuthoringTreeOut } from '@/lib/validations/api';

/**
 * A lead's home: drafts other people submitted, waiting for this lead's review, and approved
 * versions waiting to be published. Their own submissions are not listed: someone else approves them.
 */
export function ReviewQueue({ trees, userId }: { trees: AuthoringTreeOut[]; userId: string }) {
  const waiting = trees.flatMap((tree) =>
    tree.openVersions
      .filter((v) => (v.status === 'in_review' && v.author?.id !== userId) || v.status === 'approved')
      .map((v) => ({ tree, v })),
  );
  return (
    <section aria-labelledby="review-queue" className="space-y-3">
      <h2 id="review-queue" className="text-xl font-bold">
        Fault trees waiting for you
      </h2>
      {waiting.length === 0 ? (
        <p className="card text-muted">No drafts wait for your review.</p>
      ) : (
        <ul className="space-y-2">
          {waiting.map(({ tree, v }) => (
            <li key={v.id}>
              <Link
                href={`/trees/versions/${v.id}`}
                className="card flex min-h-touch flex-wrap items-center gap-x-3 gap-y-1 hover:bg-sunken"
              >
                <span className="font-semibold">
                  {tree.title}, version {v.version}
                </span>
                <span className="text-sm text-muted">
                  {v.status === 'in_review' ? `submitted by ${v.author?.name ?? 'a lead'}` : 'approved, ready to publish'} ·{' '}
                  <Time value={v.updatedAt} />
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
