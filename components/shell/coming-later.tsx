/** An honest placeholder for a feature that a later release brings. */
export function ComingLater({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="space-y-4">
      <h1 className="page-title">{title}</h1>
      <div className="card max-w-2xl space-y-2">
        <p className="inline-block rounded-full border border-line px-3 py-1 text-sm font-semibold text-muted">Not built yet</p>
        <div className="text-muted">{children}</div>
      </div>
    </div>
  );
}
