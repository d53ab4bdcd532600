'use client';

// A stale save: someone else saved the draft since this editor's revision. Both versions are shown
// step by step; the lead keeps theirs, keeps their own, or picks per step. Nothing is overwritten
// until the lead chooses, and the choice is then saved on top of the other save's revision.
import { useMemo, useState } from 'react';
import { mergeGraphs, stepConflicts, type StepConflict } from '@/components/trees/editor/graph-edit';
import { fieldLabel, stepFieldTexts } from '@/lib/trees/diff';
import type { Step, TreeGraph } from '@/lib/trees/schema';

export interface ConflictViewProps {
  mine: TreeGraph;
  theirs: TreeGraph;
  theirRevision: number;
  theirAuthor: string | null;
  onResolve: (graph: TreeGraph) => void;
}

/**
 * One side of a conflicting step: its title and the fields where it differs from the other side,
 * each as a person reads it (bands as ranges with units and where they lead, choices as label →
 * target, cautions as signal word and text), the way the diff page shows them.
 */
function StepSummary({ step, other }: { step: Step | null; other: Step | null }) {
  if (!step) return <p className="text-sm italic text-muted">Not in this version (deleted)</p>;
  const mine = stepFieldTexts(step, { targets: true });
  const theirs = stepFieldTexts(other, { targets: true });
  const fields = [...new Set([...mine.keys(), ...theirs.keys()])].filter((k) => (mine.get(k) ?? '') !== (theirs.get(k) ?? ''));
  return (
    <div className="space-y-1 text-sm">
      <p className="font-semibold">{step.title || <em>Untitled</em>}</p>
      {other ? (
        <dl className="space-y-2">
          {fields.map((k) => (
            <div key={k} data-field={k}>
              <dt className="text-xs font-semibold uppercase tracking-wide text-muted">{fieldLabel(k)}</dt>
              <dd className="max-h-40 overflow-auto whitespace-pre-wrap break-words">{mine.get(k) || '—'}</dd>
            </div>
          ))}
        </dl>
      ) : (
        <p className="text-muted">A {step.kind} step only this version has.</p>
      )}
    </div>
  );
}

export function ConflictView({ mine, theirs, theirRevision, theirAuthor, onResolve }: ConflictViewProps) {
  const conflicts: StepConflict[] = useMemo(() => stepConflicts(mine, theirs), [mine, theirs]);
  const [pick, setPick] = useState<Record<string, 'mine' | 'theirs'>>(() => Object.fromEntries(conflicts.map((c) => [c.stepId, 'mine'])));
  return (
    <section aria-labelledby="conflict-title" className="card space-y-4 border-2 border-ink">
      <div>
        <h2 id="conflict-title" className="text-xl font-bold">
          <span aria-hidden>⚠</span> Someone else saved this draft while you were editing
        </h2>
        <p className="text-muted">
          {theirAuthor ?? 'Another editor'} saved revision {theirRevision}. Your changes are not lost: they are kept on this device until
          you choose.
          {conflicts.length === 0
            ? ' Both versions are the same.'
            : ` ${conflicts.length} step${conflicts.length === 1 ? ' differs' : 's differ'}.`}
        </p>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" onClick={() => onResolve(mergeGraphs(mine, theirs, pick))}>
          Save the merge below
        </button>
        <button type="button" className="btn-secondary" onClick={() => onResolve(mine)}>
          Keep all of mine
        </button>
        <button type="button" className="btn-secondary" onClick={() => onResolve(theirs)}>
          Take theirs (reload)
        </button>
      </div>
      <ul className="space-y-3">
        {conflicts.map((c) => (
          <li key={c.stepId} className="rounded-lg border border-line p-3" data-conflict={c.stepId}>
            <p className="mb-2 font-mono font-semibold">{c.stepId}</p>
            <div className="grid gap-3 md:grid-cols-2">
              {(['mine', 'theirs'] as const).map((side) => (
                <label
                  key={side}
                  className="block cursor-pointer rounded-lg border border-line p-3 has-[:checked]:border-copper has-[:checked]:bg-copper-soft"
                >
                  <span className="flex min-h-touch items-center gap-2 font-semibold">
                    <input
                      type="radio"
                      className="h-5 w-5"
                      name={`pick-${c.stepId}`}
                      checked={pick[c.stepId] === side}
                      onChange={() => setPick((p) => ({ ...p, [c.stepId]: side }))}
                    />
                    {side === 'mine' ? 'Mine' : `Theirs (revision ${theirRevision})`}
                  </span>
                  <StepSummary step={side === 'mine' ? c.mine : c.theirs} other={side === 'mine' ? c.theirs : c.mine} />
                </label>
              ))}
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}
