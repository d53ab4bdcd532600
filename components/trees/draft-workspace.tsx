'use client';

// A draft being edited: the editor, saved automatically a moment after each change with the
// revision it was based on. A stale save (someone else saved first) opens the conflict view with
// both versions; nothing is overwritten unseen. A draft with problems saves but cannot be submitted.
import dynamic from 'next/dynamic';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useCallback, useEffect, useRef, useState } from 'react';
import { ConflictView } from '@/components/trees/conflict-view';
import { editableGraph } from '@/components/trees/editor/graph-edit';
import type { TreeGraph } from '@/lib/trees/schema';
import type { GraphProblem } from '@/lib/trees/validate';
import type { ActionResult, AuthoringVersionOut, SaveDraftResultOut, VersionTransitionOut } from '@/lib/validations/api';

// The canvas measures the page and the editor reads the device's unsaved copy: client only.
const TreeEditor = dynamic(() => import('@/components/trees/editor/tree-editor').then((m) => m.TreeEditor), {
  ssr: false,
  loading: () => <p className="card text-muted">Loading the editor…</p>,
});

export interface DraftActions {
  saveDraft: (input: unknown) => Promise<ActionResult<SaveDraftResultOut>>;
  submitDraft: (input: unknown) => Promise<ActionResult<VersionTransitionOut>>;
}

type SaveState =
  | { kind: 'saved'; at: string | null }
  | { kind: 'waiting' }
  | { kind: 'saving' }
  | { kind: 'error'; message: string }
  | { kind: 'conflict'; mine: TreeGraph; theirs: TreeGraph; revision: number; by: string | null };

const AUTOSAVE_MS = 1200;

