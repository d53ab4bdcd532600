'use client';

// A version read-only: the canvas, its problems, and any step opened in the panel with its fields disabled.
import dynamic from 'next/dynamic';
import { useMemo } from 'react';
import { editableGraph } from '@/components/trees/editor/graph-edit';
import type { StepMark } from '@/components/trees/editor/tree-canvas';
import type { AuthoringVersionOut } from '@/lib/validations/api';

const TreeEditor = dynamic(() => import('@/components/trees/editor/tree-editor').then((m) => m.TreeEditor), {
  ssr: false,
  loading: () => <p className="card text-muted">Loading the tree…</p>,
});

export function VersionView({
  version,
  marks,
  initialStepId,
}: {
  version: Pick<AuthoringVersionOut, 'id' | 'revision' | 'graph'>;
  marks?: [string, StepMark][];
  initialStepId?: string;
}) {
  const graph = useMemo(() => editableGraph(version.graph), [version.graph]);
  const markMap = useMemo(() => (marks ? new Map(marks) : undefined), [marks]);
  return (
    <TreeEditor
      versionId={version.id}
      revision={version.revision}
      savedGraph={graph}
      readOnly
      marks={markMap}
      initialStepId={initialStepId}
    />
  );
}
