import type { ReactNode } from 'react';

/**
 * The step's one primary action, pinned to the bottom of the screen within thumb reach. It comes
 * right after the entry in the tab order but is drawn last (order-last in the step's flex column).
 */
export function ActionBar({ children, hint }: { children: ReactNode; hint?: ReactNode }) {
  return (
    <div className="order-last sticky bottom-0 z-10 -mx-4 mt-2 border-t border-line bg-raised/95 px-4 py-3 backdrop-blur sm:-mx-6 sm:px-6 lg:-mx-10 lg:px-10">
      <div className="mx-auto flex max-w-3xl flex-wrap items-center justify-end gap-3">
        {hint && <p className="mr-auto text-sm text-muted">{hint}</p>}
        {children}
      </div>
    </div>
  );
}