export function DraftWorkspace({
  version,
  actions,
  initialStepId,
}: {
  version: AuthoringVersionOut;
  actions: DraftActions;
  /** A step to open at first (?step= on the page's address). */
  initialStepId?: string;
}) {
  const router = useRouter();
  const [revision, setRevision] = useState(version.revision);
  const [savedGraph, setSavedGraph] = useState<TreeGraph>(() => editableGraph(version.graph));
  const [start, setStart] = useState<{ key: number; graph?: TreeGraph }>({ key: 0 });
  const [state, setState] = useState<SaveState>({ kind: 'saved', at: version.updatedAt });
  const [problems, setProblems] = useState<GraphProblem[]>(version.problems);
  const [submitError, setSubmitError] = useState<string | null>(null);
  const [submitting, setSubmitting] = useState(false);

  const latest = useRef<TreeGraph | null>(null);
  const lastSaved = useRef(JSON.stringify(savedGraph));
  const revisionRef = useRef(version.revision);
  const inFlight = useRef(false);
  const timer = useRef<number | null>(null);
  const saveRef = useRef<() => Promise<void>>(async () => {});

  const save = useCallback(async () => {
    const graph = latest.current;
    if (!graph || inFlight.current) return;
    const body = JSON.stringify(graph);
    if (body === lastSaved.current) {
      setState((s) => (s.kind === 'conflict' ? s : { kind: 'saved', at: null }));
      return;
    }
    inFlight.current = true;
    setState({ kind: 'saving' });
    let result: ActionResult<SaveDraftResultOut>;
    try {
      result = await actions.saveDraft({ id: version.id, baseRevision: revisionRef.current, graph });
    } catch {
      result = {
        ok: false,
        code: 'internal',
        message: 'The server could not be reached. Your changes are kept on this device.',
      } as ActionResult<SaveDraftResultOut>;
    }
    inFlight.current = false;
    if (!result.ok) {
      setState({ kind: 'error', message: result.message });
      return;
    }
    const data = result.data;
    if (data.outcome === 'stale') {
      setState({
        kind: 'conflict',
        mine: graph,
        theirs: editableGraph(data.current.graph),
        revision: data.current.revision,
        by: data.current.updatedBy?.name ?? null,
      });
      return;
    }
    lastSaved.current = body;
    revisionRef.current = data.revision;
    setRevision(data.revision);
    setSavedGraph(graph);
    setState({ kind: 'saved', at: data.updatedAt });
    if (latest.current && JSON.stringify(latest.current) !== body)
      timer.current = window.setTimeout(() => void saveRef.current(), AUTOSAVE_MS);
  }, [actions, version.id]);

  useEffect(() => {
    saveRef.current = save;
  }, [save]);

  const onGraphChange = useCallback(
    (graph: TreeGraph, found: GraphProblem[]) => {
      latest.current = graph;
      setProblems(found);
      if (JSON.stringify(graph) === lastSaved.current) return;
      setState((s) => (s.kind === 'conflict' ? s : { kind: 'waiting' }));
      if (timer.current) window.clearTimeout(timer.current);
      timer.current = window.setTimeout(() => void save(), AUTOSAVE_MS);
    },
    [save],
  );

  useEffect(() => () => void (timer.current && window.clearTimeout(timer.current)), []);

  // Leaving with a save outstanding: the browser asks first (the device copy survives anyway).
  const unsaved = state.kind === 'waiting' || state.kind === 'saving' || state.kind === 'error' || state.kind === 'conflict';
  useEffect(() => {
    if (!unsaved) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [unsaved]);

  const resolve = (graph: TreeGraph) => {
    if (state.kind !== 'conflict') return;
    revisionRef.current = state.revision;
    lastSaved.current = JSON.stringify(state.theirs);
    setRevision(state.revision);
    setSavedGraph(state.theirs);
    setStart((s) => ({ key: s.key + 1, graph }));
    latest.current = graph;
    setState({ kind: 'saved', at: null });
    if (JSON.stringify(graph) !== lastSaved.current) {
      setState({ kind: 'waiting' });
      timer.current = window.setTimeout(() => void save(), 0);
    }
  };

  const submit = async () => {
    setSubmitError(null);
    setSubmitting(true);
    const result = await actions.submitDraft({ id: version.id, revision: revisionRef.current });
    setSubmitting(false);
    if (!result.ok) {
      setSubmitError(result.message);
      return;
    }
    router.push(`/trees/${version.treeId}?submitted=${version.id}`);
    router.refresh();
  };

  const status = (() => {
    switch (state.kind) {
      case 'saved':
        return `Saved · revision ${revision}`;
      case 'waiting':
        return 'Changes not saved yet…';
      case 'saving':
        return 'Saving…';
      case 'error':
        return `Not saved: ${state.message}`;
      case 'conflict':
        return 'Not saved: someone else saved first';
    }
  })();

  const canSubmit = state.kind === 'saved' && problems.length === 0 && !submitting;

  return (
    <div className="space-y-3">
      {state.kind === 'conflict' && (
        <ConflictView mine={state.mine} theirs={state.theirs} theirRevision={state.revision} theirAuthor={state.by} onResolve={resolve} />
      )}
      <TreeEditor
        key={start.key}
        versionId={version.id}
        revision={revision}
        savedGraph={savedGraph}
        initialGraph={start.graph}
        initialStepId={start.key === 0 ? initialStepId : undefined}
        onGraphChange={onGraphChange}
        toolbar={
          <>
            <span role="status" aria-live="polite" className="text-sm font-semibold" data-testid="save-status">
              {status}
            </span>
            {state.kind === 'error' && (
              <button type="button" className="btn-secondary" onClick={() => void save()}>
                Try again
              </button>
            )}
            <Link className="btn-secondary" href={`/trees/versions/${version.id}/dry-run`}>
              Dry run
            </Link>
            <Link
              className="btn-secondary"
              href={`/trees/versions/${version.id}/isolation`}
              title="Every fault of the bench's library through this draft as last saved"
            >
              Isolation check
            </Link>
            <button
              type="button"
              className="btn-primary"
              disabled={!canSubmit}
              title={problems.length > 0 ? 'Fix the problems listed first' : undefined}
              onClick={() => void submit()}
            >
              {submitting ? 'Submitting…' : 'Submit for review'}
            </button>
          </>
        }
      />
      {submitError && (
        <p role="alert" className="field-error">
          <span aria-hidden>⚠</span> {submitError}
        </p>
      )}
    </div>
  );
}
