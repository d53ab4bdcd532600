'use client';

// The review of a submitted version: approve (a different lead or an admin than its author; the
// server refuses the author), send back with comments per step, and publish an approved version.
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { z } from 'zod';
import type { ActionResult, AuthoringVersionOut, VersionTransitionOut } from '@/lib/validations/api';
import type { reviewCommentSchema } from '@/lib/validations/trees';

/** A comment being written: no step chosen is "" until it is sent. */
type CommentDraft = Required<z.input<typeof reviewCommentSchema>>;

type Act = (input: unknown) => Promise<ActionResult<VersionTransitionOut>>;
export interface ReviewActions {
  approve: Act;
  returnVersion: Act;
  publish: Act;
}

export function ReviewPanel({
  version,
  stepIds,
  actions,
  problems,
}: {
  version: Pick<AuthoringVersionOut, 'id' | 'treeId' | 'status' | 'author'>;
  stepIds: string[];
  actions: ReviewActions;
  problems: number;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [comments, setComments] = useState<CommentDraft[]>([{ stepId: '', text: '' }]);
  const [returning, setReturning] = useState(false);

  const run = async (act: Act, input: unknown) => {
    setBusy(true);
    setMessage(null);
    const result = await act(input);
    setBusy(false);
    if (!result.ok) {
      setMessage(result.message);
      return;
    }
    router.refresh();
  };

  if (version.status !== 'in_review' && version.status !== 'approved') return null;

  return (
    <section aria-labelledby="review" className="card space-y-3">
      <h2 id="review" className="text-lg font-bold">
        {version.status === 'in_review' ? 'Review' : 'Approved: ready to publish'}
      </h2>
      {version.status === 'in_review' && (
        <p className="text-sm text-muted">
          Written by {version.author?.name ?? 'another lead'}. A lead other than the author, or an admin, approves; then it can be
          published.
        </p>
      )}
      {version.status === 'approved' && (
        <p className="text-sm text-muted">
          Publishing makes it the version new diagnoses use and retires the one before; diagnoses already running keep their version.
        </p>
      )}
      {problems > 0 && (
        <p className="font-semibold">
          <span aria-hidden>⚠</span> This version has {problems} problem{problems === 1 ? '' : 's'}; the server will not publish it.
        </p>
      )}
      <div role="alert" aria-live="polite">
        {message && (
          <p className="field-error">
            <span aria-hidden>⚠</span> {message}
          </p>
        )}
      </div>
      <div className="flex flex-wrap gap-2">
        {version.status === 'in_review' && (
          <button type="button" className="btn-primary" disabled={busy} onClick={() => void run(actions.approve, { id: version.id })}>
            Approve
          </button>
        )}
        {version.status === 'approved' && (
          <button type="button" className="btn-primary" disabled={busy} onClick={() => void run(actions.publish, { id: version.id })}>
            Publish
          </button>
        )}
        <button type="button" className="btn-secondary" disabled={busy} aria-expanded={returning} onClick={() => setReturning((v) => !v)}>
          Send back with comments
        </button>
      </div>
      {returning && (
        <form
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            void run(actions.returnVersion, {
              id: version.id,
              comments: comments.filter((c) => c.text.trim()).map((c) => ({ ...(c.stepId ? { stepId: c.stepId } : {}), text: c.text })),
            });
          }}
        >
          {comments.map((c, i) => (
            <div key={i} className="grid gap-2 md:grid-cols-[14rem_1fr]">
              <select
                aria-label={`Step of comment ${i + 1}`}
                className="input"
                value={c.stepId}
                onChange={(e) => setComments((cs) => cs.map((x, j) => (j === i ? { ...x, stepId: e.target.value } : x)))}
              >
                <option value="">The whole tree</option>
                {stepIds.map((id) => (
                  <option key={id}>{id}</option>
                ))}
              </select>
              <textarea
                aria-label={`Comment ${i + 1}`}
                className="input py-2"
                rows={2}
                value={c.text}
                onChange={(e) => setComments((cs) => cs.map((x, j) => (j === i ? { ...x, text: e.target.value } : x)))}
              />
            </div>
          ))}
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-secondary" onClick={() => setComments((cs) => [...cs, { stepId: '', text: '' }])}>
              Add a comment
            </button>
            <button type="submit" className="btn-primary" disabled={busy || comments.every((c) => !c.text.trim())}>
              Send back to the author
            </button>
          </div>
        </form>
      )}
    </section>
  );
}
