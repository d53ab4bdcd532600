import Link from 'next/link';

/** The user's own settings (e-mail notifications), beside the account controls. */
export function SettingsLink({ className }: { className?: string }) {
  return (
    <Link href="/settings" className={`btn-quiet px-4 text-sm ${className ?? ''}`}>
      My settings
    </Link>
  );
}
