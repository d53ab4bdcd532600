'use client';

import { useMachine } from '@xstate/react';
import clsx from 'clsx';
import { useEffect, useMemo, useRef, useState } from 'react';
import { fromPromise } from 'xstate';
import { findBand, latestReadings, shiftedBands } from '@/lib/bands';
import {
  showsIgnitionTimeline,
  type ActionStep,
  type EnergyState,
  type FindingStep,
  type InspectStep,
  type MeasureStep,
  type TreeVersion,
  type UnitFacts,
} from '@/lib/trees/schema';
import type { Role } from '@/lib/roles';
import { bandsNoteForScreen } from '@/lib/trees/wording';
import { displayUnitFor, OVER_RANGE_ENTRY, type UnitSystem } from '@/lib/units';
import { fetcher } from '@/lib/swr/fetcher';
import type { ActionResult, AnswerResult, DiagnosisViewOut } from '@/lib/validations/api';
import { getStep, phaseOf } from '@/machines/diagnosis-machine';
import {
  pathItems,
  syncStatus,
  wizardMachine,
  type PendingAnswer,
  type SaveOutcome,
  type ServerAnswer,
  type WizardView,
} from '@/machines/wizard-machine';
import { CautionList } from '@/components/ui/caution';
import { EscalateStep } from '@/components/wizard/escalate-step';
import { ActionBar } from '@/components/wizard/action-bar';
import { ElectricalAids } from '@/components/wizard/electrical-aids';
import { FindingScreen } from '@/components/wizard/finding-screen';
import { IgnitionTimeline } from '@/components/wizard/ignition-timeline';
import { PathSoFar } from '@/components/wizard/path-so-far';
import { ProcedureChecklist } from '@/components/wizard/procedure-checklist';
import { parseEntry, ReadingEntry, type ReadingSource, type ReadingValue } from '@/components/wizard/reading-entry';
import { EnergyBadge, TestPoints, WhyThisStep } from '@/components/wizard/step-parts';
import { SyncStatus } from '@/components/wizard/sync-status';
import { UndoLast } from '@/components/wizard/undo-last';

/** The server actions, passed in by the page (components do not import from app/). */
export interface WizardActions {
  submitAnswer: (input: unknown) => Promise<ActionResult<AnswerResult>>;
  undoAnswer: (input: unknown) => Promise<ActionResult<DiagnosisViewOut>>;
  escalate: (input: unknown) => Promise<ActionResult<DiagnosisViewOut>>;
}

/**
 * Answers from beside the wizard (a practice diagnosis on the bench): a measure step's reading from
 * the bench, filled into the step as it is taken, and an inspect step's look, which preselects the
 * choice the result maps to. A source that answers null for a step leaves its keypad and choices as they are.
 */
export interface StepSources {
  reading?: (step: MeasureStep) => ReadingSource | null;
  observe?: (step: InspectStep) => ObserveSource | null;
}

export interface ObserveSource {
  /** What the look is, in words ("the spark, during the trial for ignition"). */
  label: string;
  /** Looks on the bench; answers the choice the result maps to (null: none of them) and the result in words. */
  run: () => Promise<{ choice: string | null; text: string }>;
}

/** A save that has not answered in this time is given up and retried (the server action has no timeout of its own). */
const SAVE_TIMEOUT_MS = 20_000;

function withTimeout<T>(work: Promise<T>, ms: number): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('The server did not answer')), ms);
    work.then(
      (v) => {
        clearTimeout(timer);
        resolve(v);
      },
      (e) => {
        clearTimeout(timer);
        reject(e);
      },
    );
  });
}

/** What a refused save means for the queue: the answer itself (roll back), the diagnosis moved (reload), the session (hold). */
export function outcomeOf(result: ActionResult<AnswerResult>): SaveOutcome {
  if (result.ok) return { type: 'saved', answer: result.data.answer as ServerAnswer, diagnosis: result.data.diagnosis };
  switch (result.code) {
    case 'bad_request':
    case 'not_found':
      return { type: 'refused', message: result.message };
    case 'conflict':
      return { type: 'conflict', message: result.message };
    case 'unauthorized':
    case 'forbidden':
      return { type: 'signed-out', message: result.message };
    default:
      // Busy, too many requests, a failure on our side: worth another try after the backoff.
      throw new Error(result.message);
  }
}

