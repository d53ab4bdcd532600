import type { ReactNode } from 'react';

/** The step's one primary action, pinned to the bottom of the screen within thumb reach. */
export function ActionBar({ children, hint }: { children: ReactNode; hint?: ReactNode }) {
  return (
    <div className="sticky bottom-0 z-10 -mx-4 mt-6 border-t border-line bg-raised/95 px-4 py-3 backdrop-blur sm:-mx-6 sm:px-6 lg:-mx-10 lg:px-10">
      <div className="mx-auto flex max-w-3xl flex-wrap items-center justify-end gap-3">
        {hint && <p className="mr-auto text-sm text-muted">{hint}</p>}
        {children}
      </div>
    </div>
  );
}
