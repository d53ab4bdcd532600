'use client';

// The tree on a canvas: one node per step laid out top-down by dagre, one edge per connected slot.
// Drag from a slot's handle to a step to connect it (or tap the handle, then the step, on a tablet);
// drag an edge's end to another step to reconnect it; select and press Delete to remove.
import '@xyflow/react/dist/style.css';
import clsx from 'clsx';
import { memo, useEffect, useMemo } from 'react';
import {
  Background,
  Controls,
  Handle,
  Position,
  ReactFlow,
  ReactFlowProvider,
  type Connection,
  type Edge,
  type Node,
  type NodeProps,
  useReactFlow,
} from '@xyflow/react';
import { layoutGraph, NODE_HEIGHT, NODE_WIDTH, slotsOf, type Slot } from '@/components/trees/editor/graph-edit';
import type { StepKind, TreeGraph } from '@/lib/trees/schema';

/** How a step is marked on the canvas by a diff. */
export type StepMark = 'added' | 'changed' | 'removed';

interface StepNodeData extends Record<string, unknown> {
  title: string;
  stepId: string;
  kind: StepKind;
  start: boolean;
  problems: number;
  selected: boolean;
  mark?: StepMark;
  slots: Slot[];
}

type StepNode = Node<StepNodeData, 'step'>;

const KIND_LABEL: Record<StepKind, string> = {
  measure: 'Measure',
  inspect: 'Inspect',
  action: 'Action',
  fact: 'Unit record',
  finding: 'Finding',
};

const MARK_LABEL: Record<StepMark, string> = { added: 'Added', changed: 'Changed', removed: 'Removed' };

const StepNodeView = memo(function StepNodeView({ data }: NodeProps<StepNode>) {
  const slots = data.slots;
  return (
    <div
      data-step-id={data.stepId}
      className={clsx(
        'flex h-full flex-col rounded-lg border-2 bg-raised px-3 py-2 text-left text-ink shadow-sm',
        data.selected ? 'border-copper' : data.problems > 0 ? 'border-dashed border-ink' : 'border-line',
        data.mark === 'added' && 'bg-copper-soft',
        data.mark === 'removed' && 'opacity-60',
      )}
      style={{ width: NODE_WIDTH, height: NODE_HEIGHT }}
    >
      <Handle type="target" position={Position.Top} className="!h-3 !w-6 !rounded !bg-graphite-500" />
      <div className="flex items-center gap-2 text-xs font-semibold uppercase tracking-wide text-muted">
        <span>{KIND_LABEL[data.kind]}</span>
        {data.start && <span className="rounded bg-sunken px-1 text-ink">Start</span>}
        {data.mark && <span className="rounded bg-ink px-1 text-surface">{MARK_LABEL[data.mark]}</span>}
        {data.problems > 0 && (
          <span className="ml-auto font-bold text-ink" title={`${data.problems} problem${data.problems === 1 ? '' : 's'}`}>
            <span aria-hidden>⚠</span> {data.problems}
          </span>
        )}
      </div>
      <div className="line-clamp-2 text-sm font-semibold leading-snug">{data.title || <em className="text-muted">Untitled</em>}</div>
      <div className="truncate font-mono text-xs text-muted">{data.stepId}</div>
      {slots.map((slot, i) => (
        <Handle
          key={slot.id}
          id={slot.id}
          type="source"
          position={Position.Bottom}
          title={slot.label}
          className={clsx('!h-4 !w-4 !border-2 !border-raised', slot.target ? '!bg-copper' : '!bg-graphite-300')}
          style={{ left: `${((i + 1) / (slots.length + 1)) * 100}%` }}
        />
      ))}
    </div>
  );
});

const nodeTypes = { step: StepNodeView };