export interface WizardProps {
  actions: WizardActions;
  diagnosisId: string;
  callId: string;
  version: TreeVersion;
  initialView: DiagnosisViewOut;
  displayUnits: UnitSystem;
  transformerVa: number | null;
  /** The signed-in user's role: "why this step" opens by itself for apprentices. */
  viewerRole?: Role | null;
  /** The unit record's facts, for the branches they answer while answers wait to be saved. */
  unit?: UnitFacts;
  /** Where the unit record can be corrected, for those who may (technicians and up). */
  correctUnitHref?: string | null;
  /** Readings and looks from beside the wizard (the bench of a practice diagnosis). */
  sources?: StepSources;
  /** A walk of no service call (a practice diagnosis on the bench): nobody to escalate to, no photos to take. */
  practice?: boolean;
}

const queueKey = (id: string) => `pg-wizard-queue:${id}`;

function readQueue(id: string): PendingAnswer[] {
  try {
    const raw = localStorage.getItem(queueKey(id));
    return raw ? (JSON.parse(raw) as PendingAnswer[]) : [];
  } catch {
    return [];
  }
}

function writeQueue(id: string, pending: PendingAnswer[]) {
  try {
    if (pending.length === 0) localStorage.removeItem(queueKey(id));
    else localStorage.setItem(queueKey(id), JSON.stringify(pending));
  } catch {
    // Storage full or disabled: the queue still lives in memory for this page.
  }
}

/** The answer as the save sends it: an over-range reading goes as `overRange: true`, without text or value. */
export function answerPayload(a: PendingAnswer) {
  return {
    clientId: a.clientId,
    stepId: a.stepId,
    ...(a.kind === 'measure' && a.overRange ? { overRange: true as const } : {}),
    ...(a.kind === 'measure' && !a.overRange ? { text: a.text ?? '', ...(a.unit ? { unit: a.unit } : {}) } : {}),
    ...(a.kind === 'inspect' ? { choice: a.choice, ...(a.note ? { note: a.note } : {}) } : {}),
    ...(a.kind === 'action' || a.kind === 'finding' ? { confirmed: true } : {}),
  };
}

