'use client';

import { useEffect, useRef, type ReactNode } from 'react';

/**
 * The step's one primary action, fixed to the bottom of the screen within thumb reach whatever the
 * length of the step. It comes right after the entry in the tab order; xl:left-64 keeps it clear of
 * the side navigation. Its height (it grows when the hint wraps) is published as `--action-bar-h`
 * and as the page's bottom scroll padding, so the wizard's bottom padding and anything scrolled or
 * focused into view (a keypad key, the gauge) stay above it.
 */
export function ActionBar({ children, hint }: { children: ReactNode; hint?: ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const bar = ref.current;
    const root = document.documentElement;
    if (!bar) return;
    const publish = () => {
      const height = Math.ceil(bar.getBoundingClientRect().height);
      root.style.setProperty('--action-bar-h', `${height}px`);
      root.style.scrollPaddingBottom = `${height + 16}px`;
    };
    publish();
    const observer = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(publish);
    observer?.observe(bar);
    return () => {
      observer?.disconnect();
      root.style.removeProperty('--action-bar-h');
      root.style.scrollPaddingBottom = '';
    };
  }, []);
  return (
    <div
      ref={ref}
      data-testid="action-bar"
      className="no-print fixed inset-x-0 bottom-0 z-30 border-t border-line bg-raised/95 px-4 py-3 backdrop-blur sm:px-6 xl:left-64 xl:px-10"
    >
      <div className="mx-auto flex max-w-3xl flex-wrap items-center justify-end gap-3">
        {hint && <p className="mr-auto text-base text-muted">{hint}</p>}
        {children}
      </div>
    </div>
  );
}
