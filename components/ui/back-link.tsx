import Link from 'next/link';

/** "← Service calls": a link back up, as tall as any other touch target (48 px), not just its line of text. */
export function BackLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <Link
      href={href}
      className="-ml-2 inline-flex min-h-touch items-center rounded-lg px-2 font-semibold text-muted underline underline-offset-4 hover:text-ink"
    >
      <span aria-hidden className="mr-1">
        ←
      </span>
      {children}
    </Link>
  );
}
