'use client';

import Link from 'next/link';

// Any page of the signed-in app that fails unexpectedly; the shell and navigation stay usable.
export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="max-w-2xl space-y-4" role="alert">
      <h1 className="page-title">This page could not be shown</h1>
      <p className="text-muted">
        {error.message && !error.digest ? error.message : 'Something went wrong on our side.'} Nothing you saved was lost; try again, or go
        back home.
      </p>
      <div className="flex flex-wrap gap-3">
        <button type="button" className="btn-primary" onClick={reset}>
          Try again
        </button>
        <Link href="/" className="btn-secondary">
          Home
        </Link>
      </div>
    </div>
  );
}
