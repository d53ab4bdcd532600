// The wizard's UI flow: which step is on screen, the queue of answers not yet saved, retries while
// the tablet is off the network, and reconciliation with what the server says.
//
// The step on screen is never decided here: it is the diagnosis machine replaying the saved answers
// followed by the pending ones, so the wizard advances at once (optimistically) and along exactly
// the path the server will take when the queue reaches it.
import { assign, fromPromise, setup } from 'xstate';
import { findBand, shiftedBands } from '@/lib/bands';
import type { EnergyState, Quantity, Step, TreeVersion, UnitFacts, Verdict } from '@/lib/trees/schema';
import { answerEvent, getStep, phaseOf, replayAnswers, stateIdOf, type DiagnosisAnswer } from '@/machines/diagnosis-machine';

/** `fact`: a unit-record branch the server answered; `finding`: "the repair is done". */
export type AnswerKind = 'measure' | 'inspect' | 'action' | 'fact' | 'finding';

/** One answer as the wizard holds it; `clientId` makes a re-sent save idempotent on the server. */
export interface WizardAnswer {
  clientId: string;
  stepId: string;
  kind: AnswerKind;
  /** For a measure step: the text as typed and the picker's unit; `value` is the parse in canonical units. */
  text?: string;
  unit?: string;
  value?: number;
  /** An ohms reading over range ("OL", open circuit): sent as `overRange: true` without a value. */
  overRange?: true;
  choice?: string;
  /** What the technician noted with a choice (a status light against the control's legend). */
  note?: string;
  confirmed?: boolean;
}

/** An answer the server has stored, with what it said about it. */
export interface SavedAnswer extends WizardAnswer {
  band?: string | null;
  verdict?: string | null;
  at?: string;
}

export interface PendingAnswer extends WizardAnswer {
  attempts: number;
}

/** The parts of an answer as GET /api/diagnoses/{id} returns it that the wizard needs. */
export interface ServerAnswer {
  clientId: string;
  stepId: string;
  kind: string;
  text: string | null;
  value: number | null;
  unit: string | null;
  band: string | null;
  verdict: string | null;
  choice: string | null;
  confirmed: boolean | null;
  /** Optional until every server sends it; an over-range reading is also stored as text "OL" without a value. */
  overRange?: boolean | null;
  at: string | Date;
}

const isOverRange = (a: ServerAnswer) => a.overRange ?? (a.kind === 'measure' && a.value === null && a.text?.trim().toUpperCase() === 'OL');

/** What the server says of a reached finding: the readings that contradict it. */
export interface FindingCheck {
  findingId: string;
  contradictions: { stepId: string; value: number; expected: { from?: number; to?: number }; reason: string; takenAt?: string }[];
}

export interface WizardView {
  id: string;
  path: ServerAnswer[];
  finding?: { id: string } | null;
  contradictions?: FindingCheck['contradictions'];
}

export type SaveOutcome =
  | { type: 'saved'; answer: ServerAnswer; diagnosis?: { status: string; contradictions: FindingCheck['contradictions'] } }
  /** The server refused the answer itself (a 4xx for bad input): roll back to its step. */
  | { type: 'refused'; message: string }
  /** Someone else moved the diagnosis (409): drop the queue and reload. */
  | { type: 'conflict'; message: string }
  /** The session ended or the role may not do this (401/403): keep the queue, stop retrying, ask to sign in. */
  | { type: 'signed-out'; message: string };

export interface Refusal {
  stepId: string;
  message: string;
  /** What was typed, so the user can correct it rather than type it again. */
  text?: string;
  unit?: string;
}

export interface WizardContext {
  diagnosisId: string;
  version: TreeVersion;
  saved: SavedAnswer[];
  pending: PendingAnswer[];
  /** The state id of the step on screen (a tree step or an inserted procedure). */
  stepId: string;
  energy: EnergyState;
  findingId: string | null;
  /** The unit record's facts: the branches they answer are taken locally too while offline. */
  unit?: UnitFacts;
  refusal: Refusal | null;
  /** Something the user should know that is not about one answer (a reload after a conflict, an undo that failed). */
  notice: string | null;
  online: boolean;
  /** The server's word on the finding reached, once it holds every answer; null before. */
  findingCheck: FindingCheck | null;
  /** Failed attempts of the save at the head of the queue, for the backoff. */
  attempts: number;
  lastError: string | null;
}