export function Wizard({
  actions,
  diagnosisId,
  callId,
  version,
  initialView,
  displayUnits,
  transformerVa,
  viewerRole,
  unit,
  correctUnitHref,
  sources,
  practice = false,
}: WizardProps) {
  // The server's view as last seen: the page's, then what an undo or a reload answered.
  const [view, setView] = useState(initialView);

  const machine = useMemo(
    () =>
      wizardMachine.provide({
        actors: {
          saveAnswer: fromPromise<SaveOutcome, { diagnosisId: string; answer: PendingAnswer }>(async ({ input }) => {
            if (typeof navigator !== 'undefined' && navigator.onLine === false) throw new Error('The tablet is offline');
            const result = await withTimeout(
              actions.submitAnswer({ diagnosisId: input.diagnosisId, answer: answerPayload(input.answer) }),
              SAVE_TIMEOUT_MS,
            );
            return outcomeOf(result);
          }),
          undoAnswer: fromPromise<WizardView, { diagnosisId: string; last?: string }>(async ({ input }) => {
            const result = await withTimeout(actions.undoAnswer({ diagnosisId: input.diagnosisId, last: input.last }), SAVE_TIMEOUT_MS);
            if (!result.ok) throw new Error(result.message);
            setView(result.data);
            return result.data as WizardView;
          }),
          loadView: fromPromise<WizardView, { diagnosisId: string }>(async ({ input }) => {
            const fresh = await withTimeout(fetcher<DiagnosisViewOut>(`/api/diagnoses/${input.diagnosisId}`), SAVE_TIMEOUT_MS);
            setView(fresh);
            return fresh as WizardView;
          }),
        },
        actions: {
          persistQueue: (_, params) => writeQueue(diagnosisId, params.pending),
        },
      }),
    // The page's actions are stable server references.
    [actions, diagnosisId],
  );

  const [snapshot, send] = useMachine(machine, { input: { diagnosisId, version, view: initialView, unit } });
  const ctx = snapshot.context;

  useEffect(() => {
    const stored = readQueue(diagnosisId);
    if (stored.length > 0) send({ type: 'queue.restore', pending: stored });
    if (!navigator.onLine) send({ type: 'network.offline' });
    const online = () => send({ type: 'network.online' });
    const offline = () => send({ type: 'network.offline' });
    window.addEventListener('online', online);
    window.addEventListener('offline', offline);
    return () => {
      window.removeEventListener('online', online);
      window.removeEventListener('offline', offline);
    };
  }, [diagnosisId, send]);

  const busy = !snapshot.hasTag('synced');
  const status = syncStatus(ctx, busy, snapshot.hasTag('signed-out'));
  const items = pathItems(ctx);
  const step = getStep(version, ctx.stepId);
  const refusal = ctx.refusal && ctx.refusal.stepId === ctx.stepId ? ctx.refusal : null;

  // Focus moves to the new step's heading, so a screen reader starts at the top of it.
  const headingKey = `${ctx.stepId}:${items.length}`;
  const firstRender = useRef(true);
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    document.querySelector<HTMLElement>('[data-step-heading]')?.focus();
  }, [headingKey]);

  const finding = ctx.findingId ? (getStep(version, ctx.findingId) as FindingStep | undefined) : undefined;
  const phase = phaseOf(version, ctx.stepId);
  const escalated = view.status === 'escalated';
  const readings = latestReadings([...ctx.saved, ...ctx.pending]);
  const canEscalate = !practice && !escalated && phase !== 'done' && view.callStatus !== 'closed' && view.callStatus !== 'referred';
  const footer = (
    <div className="space-y-4">
      <PathSoFar items={items} callId={practice ? undefined : callId} />
      {correctUnitHref && items.some((i) => i.kind === 'fact') && (
        <p className="text-base text-muted">
          Some answers came from the unit record.{' '}
          <a href={correctUnitHref} className="inline-flex min-h-touch items-center font-semibold text-ink underline underline-offset-4">
            Wrong? Correct the unit record
          </a>
        </p>
      )}
      {canEscalate && (
        <EscalateStep
          disabled={ctx.pending.length > 0}
          onEscalate={async (note) => {
            const result = await actions.escalate({ diagnosisId, note });
            if (result.ok) setView(result.data);
            return result;
          }}
        />
      )}
      <UndoLast
        lastTitle={items.at(-1)?.stepTitle ?? null}
        lockedReason={undoLockedReason(view)}
        disabled={!snapshot.can({ type: 'answer.undo' })}
        onUndo={() => send({ type: 'answer.undo' })}
      />
    </div>
  );
  const check = ctx.pending.length === 0 && ctx.findingCheck?.findingId === ctx.findingId ? ctx.findingCheck : null;

  return (
    // Room below the last element for the fixed action bar: its measured height (see ActionBar) and a margin.
    <div className="mx-auto max-w-3xl pb-[calc(var(--action-bar-h,6rem)+2rem)]">
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <p className="text-base text-muted">
          {initialView.tree.title} · v{initialView.tree.version}
          {!finding && <> · step {items.filter((i) => i.kind !== 'fact').length + 1}</>}
        </p>
        <SyncStatus kind={status.kind} text={status.text} onRetry={() => send({ type: 'retry.now' })} />
      </div>

      <div aria-live="assertive" className="empty:hidden mb-4 space-y-2">
        {refusal && (
          <p className="rounded-lg border-2 border-ink bg-sunken px-4 py-3 font-semibold" data-testid="refusal">
            <span aria-hidden>✗ </span>Not saved: {refusal.message}
          </p>
        )}
        {ctx.notice && (
          <p className="flex items-start justify-between gap-3 rounded-lg border-2 border-ink bg-sunken px-4 py-3" data-testid="notice">
            <span>{ctx.notice}</span>
            <button type="button" className="btn-quiet px-3 text-base underline" onClick={() => send({ type: 'notice.dismiss' })}>
              Dismiss
            </button>
          </p>
        )}
      </div>

      {escalated ? (
        <EscalatedScreen view={view} callId={callId} footer={<PathSoFar items={items} callId={callId} />} />
      ) : finding && (phase === 'repair' || phase === 'done') ? (
        <FindingScreen
          key={phase}
          finding={finding}
          version={version}
          callId={callId}
          diagnosisId={diagnosisId}
          mode={phase === 'done' ? 'done' : 'repair'}
          energy={ctx.energy}
          contradictions={check ? check.contradictions : null}
          needsSignOff={view?.startedBy.role === 'apprentice' && !view.signedOff}
          signedOff={view?.signedOff ?? null}
          footer={footer}
          onRepairDone={() =>
            send({ type: 'answer.submit', answer: { stepId: finding.id, confirmed: true, clientId: crypto.randomUUID() } })
          }
        />
      ) : step ? (
        <>
          {finding && <VisitBanner finding={finding} phase={phase} />}
          <StepScreen
            key={`${step.id}:${items.length}`}
            step={step as MeasureStep | InspectStep | ActionStep}
            diagnosisId={diagnosisId}
            whyOpen={viewerRole === 'apprentice'}
            energy={ctx.energy}
            readings={readings}
            displayUnits={displayUnits}
            transformerVa={transformerVa}
            footer={footer}
            initial={refusal ? { text: refusal.text ?? '', unit: refusal.unit ?? '' } : null}
            sources={sources}
            onAnswer={(answer) => send({ type: 'answer.submit', answer: { ...answer, clientId: crypto.randomUUID() } })}
          />
        </>
      ) : (
        <p>This step is not part of the tree version; reload the page.</p>
      )}
    </div>
  );
}

