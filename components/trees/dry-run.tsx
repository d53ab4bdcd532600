'use client';

// A dry run of a version: the real wizard walking the graph in the browser, with no service call
// and nothing stored. The wizard's save, undo and escalation are answered here: a reading is parsed
// and judged against its bands as the server does (lib/units, lib/bands), a choice or confirmation
// is echoed back, and an undo takes the last answer off the walk kept in memory, as the server takes
// it off a diagnosis. The unit record the walk branches on is chosen first.
import { useMemo, useState } from 'react';
import { z } from 'zod';
import { Wizard, type WizardActions } from '@/components/wizard/wizard';
import { readAnswer } from '@/lib/answers';
import { AppError } from '@/lib/errors';
import { UNIT_FACTS, type Step, type TreeGraph, type TreeVersion, type UnitFact, type UnitFacts } from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';
import type { ActionResult, AnswerResult, ApiAnswer, DiagnosisViewOut } from '@/lib/validations/api';
import { answerSchema, type AnswerInput } from '@/lib/validations/field';
import { getStep, INITIAL_ENERGY, isAfterFinding, replayAnswers, type DiagnosisAnswer } from '@/machines/diagnosis-machine';

// The same inputs the server's save and undo take (the wizard sends these shapes to either).
const saveInputSchema = z.object({ diagnosisId: z.string(), answer: answerSchema });
const undoInputSchema = z.object({ diagnosisId: z.string(), last: z.string().optional() });

const refuse = <T,>(message: string, code: 'bad_request' | 'conflict' = 'bad_request'): ActionResult<T> => ({
  ok: false,
  code,
  message,
});

function nextOf(step: Step, answer: AnswerInput, outcome?: string): string | undefined {
  if (outcome) return outcome;
  if (step.kind === 'inspect') return step.choices.find((c) => c.value === answer.choice)?.outcome;
  if (step.kind === 'action') return step.outcome;
  return undefined;
}

/** An answer of the walk as the diagnosis machine replays it. */
function replayable(a: ApiAnswer): DiagnosisAnswer {
  if (a.kind === 'measure') return a.overRange ? { stepId: a.stepId, overRange: true } : { stepId: a.stepId, value: a.value ?? Number.NaN };
  if (a.kind === 'inspect') return { stepId: a.stepId, choice: a.choice ?? '' };
  return { stepId: a.stepId, confirmed: true };
}

/** The readings of a walk by step, the latest of each, for bands relative to an earlier reading. */
function readingsOf(path: readonly ApiAnswer[]): Record<string, number> {
  const readings: Record<string, number> = {};
  for (const a of path) if (a.kind === 'measure' && typeof a.value === 'number' && Number.isFinite(a.value)) readings[a.stepId] = a.value;
  return readings;
}

/** The wizard's actions for a walk nobody stores. */
export function dryRunActions(version: TreeVersion, { title = '', unit }: { title?: string; unit?: UnitFacts } = {}): WizardActions {
  let seq = 0;
  /** The answers taken so far, in order: what an undo takes the last of. */
  const path: ApiAnswer[] = [];
  return {
    submitAnswer: async (raw) => {
      const input = saveInputSchema.safeParse(raw);
      if (!input.success) return refuse(input.error.issues[0]?.message ?? 'The answer is not one the wizard sends.');
      const { answer } = input.data;
      const step = getStep(version, answer.stepId);
      if (!step) return refuse(`There is no step "${answer.stepId}" in this version.`);
      const base: ApiAnswer = {
        id: answer.clientId,
        clientId: answer.clientId,
        seq: ++seq,
        stepId: step.id,
        stepTitle: step.title,
        kind: step.kind,
        text: null,
        value: null,
        unit: null,
        quantity: null,
        band: null,
        bandIndex: null,
        verdict: null,
        choice: null,
        choiceLabel: null,
        confirmed: null,
        overRange: false,
        auto: false,
        at: new Date().toISOString(),
      } as ApiAnswer;
      let read;
      try {
        read = readAnswer(step, answer, readingsOf(path));
      } catch (e) {
        if (e instanceof AppError) return refuse(e.message);
        throw e;
      }
      const { bandLabel, ...fields } = read.fields;
      Object.assign(base, { ...fields, band: bandLabel });
      const verdict: AnswerResult['verdict'] = read.verdict;
      const outcome = read.verdict?.outcome;
      const next = nextOf(step, answer, outcome);
      const found =
        step.kind === 'finding' || isAfterFinding(version, step.id) || (next !== undefined && getStep(version, next)?.kind === 'finding');
      // The wizard may send an answer again after a lost reply: the walk keeps it once.
      if (!path.some((a) => a.clientId === base.clientId)) path.push(base);
      return {
        ok: true,
        data: {
          answer: base,
          next: null,
          finding: null,
          verdict,
          diagnosis: { status: found ? 'found' : 'in_progress', energy: 'energized', gas: 'on', phase: 'walk', contradictions: [] },
          auto: [],
        },
      };
    },
    undoAnswer: async (raw) => {
      const input = undoInputSchema.safeParse(raw);
      if (!input.success) return refuse('Say which dry run to undo in.');
      const last = path.at(-1);
      if (!last) return refuse('There is no answer to undo.', 'conflict');
      // Named, so a second undo sent at the same time is refused instead of undoing one more.
      if (input.data.last && input.data.last !== last.clientId) return refuse('That answer is no longer the last one.', 'conflict');
      path.pop();
      return { ok: true, data: viewOf(version, title, path, unit) };
    },
    escalate: async () => refuse('A dry run cannot be escalated: nothing is stored.'),
  };
}