export interface WizardInput {
  diagnosisId: string;
  version: TreeVersion;
  view: WizardView;
  /** A queue left in storage by an earlier page load (e.g. a reload during an outage). */
  pending?: PendingAnswer[];
  online?: boolean;
  unit?: UnitFacts;
}

export type WizardEvent =
  | { type: 'answer.submit'; answer: Omit<WizardAnswer, 'clientId' | 'kind'> & { clientId?: string } }
  | { type: 'answer.undo' }
  | { type: 'view.loaded'; view: WizardView }
  /** A queue found in storage after the page loaded (kept out of the first render so it hydrates). */
  | { type: 'queue.restore'; pending: PendingAnswer[] }
  | { type: 'network.online' }
  | { type: 'network.offline' }
  | { type: 'retry.now' }
  | { type: 'refusal.dismiss' }
  | { type: 'notice.dismiss' };

/** Backoff before the next attempt: 1 s, 2 s, 4 s … capped at 30 s. */
export function retryDelayMs(attempts: number): number {
  return Math.min(30_000, 1000 * 2 ** Math.max(0, attempts - 1));
}

export function toSavedAnswer(a: ServerAnswer): SavedAnswer {
  return {
    clientId: a.clientId,
    stepId: a.stepId,
    kind: a.kind as AnswerKind,
    ...(a.text !== null ? { text: a.text } : {}),
    ...(a.unit !== null ? { unit: a.unit } : {}),
    ...(a.value !== null ? { value: a.value } : {}),
    ...(isOverRange(a) ? { overRange: true as const } : {}),
    ...(a.choice !== null ? { choice: a.choice } : {}),
    ...(a.confirmed !== null ? { confirmed: a.confirmed } : {}),
    band: a.band,
    verdict: a.verdict,
    at: typeof a.at === 'string' ? a.at : a.at.toISOString(),
  };
}

const asDiagnosisAnswer = (a: WizardAnswer): DiagnosisAnswer => ({
  stepId: a.stepId,
  ...(a.value !== undefined ? { value: a.value } : {}),
  ...(a.overRange ? { overRange: true } : {}),
  ...(a.choice !== undefined ? { choice: a.choice } : {}),
  ...(a.confirmed !== undefined ? { confirmed: a.confirmed } : {}),
});

interface Local {
  stepId: string;
  energy: EnergyState;
  findingId: string | null;
  /** How many of the answers replayed; fewer than given means the rest lead nowhere from here. */
  replayed: number;
}

/** Where the given answers lead on this tree version. */
export function walkLocally(version: TreeVersion, answers: readonly WizardAnswer[], unit?: UnitFacts): Local {
  const replay = replayAnswers(version, answers.map(asDiagnosisAnswer), { unit });
  const snapshot = replay.snapshot;
  return {
    stepId: stateIdOf(snapshot.value) ?? version.graph.start,
    energy: snapshot.context.energy,
    findingId: snapshot.context.findingId,
    replayed: replay.ok ? answers.length : replay.index,
  };
}

/**
 * The queue after the server's path: answers the server already holds (same clientId) leave the
 * queue, and answers that no longer follow from the server's path are dropped.
 */
export function reconcileQueue(version: TreeVersion, saved: readonly WizardAnswer[], pending: readonly PendingAnswer[], unit?: UnitFacts) {
  const held = new Set(saved.map((a) => a.clientId));
  const waiting = pending.filter((p) => !held.has(p.clientId));
  const local = walkLocally(version, [...saved, ...waiting], unit);
  const keep = Math.max(0, local.replayed - saved.length);
  return { pending: waiting.slice(0, keep), dropped: waiting.length - keep };
}

function derive(version: TreeVersion, saved: readonly WizardAnswer[], pending: readonly WizardAnswer[], unit?: UnitFacts) {
  const { stepId, energy, findingId } = walkLocally(version, [...saved, ...pending], unit);
  return { stepId, energy, findingId };
}

