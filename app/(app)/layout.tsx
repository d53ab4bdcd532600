import Link from 'next/link';
import { AppNav } from '@/components/shell/app-nav';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { SettingsLink } from '@/components/shell/settings-link';
import { SignOutEverywhere } from '@/components/shell/sign-out-everywhere';
import { Brand } from '@/components/ui/brand';
import { ThemeToggle } from '@/components/ui/theme-toggle';
import { TimeZoneProvider } from '@/components/ui/time-zone';
import { navFor, ROLE_LABELS } from '@/lib/roles';
import { companyTimeZone } from '@/lib/server/company';
import { requirePageUser } from '@/lib/server/guard';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser();
  const items = navFor(user.role).map(({ href, label }) => ({ href, label }));
  const timeZone = await companyTimeZone(user.companyId);
  // The side navigation only from 1280 px: on a 1024 × 768 tablet the wizard needs the width, so the
  // navigation sits in one row of the top bar there (two rows on a phone).
  return (
    <div className="flex min-h-dvh flex-col xl:flex-row">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 btn-primary">
        Skip to content
      </a>
      <aside className="no-print hidden w-64 shrink-0 flex-col gap-6 border-r border-line bg-raised p-4 xl:flex">
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
          <SettingsLink className="-ml-1" />
          <SignOutEverywhere className="-ml-1" />
        </div>
      </aside>
      <header className="no-print sticky top-0 z-20 border-b border-line bg-raised/95 backdrop-blur xl:hidden">
        <div className="flex flex-wrap items-center gap-x-2 px-3 py-1 md:flex-nowrap">
          <Link href="/" className="flex min-h-touch items-center">
            <Brand markOnlyFromMd />
          </Link>
          <div className="order-last w-full pb-1 md:order-none md:w-auto md:min-w-0 md:flex-1 md:pb-0">
            <AppNav items={items} orientation="row" />
          </div>
          <div className="ml-auto flex items-center gap-1">
            <span className="hidden text-right text-sm leading-tight sm:block md:hidden">
              <span className="block font-semibold">{user.name}</span>
              <span className="block text-muted">{ROLE_LABELS[user.role]}</span>
            </span>
            <ThemeToggle />
            <SignOutButton />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 sm:px-6 xl:px-10">
        <TimeZoneProvider timeZone={timeZone}>{children}</TimeZoneProvider>
      </main>
      {/* On a phone the header has no room for it; the account line closes every page instead. */}
      <footer className="no-print border-t border-line bg-raised px-4 py-3 xl:hidden">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-2 text-sm">
          <UserBadge name={user.name} role={ROLE_LABELS[user.role]} company={user.companyName} />
          <SettingsLink />
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
