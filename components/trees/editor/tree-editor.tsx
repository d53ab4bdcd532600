'use client';

// The tree editor: the canvas, the step panel, the live problem list and a local copy of unsaved
// changes (localStorage, keyed by version and revision) so a reload or a dropped connection loses
// nothing. Saving is the page's business: it gets every change through onGraphChange.
import clsx from 'clsx';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { addStep, deleteStep, editorProblems, newStep, renameStep, setSlotTarget } from '@/components/trees/editor/graph-edit';
import { TreeCanvas, type StepMark } from '@/components/trees/editor/tree-canvas';
import { StepPanel } from '@/components/trees/editor/step-panel';
import type { Step, StepKind, TreeGraph } from '@/lib/trees/schema';
import type { GraphProblem } from '@/lib/trees/validate';

export function localDraftKey(versionId: string, revision: number): string {
  return `proving-ground:tree-draft:${versionId}:${revision}`;
}

/** The unsaved graph kept on this device for a version at a revision, if any. */
export function readLocalDraft(versionId: string, revision: number): TreeGraph | null {
  try {
    const raw = window.localStorage.getItem(localDraftKey(versionId, revision));
    return raw ? (JSON.parse(raw) as TreeGraph) : null;
  } catch {
    return null;
  }
}

export function clearLocalDraft(versionId: string, revision: number) {
  try {
    window.localStorage.removeItem(localDraftKey(versionId, revision));
  } catch {
    // Storage unavailable (private mode): nothing was kept.
  }
}

const ADDABLE: { kind: StepKind; label: string }[] = [
  { kind: 'measure', label: 'Measure' },
  { kind: 'inspect', label: 'Inspect' },
  { kind: 'action', label: 'Action' },
  { kind: 'fact', label: 'Unit record' },
  { kind: 'finding', label: 'Finding' },
];

export interface TreeEditorProps {
  versionId: string;
  /** The revision the page last loaded or saved. */
  revision: number;
  /** The graph as saved at that revision. */
  savedGraph: TreeGraph;
  /** A graph to start from instead (a merge the lead chose); otherwise the local copy or the saved graph. */
  initialGraph?: TreeGraph;
  readOnly?: boolean;
  onGraphChange?: (graph: TreeGraph, problems: GraphProblem[]) => void;
  /** The page's buttons (save state, submit, dry run), shown in the toolbar. */
  toolbar?: ReactNode;
  marks?: Map<string, StepMark>;
  /** A step to open in the panel and centre on at first (a link from the isolation check or a problem elsewhere). */
  initialStepId?: string;
}