/** Why undo is not offered: a closed or referred call, or a diagnosis already signed off. */
function undoLockedReason(view: DiagnosisViewOut): string | null {
  if (view.callStatus === 'closed' || view.callStatus === 'referred')
    return `The call is ${view.callStatus}: its answers stay as they are.`;
  if (view.signedOff) return 'This diagnosis is signed off: its answers stay as they are.';
  return null;
}

const PHASE_WORDS: Record<string, string> = {
  procedure: 'Energy procedure',
  reconnect: 'Set up for the reading after the repair',
  recheck: 'Reading after the repair',
  verify: 'Verify the repair',
};

/** Where the visit stands once a finding is reached: repair, restore, verify. */
function VisitBanner({ finding, phase }: { finding: FindingStep; phase: string }) {
  return (
    <p className="mb-4 rounded-lg border-2 border-ink bg-sunken px-4 py-3 text-base" data-testid="visit-banner">
      <span className="font-semibold">Finding: {finding.title}.</span> Repair done — {PHASE_WORDS[phase] ?? 'next step'}.
    </p>
  );
}

/** A diagnosis handed to the leads: the note, who and when; nothing more to answer. */
function EscalatedScreen({ view, callId, footer }: { view: DiagnosisViewOut; callId: string; footer: React.ReactNode }) {
  return (
    <div className="flex flex-col gap-5" data-testid="escalated">
      <p className="text-base font-semibold uppercase tracking-wide text-muted">Escalated</p>
      <h1 className="page-title" tabIndex={-1} data-step-heading>
        Sent to the leads
      </h1>
      <p className="text-lg">
        This diagnosis ended without a finding. Your company&apos;s leads see it on their home page with your note; leave the unit safe —
        power and gas as the last step left them, or off if you are leaving it.
      </p>
      {view.escalation && (
        <blockquote className="card text-lg">
          <p>“{view.escalation.note}”</p>
          <p className="mt-2 text-base text-muted">{view.escalation.by ?? 'Someone'}</p>
        </blockquote>
      )}
      {footer}
      <ActionBar>
        <a href={`/calls/${callId}`} className="btn-primary min-w-[12rem] text-lg">
          Go to the call
        </a>
      </ActionBar>
    </div>
  );
}

