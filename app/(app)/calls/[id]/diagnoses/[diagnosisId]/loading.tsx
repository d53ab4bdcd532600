export default function Loading() {
  return (
    <div className="mx-auto max-w-3xl space-y-4" aria-busy="true">
      <p role="status" className="text-muted">
        Loading the diagnosis…
      </p>
      <div className="h-10 w-2/3 animate-pulse rounded bg-sunken" />
      <div className="h-32 animate-pulse rounded-xl bg-sunken" />
      <div className="h-64 animate-pulse rounded-xl bg-sunken" />
    </div>
  );
}
