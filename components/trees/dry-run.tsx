'use client';

// A dry run of a version: the real wizard walking the graph in the browser, with no service call
// and nothing stored. The wizard's save, undo and escalation are answered here: a reading is parsed
// and judged against its bands as the server does (lib/units, lib/bands), a choice or confirmation
// is echoed back. The unit record the walk branches on is chosen first.
import { useMemo, useState } from 'react';
import { Wizard, type WizardActions } from '@/components/wizard/wizard';
import { evaluateReading } from '@/lib/bands';
import { UNIT_FACTS, type Step, type TreeGraph, type TreeVersion, type UnitFact, type UnitFacts } from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';
import { parseReading } from '@/lib/units';
import type { ActionResult, AnswerResult, ApiAnswer, DiagnosisViewOut } from '@/lib/validations/api';
import { getStep, INITIAL_ENERGY, isAfterFinding } from '@/machines/diagnosis-machine';

type AnswerInput = {
  diagnosisId: string;
  answer: {
    clientId: string;
    stepId: string;
    text?: string;
    unit?: string;
    overRange?: boolean;
    choice?: string;
    note?: string;
    confirmed?: boolean;
  };
};

const refuse = <T,>(message: string): ActionResult<T> => ({ ok: false, code: 'bad_request', message });

function nextOf(step: Step, answer: AnswerInput['answer'], outcome?: string): string | undefined {
  if (outcome) return outcome;
  if (step.kind === 'inspect') return step.choices.find((c) => c.value === answer.choice)?.outcome;
  if (step.kind === 'action') return step.outcome;
  return undefined;
}

/** The wizard's actions for a walk nobody stores. */
export function dryRunActions(version: TreeVersion): WizardActions {
  let seq = 0;
  const readings: Record<string, number> = {};
  return {
    submitAnswer: async (raw) => {
      const { answer } = raw as AnswerInput;
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
      let outcome: string | undefined;
      let verdict: AnswerResult['verdict'];
      if (step.kind === 'measure') {
        let value: number;
        if (answer.overRange) {
          if (step.quantity !== 'ohm') return refuse('OL (over range) is only for a resistance reading. Enter the value the meter shows.');
          value = Number.POSITIVE_INFINITY;
          Object.assign(base, { text: 'OL', overRange: true, unit: answer.unit ?? 'Ω' });
        } else {
          const parsed = parseReading(step.quantity, answer.text ?? '', answer.unit);
          if (!parsed.ok) return refuse(parsed.message);
          value = parsed.value;
          Object.assign(base, { text: answer.text ?? null, value, unit: parsed.unit });
        }
        let evaluation;
        try {
          evaluation = evaluateReading(step, value, readings);
        } catch {
          return refuse(`No band of "${step.id}" holds this reading: the bands of this draft leave a gap.`);
        }
        if (evaluation.band.askAgain) return refuse(evaluation.band.askAgain);
        if (Number.isFinite(value)) readings[step.id] = value;
        Object.assign(base, {
          quantity: step.quantity,
          band: evaluation.band.label,
          bandIndex: evaluation.index,
          verdict: evaluation.verdict,
        });
        outcome = evaluation.outcome;
        verdict = {
          band: evaluation.band.label,
          outcome: evaluation.outcome ?? '',
          position: evaluation.position,
          verdict: evaluation.verdict,
          value: Number.isFinite(value) ? value : Number.MAX_VALUE,
        };
      } else if (step.kind === 'inspect') {
        const choice = step.choices.find((c) => c.value === answer.choice);
        if (!choice) return refuse(`Choose one of: ${step.choices.map((c) => c.value).join(', ')}.`);
        if (step.note?.required && !answer.note) return refuse(`${step.note.label}: write what you saw.`);
        Object.assign(base, { choice: choice.value, choiceLabel: choice.label, text: answer.note ?? null });
      } else if (step.kind === 'action' || step.kind === 'finding') {
        if (answer.confirmed !== true) return refuse('Confirm the step once it is done.');
        base.confirmed = true;
      } else {
        return refuse(`"${step.title}" is answered from the unit record, not by hand.`);
      }
      const next = nextOf(step, answer, outcome);
      const found =
        step.kind === 'finding' || isAfterFinding(version, step.id) || (next !== undefined && getStep(version, next)?.kind === 'finding');
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
    undoAnswer: async () => refuse('A dry run keeps no history to undo: start the dry run again to take another path.'),
    escalate: async () => refuse('A dry run cannot be escalated: nothing is stored.'),
  };
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
  const actions = useMemo(() => (tree ? dryRunActions(tree) : null), [tree, run]); // eslint-disable-line react-hooks/exhaustive-deps

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
