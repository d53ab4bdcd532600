import clsx from 'clsx';

/** "Saved" / "Saving…" / "Offline — 2 answers waiting": small, but always on screen. */
export function SyncStatus({
  kind,
  text,
  onRetry,
}: {
  kind: 'saved' | 'saving' | 'offline' | 'retrying';
  text: string;
  onRetry?: () => void;
}) {
  return (
    <div className="flex items-center gap-2" data-testid="sync-status" data-sync={kind}>
      <p
        role="status"
        aria-live="polite"
        className={clsx('flex items-center gap-1.5 text-sm', kind === 'saved' ? 'text-muted' : 'font-semibold text-ink')}
      >
        <span aria-hidden>{kind === 'saved' ? '✓' : kind === 'saving' ? '↻' : '⨯'}</span>
        {text}
      </p>
      {onRetry && (kind === 'offline' || kind === 'retrying') && (
        <button type="button" className="btn-quiet min-h-0 px-2 py-1 text-sm underline" onClick={onRetry}>
          Retry now
        </button>
      )}
    </div>
  );
}
