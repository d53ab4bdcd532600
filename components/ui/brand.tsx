import clsx from 'clsx';

/** The product mark: a copper gauge needle over a graphite arc (the same drawing as app/icon.svg). */
export function Brand({ compact = false, markOnlyFromMd = false }: { compact?: boolean; markOnlyFromMd?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2 font-bold tracking-tight">
      <svg aria-hidden width="28" height="28" viewBox="0 0 32 32">
        <path d="M4 22a12 12 0 0 1 24 0" fill="none" stroke="currentColor" strokeWidth="3" strokeLinecap="round" opacity="0.45" />
        <path d="M16 22 L24 10" stroke="rgb(var(--copper))" strokeWidth="3.5" strokeLinecap="round" />
        <circle cx="16" cy="22" r="3.2" fill="rgb(var(--copper))" />
      </svg>
      {/* In the one-row top bar (tablets) the navigation needs the room: the name is then for screen readers only. */}
      {!compact && <span className={clsx('text-lg', markOnlyFromMd && 'md:sr-only')}>Proving Ground</span>}
    </span>
  );
}