interface StepScreenProps {
  step: MeasureStep | InspectStep | ActionStep;
  diagnosisId: string;
  whyOpen: boolean;
  energy: EnergyState;
  /** The walk's readings so far, for bands relative to one of them. */
  readings: Record<string, number>;
  displayUnits: UnitSystem;
  transformerVa: number | null;
  initial: ReadingValue | null;
  footer: React.ReactNode;
  sources?: StepSources;
  onAnswer: (answer: {
    stepId: string;
    text?: string;
    unit?: string;
    value?: number;
    overRange?: true;
    choice?: string;
    note?: string;
    confirmed?: boolean;
  }) => void;
}

function StepScreen({
  step,
  diagnosisId,
  whyOpen,
  energy,
  readings,
  displayUnits,
  transformerVa,
  initial,
  footer,
  sources,
  onAnswer,
}: StepScreenProps) {
  const procedure = /^(lock-out|gas-off|gas-on|re-energize)(\+(lock-out|gas-off|gas-on|re-energize))*--/.test(step.id);
  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="page-title" tabIndex={-1} data-step-heading>
          {step.title}
        </h1>
        <EnergyBadge energy={energy} />
      </div>
      {procedure && <p className="text-base font-semibold uppercase tracking-wide text-muted">Energy procedure</p>}
      <CautionList cautions={step.cautions} role={step.cautions.some((c) => c.signal === 'DANGER') ? 'alert' : 'note'} />
      {step.instruction && <p className="text-lg leading-relaxed">{step.instruction}</p>}
      {step.kind === 'measure' && (
        <MeasureBody
          step={step.reference ? { ...step, bands: shiftedBands(step, readings), reference: undefined } : step}
          relativeTo={step.reference ? step.reference.step : undefined}
          displayUnits={displayUnits}
          transformerVa={transformerVa}
          initial={initial}
          source={sources?.reading?.(step) ?? null}
          onAnswer={onAnswer}
        />
      )}
      {step.kind === 'inspect' && <InspectBody step={step} observe={sources?.observe?.(step) ?? null} onAnswer={onAnswer} />}
      {step.kind === 'action' && (
        <ProcedureChecklist
          items={step.checklist}
          storageKey={`${diagnosisId}:${step.id}`}
          confirmLabel="Confirm"
          onConfirm={() => onAnswer({ stepId: step.id, confirmed: true })}
        />
      )}
      {showsIgnitionTimeline(step) && <IgnitionTimeline />}
      <WhyThisStep why={step.why} defaultOpen={whyOpen} />
      {footer}
    </div>
  );
}

function MeasureBody({
  step,
  relativeTo,
  displayUnits,
  transformerVa,
  initial,
  source,
  onAnswer,
}: {
  step: MeasureStep;
  /** The earlier step the bands were shifted by (shown so the technician knows what the bands follow). */
  relativeTo?: string;
  displayUnits: UnitSystem;
  transformerVa: number | null;
  initial: ReadingValue | null;
  source: ReadingSource | null;
  onAnswer: StepScreenProps['onAnswer'];
}) {
  const [value, setValue] = useState<ReadingValue>(() => ({
    text: initial?.text ?? '',
    unit: initial?.unit || displayUnitFor(step.quantity, displayUnits),
  }));
  // A new reading from the source fills the step (once each: what is typed over it stays).
  const [filled, setFilled] = useState<string | null>(null);
  if (source?.reading && source.reading.key !== filled) {
    setFilled(source.reading.key);
    setValue({ text: source.reading.text, unit: source.reading.unit });
  }
  const parsed = value.text.trim() === '' ? null : parseEntry(step, value);
  // A band that takes no reading (leads reversed): say so, and measure again.
  const askAgain = parsed?.ok && !parsed.overRange ? findBand(step.bands, parsed.value)?.band.askAgain : undefined;
  const save = () => {
    if (!parsed?.ok || askAgain) return;
    // Over range has no value: the wire answer is `overRange: true`; "OL" stays as the text shown on the path.
    if (parsed.overRange) onAnswer({ stepId: step.id, text: OVER_RANGE_ENTRY, unit: parsed.unit, overRange: true });
    else onAnswer({ stepId: step.id, text: value.text.trim(), unit: value.unit, value: parsed.value });
  };
  return (
    <>
      <TestPoints step={step} />
      <ReadingEntry step={step} value={value} onChange={setValue} onSubmit={save} source={source ?? undefined} />
      {askAgain && (
        <p role="alert" className="rounded-lg border-2 border-ink bg-sunken px-4 py-3 text-lg font-semibold" data-testid="ask-again">
          <span aria-hidden>↻ </span>
          {askAgain}
        </p>
      )}
      {relativeTo && <p className="text-base text-muted">The bands follow the reading you took at “{relativeTo}” on this visit.</p>}
      {step.bandsNote && <p className="text-base text-muted">{bandsNoteForScreen(step.bandsNote)}</p>}
      <ElectricalAids aids={step.aids} transformerVa={transformerVa} />
      <ActionBar hint={askAgain ? 'Measure again.' : parsed?.ok ? undefined : 'Enter a reading to save it.'}>
        <button type="button" className="btn-primary min-w-[12rem] text-lg" disabled={!parsed?.ok || Boolean(askAgain)} onClick={save}>
          Save reading
        </button>
      </ActionBar>
    </>
  );
}

