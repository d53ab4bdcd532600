import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16">
      <h1 className="page-title mb-2">Not found</h1>
      <p className="mb-6 text-muted">That page or record does not exist, or it is not yours to see.</p>
      <Link href="/" className="btn-primary">
        Go home
      </Link>
    </main>
  );
}
