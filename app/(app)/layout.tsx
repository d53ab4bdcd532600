import Link from 'next/link';
import { AppNav } from '@/components/shell/app-nav';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { SignOutEverywhere } from '@/components/shell/sign-out-everywhere';
import { Brand } from '@/components/ui/brand';
import { ThemeToggle } from '@/components/ui/theme-toggle';
import { navFor, ROLE_LABELS } from '@/lib/roles';
import { requirePageUser } from '@/lib/server/guard';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser();
  const items = navFor(user.role).map(({ href, label }) => ({ href, label }));
  return (
    <div className="flex min-h-dvh flex-col lg:flex-row">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 btn-primary">
        Skip to content
      </a>
      <aside className="no-print hidden w-64 shrink-0 flex-col gap-6 border-r border-line bg-raised p-4 lg:flex">
        <Link href="/" className="flex min-h-touch items-center px-2">
          <Brand />
        </Link>
        <AppNav items={items} orientation="column" />
        <div className="mt-auto space-y-3 px-2 text-sm">
          <UserBadge name={user.name} role={ROLE_LABELS[user.role]} company={user.companyName} />
          <div className="flex items-center gap-2">
            <ThemeToggle />
            <SignOutButton />
          </div>
          <SignOutEverywhere className="-ml-1" />
        </div>
      </aside>
      <header className="no-print sticky top-0 z-20 border-b border-line bg-raised/95 backdrop-blur lg:hidden">
        <div className="flex items-center justify-between gap-2 px-3 py-1">
          <Link href="/" className="flex min-h-touch items-center">
            <Brand />
          </Link>
          <div className="flex items-center gap-1">
            <span className="hidden text-right text-sm leading-tight sm:block">
              <span className="block font-semibold">{user.name}</span>
              <span className="block text-muted">{ROLE_LABELS[user.role]}</span>
            </span>
            <ThemeToggle />
            <SignOutButton />
          </div>
        </div>
        <div className="px-2 pb-2">
          <AppNav items={items} orientation="row" />
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 sm:px-6 lg:px-10">
        {children}
      </main>
      {/* On a phone the header has no room for it; the account line closes every page instead. */}
      <footer className="no-print border-t border-line bg-raised px-4 py-3 lg:hidden">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-2 text-sm">
          <UserBadge name={user.name} role={ROLE_LABELS[user.role]} company={user.companyName} />
          <SignOutEverywhere />
        </div>
      </footer>
    </div>
  );
}

function UserBadge({ name, role, company }: { name: string; role: string; company: string }) {
  return (
    <div>
      <p className="font-semibold">{name}</p>
      <p className="text-muted">
        {role} · {company}
      </p>
    </div>
  );
}