/** The diagnosis view of a walk: the answers so far and the finding they reached, if any. */
export function viewOf(version: TreeVersion, title: string, path: readonly ApiAnswer[], unit?: UnitFacts): DiagnosisViewOut {
  const replay = replayAnswers(version, path.map(replayable), { unit });
  const reached = replay.snapshot.context.findingId ? getStep(version, replay.snapshot.context.findingId) : undefined;
  let finding: DiagnosisViewOut['finding'] = null;
  if (reached?.kind === 'finding') {
    const { expects: _expects, ...shown } = reached;
    finding = shown;
  }
  return { ...emptyView(version, title), status: finding ? 'found' : 'in_progress', path: [...path], finding };
}

function emptyView(version: TreeVersion, title: string): DiagnosisViewOut {
  return {
    id: `dry-run-${version.id}`,
    callId: 'dry-run',
    status: 'in_progress',
    treeVersionId: version.id,
    tree: { title, version: version.version },
    startedBy: { id: null, name: null, role: null },
    signedOff: null,
    energy: INITIAL_ENERGY.electric === 'on' ? 'energized' : 'locked-out',
    gas: INITIAL_ENERGY.gas,
    phase: 'walk',
    escalation: null,
    path: [],
    current: null,
    finding: null,
    contradictions: [],
    callStatus: 'diagnosing',
  } as unknown as DiagnosisViewOut;
}

const FACT_LABEL: Record<UnitFact, string> = { ignition: 'Ignition', fuel: 'Fuel', controlSupply: 'Control supply', draft: 'Draft' };

export function DryRun({
  versionId,
  version: number,
  title,
  graph,
}: {
  versionId: string;
  version: number;
  title: string;
  graph: unknown;
}) {
  const checked = useMemo(() => validateGraph(graph), [graph]);
  const [unit, setUnit] = useState<UnitFacts>({ ignition: 'two-rod', fuel: 'natural-gas', controlSupply: '24v', draft: 'induced' });
  const [run, setRun] = useState(0);
  const tree = useMemo<TreeVersion | null>(
    () => (checked.ok ? { id: versionId, version: number, graph: checked.graph as TreeGraph } : null),
    [checked, versionId, number],
  );
  // A fresh walk (its readings and sequence) for each run.
  const actions = useMemo(() => (tree ? dryRunActions(tree, { title, unit }) : null), [tree, title, unit, run]); // eslint-disable-line react-hooks/exhaustive-deps

  if (!checked.ok || !tree || !actions) {
    return (
      <div className="card space-y-2">
        <p className="font-semibold">
          <span aria-hidden>⚠</span> This version has problems, so it cannot be walked yet:
        </p>
        <ul className="list-disc pl-5">
          {(checked.ok ? [] : checked.problems).slice(0, 12).map((p, i) => (
            <li key={i}>{p.message}</li>
          ))}
        </ul>
      </div>
    );
  }
  return (
    <div className="space-y-4">
      <form className="card flex flex-wrap items-end gap-3" onSubmit={(e) => e.preventDefault()} aria-label="The unit for the dry run">
        {(Object.keys(UNIT_FACTS) as UnitFact[]).map((fact) => (
          <div key={fact}>
            <label className="label" htmlFor={`dry-${fact}`}>
              {FACT_LABEL[fact]}
            </label>
            <select
              id={`dry-${fact}`}
              className="input"
              value={unit[fact]}
              onChange={(e) => {
                setUnit((u) => ({ ...u, [fact]: e.target.value }) as UnitFacts);
                setRun((r) => r + 1);
              }}
            >
              {UNIT_FACTS[fact].map((v) => (
                <option key={v}>{v}</option>
              ))}
            </select>
          </div>
        ))}
        <button type="button" className="btn-secondary" onClick={() => setRun((r) => r + 1)}>
          Start again
        </button>
      </form>
      <Wizard
        key={run}
        actions={actions}
        diagnosisId={`dry-run-${versionId}-${run}`}
        callId="dry-run"
        version={tree}
        initialView={emptyView(tree, title)}
        displayUnits="us"
        transformerVa={null}
        unit={unit}
      />
    </div>
  );
}
