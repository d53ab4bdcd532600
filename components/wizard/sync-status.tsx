import clsx from 'clsx';

/** "Saved" / "Saving…" / "Offline — 2 answers waiting": small, but always on screen. */
export function SyncStatus({
  kind,
  text,
  onRetry,
}: {
  kind: 'saved' | 'saving' | 'offline' | 'retrying' | 'signed-out';
  text: string;
  onRetry?: () => void;
}) {
  return (
    <div className="flex items-center gap-2" data-testid="sync-status" data-sync={kind}>
      <p
        role="status"
        aria-live="polite"
        className={clsx('flex items-center gap-1.5 text-base', kind === 'saved' ? 'text-muted' : 'font-semibold text-ink')}
      >
        <span aria-hidden>{kind === 'saved' ? '✓' : kind === 'saving' ? '↻' : '⨯'}</span>
        {text}
      </p>
      {kind === 'signed-out' && (
        // A new tab, so this page and the answers it holds stay as they are.
        <a href="/sign-in" target="_blank" rel="noopener" className="btn-quiet min-h-touch px-3 text-base underline">
          Sign in
        </a>
      )}
      {onRetry && (kind === 'offline' || kind === 'retrying' || kind === 'signed-out') && (
        <button type="button" className="btn-quiet min-h-touch px-3 text-base underline" onClick={onRetry}>
          {kind === 'signed-out' ? 'Send now' : 'Retry now'}
        </button>
      )}
    </div>
  );
}