export function TreeEditor({
  versionId,
  revision,
  savedGraph,
  initialGraph,
  readOnly,
  onGraphChange,
  toolbar,
  marks,
  initialStepId,
}: TreeEditorProps) {
  // Unsaved changes kept on this device for this revision come back at once. The editor renders on
  // the client only (the pages load it without server rendering), so reading storage here is safe.
  const [start] = useState(() => {
    if (initialGraph || readOnly || typeof window === 'undefined') return { graph: initialGraph ?? savedGraph, restored: false };
    const local = readLocalDraft(versionId, revision);
    return local && JSON.stringify(local) !== JSON.stringify(savedGraph)
      ? { graph: local, restored: true }
      : { graph: savedGraph, restored: false };
  });
  const [graph, setGraph] = useState<TreeGraph>(start.graph);
  const [restored, setRestored] = useState(start.restored);
  const opened = initialStepId && start.graph.steps.some((s) => s.id === initialStepId) ? initialStepId : null;
  const [selectedId, setSelectedId] = useState<string | null>(opened);
  const [focus, setFocus] = useState<{ id: string; n: number } | null>(opened ? { id: opened, n: 1 } : null);
  const [showProblems, setShowProblems] = useState(true);

  const problems = useMemo(() => editorProblems(graph), [graph]);
  const problemCounts = useMemo(() => {
    const m = new Map<string, number>();
    for (const p of problems) if (p.stepId) m.set(p.stepId, (m.get(p.stepId) ?? 0) + 1);
    return m;
  }, [problems]);

  // Keep the local copy in step with the graph; drop copies of older revisions.
  const previousRevision = useRef(revision);
  useEffect(() => {
    if (readOnly) return;
    if (previousRevision.current !== revision) {
      clearLocalDraft(versionId, previousRevision.current);
      previousRevision.current = revision;
    }
    try {
      if (JSON.stringify(graph) === JSON.stringify(savedGraph)) window.localStorage.removeItem(localDraftKey(versionId, revision));
      else window.localStorage.setItem(localDraftKey(versionId, revision), JSON.stringify(graph));
    } catch {
      // Storage full or unavailable: the autosave still runs.
    }
  }, [graph, savedGraph, versionId, revision, readOnly]);

  const onChangeRef = useRef(onGraphChange);
  useEffect(() => {
    onChangeRef.current = onGraphChange;
  });
  const firstReport = useRef(true);
  useEffect(() => {
    if (firstReport.current) {
      firstReport.current = false;
      if (JSON.stringify(graph) === JSON.stringify(savedGraph)) return;
    }
    onChangeRef.current?.(graph, problems);
  }, [graph, problems, savedGraph]);

  const update = useCallback((fn: (g: TreeGraph) => TreeGraph) => setGraph((g) => fn(g)), []);

  const selected = graph.steps.find((s) => s.id === selectedId) ?? null;
  const others = useMemo(
    () => graph.steps.filter((s) => s.id !== selectedId).map((s) => ({ id: s.id, title: s.title })),
    [graph.steps, selectedId],
  );

  const onStepChange = useCallback(
    (step: Step) => {
      if (!selectedId) return;
      update((g) => ({ ...g, steps: g.steps.map((s) => (s.id === selectedId ? { ...step, id: selectedId } : s)) }));
    },
    [selectedId, update],
  );

  const select = (id: string | null, center = false) => {
    setSelectedId(id);
    if (id && center) setFocus((f) => ({ id, n: (f?.n ?? 0) + 1 }));
  };

  const add = (kind: StepKind) => {
    const step = newStep(graph, kind);
    update((g) => addStep(g, step));
    select(step.id, true);
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-2" role="toolbar" aria-label="Editor">
        {!readOnly && (
          <>
            <span className="text-sm font-semibold text-muted">Add a step:</span>
            {ADDABLE.map((a) => (
              <button key={a.kind} type="button" className="btn-secondary px-3" onClick={() => add(a.kind)}>
                + {a.label}
              </button>
            ))}
          </>
        )}
        <select
          aria-label="Go to a step"
          className="input w-auto max-w-[16rem]"
          value=""
          onChange={(e) => e.target.value && select(e.target.value, true)}
        >
          <option value="">Go to a step…</option>
          {graph.steps.map((s) => (
            <option key={s.id} value={s.id}>
              {s.id}
            </option>
          ))}
        </select>
        <div className="ml-auto flex flex-wrap items-center gap-2">{toolbar}</div>
      </div>

      {restored && (
        <div role="status" className="flex flex-wrap items-center gap-3 rounded-lg border border-copper bg-copper-soft px-4 py-2">
          <span>Unsaved changes from this device were restored.</span>
          <button
            type="button"
            className="btn-quiet"
            onClick={() => {
              clearLocalDraft(versionId, revision);
              setGraph(savedGraph);
              setRestored(false);
            }}
          >
            Discard them
          </button>
        </div>
      )}

      <section aria-label="Problems" className="rounded-lg border border-line bg-raised">
        <button
          type="button"
          className="flex min-h-touch w-full items-center gap-2 px-4 text-left font-semibold"
          aria-expanded={showProblems}
          onClick={() => setShowProblems((v) => !v)}
        >
          {problems.length === 0 ? (
            <span>{readOnly ? 'No problems in this version.' : 'No problems: this draft can be submitted for review.'}</span>
          ) : (
            <span>
              <span aria-hidden>⚠</span> {problems.length} problem{problems.length === 1 ? '' : 's'}: the draft saves, but cannot be
              submitted until they are fixed
            </span>
          )}
          <span className="ml-auto text-sm text-muted">{showProblems ? 'Hide' : 'Show'}</span>
        </button>
        {showProblems && problems.length > 0 && (
          <ul className="max-h-48 overflow-y-auto border-t border-line" data-testid="problems">
            {problems.map((p, i) => (
              <li key={i}>
                <button
                  type="button"
                  disabled={!p.stepId || !graph.steps.some((s) => s.id === p.stepId)}
                  className="min-h-touch w-full px-4 py-2 text-left text-sm hover:bg-sunken disabled:cursor-default"
                  onClick={() => p.stepId && select(p.stepId, true)}
                >
                  {p.message}
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>

      <div className="grid gap-3 lg:grid-cols-[minmax(0,1fr)_26rem]">
        <div
          className={clsx('h-[60vh] min-h-[24rem] overflow-hidden rounded-lg border border-line bg-sunken lg:h-[70vh]')}
          data-testid="canvas"
        >
          <TreeCanvas
            graph={graph}
            selectedId={selectedId}
            problemCounts={problemCounts}
            marks={marks}
            readOnly={readOnly}
            focus={focus}
            onSelect={(id) => select(id)}
            onConnectSlot={(stepId, slotId, target) => update((g) => setSlotTarget(g, stepId, slotId, target))}
            onDisconnect={(stepId, slotId) => update((g) => setSlotTarget(g, stepId, slotId, ''))}
            onDeleteSteps={(ids) => {
              update((g) => ids.reduce(deleteStep, g));
              if (selectedId && ids.includes(selectedId)) setSelectedId(null);
            }}
          />
        </div>
        <aside aria-label="Selected step" className="rounded-lg border border-line bg-raised p-4 lg:h-[70vh] lg:overflow-y-auto">
          {selected ? (
            <StepPanel
              key={`${selected.id}:${selected.kind}`}
              step={selected}
              others={others}
              isStart={graph.start === selected.id}
              readOnly={readOnly}
              onChange={onStepChange}
              onRename={(from, to) => {
                if (graph.steps.some((s) => s.id === to)) return `Another step already has the id "${to}"`;
                update((g) => renameStep(g, from, to));
                setSelectedId(to);
                return null;
              }}
              onChangeKind={(kind) => {
                const fresh = newStep(graph, kind);
                const { id, title, instruction, cautions, why, energy, handles } = selected;
                const next = { ...fresh, id, title, instruction, cautions, why, energy, handles } as Step;
                update((g) => ({ ...g, steps: g.steps.map((s) => (s.id === id ? next : s)) }));
              }}
              onDelete={() => {
                update((g) => deleteStep(g, selected.id));
                setSelectedId(null);
              }}
              onMakeStart={() => update((g) => ({ ...g, start: selected.id }))}
              onClose={() => setSelectedId(null)}
            />
          ) : (
            <div className="space-y-2 text-sm text-muted">
              <p className="font-semibold text-ink">No step selected.</p>
              <p>Tap a step on the canvas, or a problem above, to edit it here.</p>
              {!readOnly && (
                <p>
                  To connect: drag from a dot under a step to another step, or tap the dot and then the step; or choose where it leads in
                  this panel. Select a step or a connection and press Delete to remove it.
                </p>
              )}
            </div>
          )}
        </aside>
      </div>
    </div>
  );
}
