export default function Loading() {
  return (
    <div className="space-y-4" aria-busy="true">
      <p role="status" className="text-muted">
        Loading…
      </p>
      <div className="h-10 w-1/2 animate-pulse rounded bg-sunken" />
      <div className="h-40 animate-pulse rounded-xl bg-sunken" />
      <div className="h-40 animate-pulse rounded-xl bg-sunken" />
    </div>
  );
}