function findingCheckOf(view: WizardView): FindingCheck | null {
  return view.finding ? { findingId: view.finding.id, contradictions: view.contradictions ?? [] } : null;
}

function applyView(context: WizardContext, view: WizardView) {
  const saved = view.path.map(toSavedAnswer);
  const { pending, dropped } = reconcileQueue(context.version, saved, context.pending, context.unit);
  return {
    saved,
    pending,
    findingCheck: findingCheckOf(view),
    ...derive(context.version, saved, pending, context.unit),
    ...(dropped > 0
      ? {
          notice: `${dropped === 1 ? 'One answer' : `${dropped} answers`} no longer followed from where the diagnosis stands and ${dropped === 1 ? 'was' : 'were'} dropped.`,
        }
      : {}),
  };
}

/** The clientIds of `a` are a strict prefix of those of `b`. */
function isStrictPrefix(a: readonly { clientId: string }[], b: readonly { clientId: string }[]) {
  return a.length < b.length && a.every((x, i) => x.clientId === b[i].clientId);
}

function newClientId(): string {
  return globalThis.crypto.randomUUID();
}

export const wizardMachine = setup({
  types: {
    context: {} as WizardContext,
    events: {} as WizardEvent,
    input: {} as WizardInput,
  },
  actors: {
    // The real ones call the server actions; the component provides them, tests swap them.
    saveAnswer: fromPromise<SaveOutcome, { diagnosisId: string; answer: PendingAnswer }>(async () => {
      throw new Error('saveAnswer is not provided');
    }),
    undoAnswer: fromPromise<WizardView, { diagnosisId: string; last?: string }>(async () => {
      throw new Error('undoAnswer is not provided');
    }),
    loadView: fromPromise<WizardView, { diagnosisId: string }>(async () => {
      throw new Error('loadView is not provided');
    }),
  },
  actions: {
    // Provided by the component: keep the queue in storage.
    persistQueue: (_, _params: { pending: PendingAnswer[] }) => {},
    enqueue: assign(({ context, event }) => {
      if (event.type !== 'answer.submit') return {};
      const step = getStep(context.version, event.answer.stepId) as Step;
      const answer: PendingAnswer = {
        ...event.answer,
        clientId: event.answer.clientId ?? newClientId(),
        kind: step.kind as AnswerKind,
        attempts: 0,
      };
      const pending = [...context.pending, answer];
      return { pending, refusal: null, notice: null, ...derive(context.version, context.saved, pending, context.unit) };
    }),
    commit: assign(({ context }, params: { outcome: SaveOutcome }) => {
      if (params.outcome.type !== 'saved') return {};
      const answer = toSavedAnswer(params.outcome.answer);
      const pending = context.pending.filter((p) => p.clientId !== answer.clientId);
      const local = context.pending.find((p) => p.clientId === answer.clientId);
      const known = context.saved.some((s) => s.clientId === answer.clientId);
      // The server stores the text and unit it parsed; keep what the user typed if it said nothing.
      const saved = known ? context.saved : [...context.saved, { ...local, ...answer, text: answer.text ?? local?.text }];
      const walked = derive(context.version, saved, pending, context.unit);
      // The save answers with the finding's check, so nothing is fetched again to show it.
      const status = params.outcome.diagnosis?.status;
      const findingCheck =
        (status === 'found' || status === 'verified') && pending.length === 0 && walked.findingId
          ? { findingId: walked.findingId, contradictions: params.outcome.diagnosis?.contradictions ?? [] }
          : null;
      return { saved, pending, attempts: 0, lastError: null, findingCheck, ...walked };
    }),
    rollback: assign(({ context }, params: { outcome: SaveOutcome }) => {
      if (params.outcome.type !== 'refused') return {};
      const [head] = context.pending;
      // Later answers were given on top of the refused one, so they go with it.
      const pending: PendingAnswer[] = [];
      return {
        pending,
        attempts: 0,
        lastError: null,
        refusal: head ? { stepId: head.stepId, message: params.outcome.message, text: head.text, unit: head.unit } : null,
        ...derive(context.version, context.saved, pending, context.unit),
      };
    }),
    dropQueueForConflict: assign(({ context }, params: { outcome: SaveOutcome }) => {
      if (params.outcome.type !== 'conflict') return {};
      const pending: PendingAnswer[] = [];
      return {
        pending,
        attempts: 0,
        lastError: null,
        notice: `${params.outcome.message} The diagnosis was reloaded; answers not yet saved were dropped.`,
        ...derive(context.version, context.saved, pending, context.unit),
      };
    }),
    holdForSignIn: assign(({ context }, params: { outcome: SaveOutcome }) => {
      if (params.outcome.type !== 'signed-out') return {};
      const n = context.pending.length;
      return {
        attempts: 0,
        lastError: params.outcome.message,
        notice: `${params.outcome.message} Sign in again — your ${n === 1 ? 'answer is' : `${n} answers are`} kept on this device and will be sent then.`,
      };
    }),
    recordFailure: assign(({ context, event }) => {
      const error = (event as { error?: unknown }).error;
      const message = error instanceof Error ? error.message : String(error ?? 'The save failed');
      const [head, ...rest] = context.pending;
      return {
        attempts: context.attempts + 1,
        lastError: message,
        pending: head ? [{ ...head, attempts: head.attempts + 1 }, ...rest] : context.pending,
      };
    }),
    applyView: assign(({ context }, params: { view: WizardView }) => applyView(context, params.view)),
    reconcileView: assign(({ context, event }) => {
      if (event.type !== 'view.loaded') return {};
      // A view fetched before our last save landed is older than what we know: keep ours.
      if (isStrictPrefix(event.view.path, context.saved)) return {};
      return applyView(context, event.view);
    }),
    setUndoError: assign(({ event }) => {
      const error = (event as { error?: unknown }).error;
      return { notice: `Undo did not go through: ${error instanceof Error ? error.message : String(error)}` };
    }),
  },
  guards: {
    canAnswer: ({ context, event }) => {
      if (event.type !== 'answer.submit' || event.answer.stepId !== context.stepId) return false;
      const step = getStep(context.version, event.answer.stepId);
      if (!step) return false;
      const replay = replayAnswers(context.version, [...context.saved, ...context.pending].map(asDiagnosisAnswer), { unit: context.unit });
      const made = answerEvent(
        step,
        asDiagnosisAnswer({ ...event.answer, clientId: '', kind: 'action' }),
        phaseOf(context.version, context.stepId),
      );
      return replay.ok && made.ok && replay.snapshot.can(made.event);
    },
    hasPending: ({ context }) => context.pending.length > 0,
    canUndo: ({ context }) => context.pending.length === 0 && context.saved.length > 0,
    isSaved: (_, params: { outcome: SaveOutcome }) => params.outcome.type === 'saved',
    drainsQueue: ({ context }, params: { outcome: SaveOutcome }) =>
      params.outcome.type === 'saved' &&
      context.pending.every((p) => p.clientId === (params.outcome as { answer: ServerAnswer }).answer.clientId),
    isRefused: (_, params: { outcome: SaveOutcome }) => params.outcome.type === 'refused',
    isConflict: (_, params: { outcome: SaveOutcome }) => params.outcome.type === 'conflict',
    isSignedOut: (_, params: { outcome: SaveOutcome }) => params.outcome.type === 'signed-out',
  },
  delays: {
    retryDelay: ({ context }) => retryDelayMs(context.attempts),
  },
}).createMachine({
  id: 'wizard',
  context: ({ input }) => {
    const saved = input.view.path.map(toSavedAnswer);
    const { pending } = reconcileQueue(input.version, saved, input.pending ?? [], input.unit);
    return {
      diagnosisId: input.diagnosisId,
      version: input.version,
      unit: input.unit,
      saved,
      pending,
      ...derive(input.version, saved, pending, input.unit),
      refusal: null,
      notice: null,
      online: input.online ?? true,
      findingCheck: findingCheckOf(input.view),
      attempts: 0,
      lastError: null,
    };
  },
  initial: 'idle',
  on: {
    'answer.submit': {
      guard: 'canAnswer',
      actions: ['enqueue', { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) }],
    },
    'view.loaded': {
      actions: ['reconcileView', { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) }],
    },
    'queue.restore': {
      actions: [
        assign(({ context, event }) => {
          const known = new Set(context.pending.map((p) => p.clientId));
          const merged = [...context.pending, ...event.pending.filter((p) => !known.has(p.clientId))];
          const { pending } = reconcileQueue(context.version, context.saved, merged, context.unit);
          return { pending, ...derive(context.version, context.saved, pending, context.unit) };
        }),
        { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) },
      ],
    },
    'network.offline': { actions: assign({ online: false }) },
    'network.online': { actions: assign({ online: true }) },
    'refusal.dismiss': { actions: assign({ refusal: null }) },
    'notice.dismiss': { actions: assign({ notice: null }) },
  },
  states: {
    idle: {
      tags: ['synced'],
      always: { guard: 'hasPending', target: 'saving' },
      on: {
        'answer.undo': { guard: 'canUndo', target: 'undoing', actions: assign({ refusal: null, notice: null }) },
      },
    },
    saving: {
      tags: ['busy'],
      invoke: {
        src: 'saveAnswer',
        input: ({ context }) => ({ diagnosisId: context.diagnosisId, answer: context.pending[0] }),
        onDone: [
          {
            // The last answer of the queue: the server view (contradictions, status) is worth fetching again.
            guard: { type: 'drainsQueue', params: ({ event }) => ({ outcome: event.output }) },
            target: 'idle',
            actions: [
              { type: 'commit', params: ({ event }) => ({ outcome: event.output }) },
              { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) },
            ],
          },
          {
            guard: { type: 'isSaved', params: ({ event }) => ({ outcome: event.output }) },
            target: 'idle',
            actions: [
              { type: 'commit', params: ({ event }) => ({ outcome: event.output }) },
              { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) },
            ],
          },
          {
            guard: { type: 'isRefused', params: ({ event }) => ({ outcome: event.output }) },
            target: 'idle',
            actions: [
              { type: 'rollback', params: ({ event }) => ({ outcome: event.output }) },
              { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) },
            ],
          },
          {
            guard: { type: 'isSignedOut', params: ({ event }) => ({ outcome: event.output }) },
            target: 'signedOut',
            actions: [{ type: 'holdForSignIn', params: ({ event }) => ({ outcome: event.output }) }],
          },
          {
            target: 'reloading',
            actions: [
              { type: 'dropQueueForConflict', params: ({ event }) => ({ outcome: event.output }) },
              { type: 'persistQueue', params: ({ context }) => ({ pending: context.pending }) },
            ],
          },
        ],
        onError: { target: 'waiting', actions: 'recordFailure' },
      },
    },
    waiting: {
      tags: ['busy', 'retrying'],
      after: { retryDelay: 'saving' },
      on: {
        'network.online': { target: 'saving', actions: assign({ online: true }) },
        'retry.now': 'saving',
      },
    },
    undoing: {
      tags: ['busy'],
      on: { 'view.loaded': { actions: [] } },
      invoke: {
        src: 'undoAnswer',
        // The answer undone is named, so a second undo sent at the same time is refused instead of undoing one more.
        input: ({ context }) => ({ diagnosisId: context.diagnosisId, last: context.saved.at(-1)?.clientId }),
        onDone: { target: 'idle', actions: { type: 'applyView', params: ({ event }) => ({ view: event.output }) } },
        onError: { target: 'idle', actions: 'setUndoError' },
      },
    },
    reloading: {
      tags: ['busy'],
      on: { 'view.loaded': { actions: [] } },
      invoke: {
        src: 'loadView',
        input: ({ context }) => ({ diagnosisId: context.diagnosisId }),
        onDone: { target: 'idle', actions: { type: 'applyView', params: ({ event }) => ({ view: event.output }) } },
        onError: { target: 'reloadWaiting', actions: 'recordFailure' },
      },
    },
    // No retries until the user says they have signed in again (in another tab, or after a reload).
    signedOut: {
      tags: ['busy', 'signed-out'],
      on: { 'retry.now': { target: 'saving', actions: assign({ notice: null }) } },
    },
    reloadWaiting: {
      tags: ['busy', 'retrying'],
      after: { retryDelay: 'reloading' },
      on: { 'network.online': 'reloading', 'retry.now': 'reloading' },
    },
  },
});

