'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { ActionResult, CreatedDraftOut } from '@/lib/validations/api';

/** Starts a draft (a copy of a version, of the built-in revision, or from scratch) and opens it in the editor. */
export function StartDraftButton({
  treeId,
  draft,
  label,
  primary,
  startDraft,
}: {
  treeId: string;
  draft: { fromVersionId?: string; fromBuiltin?: boolean };
  label: string;
  primary?: boolean;
  startDraft: (input: unknown) => Promise<ActionResult<CreatedDraftOut>>;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  return (
    <span className="inline-flex flex-col">
      <button
        type="button"
        className={primary ? 'btn-primary' : 'btn-secondary'}
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setMessage(null);
          const result = await startDraft({ treeId, draft });
          if (!result.ok) {
            setBusy(false);
            setMessage(result.message);
            return;
          }
          router.push(`/trees/versions/${result.data.id}/edit`);
        }}
      >
        {busy ? 'Starting…' : label}
      </button>
      <span role="alert" className="text-sm font-semibold">
        {message}
      </span>
    </span>
  );
}
