'use client';

import clsx from 'clsx';
import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { NavItem } from '@/lib/roles';

export function AppNav({ items, orientation }: { items: Pick<NavItem, 'href' | 'label'>[]; orientation: 'row' | 'column' }) {
  const pathname = usePathname();
  const isActive = (href: string) => (href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`));
  return (
    <nav aria-label="Main">
      <ul
        className={clsx(
          'flex gap-1',
          // A fading right edge tells a phone user that the row scrolls.
          orientation === 'column'
            ? 'flex-col'
            : 'overflow-x-auto pr-10 [mask-image:linear-gradient(to_right,black_calc(100%-2rem),transparent)]',
        )}
      >
        {items.map((item) => (
          <li key={item.href} className="shrink-0">
            <Link
              href={item.href}
              aria-current={isActive(item.href) ? 'page' : undefined}
              className={clsx(
                'flex min-h-touch items-center rounded-lg px-4 font-semibold',
                isActive(item.href)
                  ? 'bg-copper-soft text-ink shadow-[inset_4px_0_0_rgb(var(--copper))]'
                  : 'text-muted hover:bg-sunken hover:text-ink',
              )}
            >
              {item.label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
