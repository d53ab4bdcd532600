import type { ReactNode } from 'react';

/**
 * The step's one primary action, fixed to the bottom of the screen within thumb reach whatever the
 * length of the step (the wizard leaves room for it with bottom padding). It comes right after the
 * entry in the tab order; lg:left-64 keeps it clear of the side navigation.
 */
export function ActionBar({ children, hint }: { children: ReactNode; hint?: ReactNode }) {
  return (
    <div className="no-print fixed inset-x-0 bottom-0 z-30 border-t border-line bg-raised/95 px-4 py-3 backdrop-blur sm:px-6 lg:left-64 lg:px-10">
      <div className="mx-auto flex max-w-3xl flex-wrap items-center justify-end gap-3">
        {hint && <p className="mr-auto text-sm text-muted">{hint}</p>}
        {children}
      </div>
    </div>
  );
}