export type WizardMachine = typeof wizardMachine;

/** What the small sync indicator says. */
export function syncStatus(context: Pick<WizardContext, 'pending' | 'online' | 'lastError'>, busy: boolean, signedOut = false) {
  const n = context.pending.length;
  const waiting = `${n} ${n === 1 ? 'answer' : 'answers'} waiting`;
  if (n === 0) return { kind: busy ? ('saving' as const) : ('saved' as const), text: busy ? 'Saving…' : 'Saved' };
  if (signedOut) return { kind: 'signed-out' as const, text: `Not saved — sign in again; ${waiting} on this device` };
  if (!context.online) return { kind: 'offline' as const, text: `Offline — ${waiting}` };
  if (context.lastError) return { kind: 'retrying' as const, text: `Not saved yet — ${waiting}, retrying` };
  return { kind: 'saving' as const, text: n > 1 ? `Saving… (${waiting})` : 'Saving…' };
}

/** A path entry for display: saved answers with the server's band, pending ones with the local one. */
export interface PathItem {
  clientId: string;
  stepId: string;
  stepTitle: string;
  kind: AnswerKind;
  /** The quantity of a measure step, to show the reading as it was entered. */
  quantity?: Quantity;
  text?: string;
  unit?: string;
  value?: number;
  overRange?: true;
  band?: string;
  verdict?: Verdict;
  choiceLabel?: string;
  /** An inspect step's note (what the status light showed). */
  note?: string;
  confirmed?: boolean;
  saved: boolean;
}