export interface TreeCanvasProps {
  graph: TreeGraph;
  selectedId?: string | null;
  problemCounts?: Map<string, number>;
  marks?: Map<string, StepMark>;
  /** Edges (from → to) a diff marks as rewired. */
  markedEdges?: Set<string>;
  readOnly?: boolean;
  /** Brings a step into view (a new n each time). */
  focus?: { id: string; n: number } | null;
  onSelect?: (stepId: string | null) => void;
  onConnectSlot?: (stepId: string, slotId: string, target: string) => void;
  onDeleteSteps?: (stepIds: string[]) => void;
  onDisconnect?: (stepId: string, slotId: string) => void;
}

function CanvasInner({
  graph,
  selectedId,
  problemCounts,
  marks,
  markedEdges,
  readOnly,
  focus,
  onSelect,
  onConnectSlot,
  onDeleteSteps,
  onDisconnect,
}: TreeCanvasProps) {
  const positions = useMemo(() => layoutGraph(graph), [graph]);
  const flow = useReactFlow();
  useEffect(() => {
    if (!focus) return;
    const at = positions.get(focus.id);
    if (at) void flow.setCenter(at.x + NODE_WIDTH / 2, at.y + NODE_HEIGHT / 2, { zoom: 1, duration: 300 });
  }, [focus, flow, positions]);
  const nodes = useMemo<StepNode[]>(
    () =>
      graph.steps.map((step) => ({
        id: step.id,
        type: 'step',
        position: positions.get(step.id) ?? { x: 0, y: 0 },
        selected: step.id === selectedId,
        deletable: !readOnly,
        data: {
          title: step.title,
          stepId: step.id,
          kind: step.kind,
          start: graph.start === step.id,
          problems: problemCounts?.get(step.id) ?? 0,
          selected: step.id === selectedId,
          mark: marks?.get(step.id),
          slots: slotsOf(step),
        },
      })),
    [graph, positions, selectedId, problemCounts, marks, readOnly],
  );
  const edges = useMemo<Edge[]>(() => {
    const ids = new Set(graph.steps.map((s) => s.id));
    return graph.steps.flatMap((step) =>
      slotsOf(step)
        .filter((slot) => slot.target && ids.has(slot.target))
        .map((slot) => {
          const marked = markedEdges?.has(`${step.id}->${slot.target}`);
          return {
            id: `${step.id}|${slot.id}`,
            source: step.id,
            sourceHandle: slot.id,
            target: slot.target,
            label: slot.label,
            reconnectable: !readOnly,
            deletable: !readOnly,
            style: marked ? { strokeWidth: 4, strokeDasharray: '6 4' } : { strokeWidth: 2 },
            labelStyle: { fontSize: 11 },
          };
        }),
    );
  }, [graph, markedEdges, readOnly]);

  const connect = (c: Connection) => {
    if (c.source && c.sourceHandle && c.target) onConnectSlot?.(c.source, c.sourceHandle, c.target);
  };

  return (
    <ReactFlow
      nodes={nodes}
      edges={edges}
      nodeTypes={nodeTypes}
      nodesDraggable={false}
      nodesConnectable={!readOnly}
      edgesReconnectable={!readOnly}
      connectOnClick={!readOnly}
      fitView
      minZoom={0.1}
      deleteKeyCode={readOnly ? null : ['Delete', 'Backspace']}
      onNodeClick={(_, node) => onSelect?.(node.id)}
      onPaneClick={() => onSelect?.(null)}
      onConnect={readOnly ? undefined : connect}
      onReconnect={
        readOnly ? undefined : (old, c) => c.target && old.sourceHandle && onConnectSlot?.(old.source, old.sourceHandle, c.target)
      }
      onNodesDelete={readOnly ? undefined : (deleted) => onDeleteSteps?.(deleted.map((n) => n.id))}
      onEdgesDelete={readOnly ? undefined : (deleted) => deleted.forEach((e) => e.sourceHandle && onDisconnect?.(e.source, e.sourceHandle))}
      proOptions={{ hideAttribution: false }}
    >
      <Background gap={24} />
      <Controls showInteractive={false} />
    </ReactFlow>
  );
}

export function TreeCanvas(props: TreeCanvasProps) {
  return (
    <ReactFlowProvider>
      <CanvasInner {...props} />
    </ReactFlowProvider>
  );
}