function InspectBody({
  step,
  observe,
  onAnswer,
}: {
  step: InspectStep;
  observe?: ObserveSource | null;
  onAnswer: StepScreenProps['onAnswer'];
}) {
  const [choice, setChoice] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [look, setLook] = useState<{ busy: boolean; text: string | null; error: string | null }>({ busy: false, text: null, error: null });
  const runLook = async () => {
    if (!observe) return;
    setLook({ busy: true, text: null, error: null });
    try {
      const seen = await observe.run();
      if (seen.choice) setChoice(seen.choice);
      setLook({ busy: false, text: seen.text, error: null });
    } catch (e) {
      setLook({ busy: false, text: null, error: (e as Error).message });
    }
  };
  const noteMissing = Boolean(step.note?.required) && note.trim() === '';
  return (
    <>
      {observe && (
        <div className="card space-y-2" data-testid="observe-source">
          <p className="text-base text-muted">Look on the bench: {observe.label}.</p>
          <button type="button" className="btn-secondary" disabled={look.busy} onClick={runLook}>
            {look.busy ? 'Looking…' : 'Observe'}
          </button>
          <p aria-live="polite" className="empty:hidden text-base" data-testid="observe-result">
            {look.text}
            {look.error && <span className="field-error mt-0">{look.error}</span>}
          </p>
        </div>
      )}
      <div role="radiogroup" aria-label={step.title} className="grid gap-3 sm:grid-cols-2">
        {step.choices.map((c) => {
          const checked = choice === c.value;
          return (
            <button
              key={c.value}
              type="button"
              role="radio"
              aria-checked={checked}
              onClick={() => setChoice(c.value)}
              className={clsx(
                'flex min-h-[4.5rem] items-center gap-3 rounded-xl border-2 px-4 py-3 text-left text-lg font-semibold',
                checked ? 'border-ink bg-ink text-surface' : 'border-line bg-raised text-ink hover:border-ink',
              )}
            >
              <span aria-hidden className="flex h-7 w-7 shrink-0 items-center justify-center rounded-full border-2 border-current">
                {checked ? '●' : ''}
              </span>
              {c.label}
            </button>
          );
        })}
      </div>
      {step.note && (
        <label className="block space-y-2">
          <span className="label text-base">
            {step.note.label}
            {step.note.required ? '' : ' (optional)'}
          </span>
          <textarea
            className="input min-h-[5rem] w-full text-lg"
            maxLength={500}
            value={note}
            onChange={(e) => setNote(e.target.value)}
            data-testid="step-note"
          />
        </label>
      )}
      <ActionBar hint={!choice ? 'Pick what you see.' : noteMissing ? 'Write what the control reports.' : undefined}>
        <button
          type="button"
          className="btn-primary min-w-[12rem] text-lg"
          disabled={!choice || noteMissing}
          onClick={() => choice && onAnswer({ stepId: step.id, choice, ...(note.trim() ? { note: note.trim() } : {}) })}
        >
          Choose
        </button>
      </ActionBar>
    </>
  );
}
