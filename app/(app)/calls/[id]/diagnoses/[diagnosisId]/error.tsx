'use client';

import Link from 'next/link';

export default function DiagnosisError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-3xl space-y-4" role="alert">
      <h1 className="page-title">The diagnosis could not be shown</h1>
      <p>
        {error.message && !error.digest ? error.message : 'Something went wrong on our side.'} Answers already given are kept on this tablet
        and on the server; try again.
      </p>
      <div className="flex flex-wrap gap-3">
        <button type="button" className="btn-primary" onClick={reset}>
          Try again
        </button>
        <Link href="/calls" className="btn-secondary">
          Back to calls
        </Link>
      </div>
    </div>
  );
}