export function pathItems(context: Pick<WizardContext, 'version' | 'saved' | 'pending'>): PathItem[] {
  const readings: Record<string, number> = {};
  const item = (a: WizardAnswer & { band?: string | null; verdict?: string | null }, saved: boolean): PathItem => {
    const step = getStep(context.version, a.stepId);
    const bands = step?.kind === 'measure' ? shiftedBands(step, readings) : [];
    if (a.value !== undefined) readings[a.stepId] = a.value;
    // An over-range reading falls in the band open towards +infinity.
    const open = step?.kind === 'measure' && a.overRange ? bands.findLast((x) => x.to === undefined) : undefined;
    const local = open ? { band: open } : step?.kind === 'measure' && a.value !== undefined ? findBand(bands, a.value) : null;
    return {
      clientId: a.clientId,
      stepId: a.stepId,
      stepTitle: step?.title ?? a.stepId,
      kind: a.kind,
      ...(step?.kind === 'measure' ? { quantity: step.quantity } : {}),
      ...(a.text !== undefined ? { text: a.text } : {}),
      ...(a.unit !== undefined ? { unit: a.unit } : {}),
      ...(a.value !== undefined ? { value: a.value } : {}),
      ...(a.overRange ? { overRange: true as const } : {}),
      ...((a.band ?? local) ? { band: a.band ?? local?.band.label } : {}),
      ...((a.verdict ?? local) ? { verdict: (a.verdict ?? local?.band.verdict) as Verdict } : {}),
      ...(step?.kind === 'inspect' && a.choice ? { choiceLabel: step.choices.find((c) => c.value === a.choice)?.label ?? a.choice } : {}),
      ...(step?.kind === 'fact' && a.choice ? { choiceLabel: step.cases.find((c) => c.value === a.choice)?.label ?? a.choice } : {}),
      ...(step?.kind === 'inspect' && (a.note ?? a.text) ? { note: a.note ?? a.text } : {}),
      ...(a.confirmed !== undefined ? { confirmed: a.confirmed } : {}),
      saved,
    };
  };
  return [...context.saved.map((a) => item(a, true)), ...context.pending.map((a) => item(a, false))];
}
