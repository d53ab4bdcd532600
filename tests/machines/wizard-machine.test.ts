import { createActor, fromPromise, SimulatedClock } from 'xstate';
import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { treeGraphSchema, type TreeVersion } from '@/lib/trees/schema';
import {
  pathItems,
  retryDelayMs,
  syncStatus,
  wizardMachine,
  type PendingAnswer,
  type SaveOutcome,
  type ServerAnswer,
  type WizardView,
} from '@/machines/wizard-machine';

// The queue, the retries and the reconciliation do not depend on the tree: these run on revision 1
// of the built-in tree (a version diagnoses in progress may still be on), whose steps are all asked.
const version: TreeVersion = { id: 'tv-1', version: 1, graph: treeGraphSchema.parse(NO_HEAT_DSI_R1.graph) };
const DIAGNOSIS = 'd-1';

/** What the server would store for an answer it accepts (its band comes from the same tree). */
function echo(answer: PendingAnswer): ServerAnswer {
  return {
    clientId: answer.clientId,
    stepId: answer.stepId,
    kind: answer.kind,
    text: answer.text ?? null,
    value: answer.value ?? null,
    unit: answer.unit ?? null,
    band: null,
    verdict: null,
    choice: answer.choice ?? null,
    confirmed: answer.confirmed ?? null,
    at: '2025-01-01T00:00:00.000Z',
  };
}

function deferred<T>() {
  let resolve!: (v: T) => void;
  let reject!: (e: unknown) => void;
  const promise = new Promise<T>((res, rej) => {
    resolve = res;
    reject = rej;
  });
  return { promise, resolve, reject };
}

type SaveImpl = (answer: PendingAnswer, call: number) => Promise<SaveOutcome>;

function start({
  save = async (a) => ({ type: 'saved', answer: echo(a) }),
  view = { id: DIAGNOSIS, path: [] },
  pending,
  undo = async () => ({ id: DIAGNOSIS, path: [] }),
  load = async () => ({ id: DIAGNOSIS, path: [] }),
  clock,
}: {
  save?: SaveImpl;
  view?: WizardView;
  pending?: PendingAnswer[];
  undo?: () => Promise<WizardView>;
  load?: () => Promise<WizardView>;
  clock?: SimulatedClock;
} = {}) {
  const sent: PendingAnswer[] = [];
  const persisted: PendingAnswer[][] = [];
  const undoInputs: { diagnosisId: string; last?: string }[] = [];
  let loads = 0;
  const machine = wizardMachine.provide({
    actors: {
      saveAnswer: fromPromise(async ({ input }) => {
        sent.push(input.answer);
        return save(input.answer, sent.length);
      }),
      undoAnswer: fromPromise(async ({ input }) => {
        undoInputs.push(input);
        return undo();
      }),
      loadView: fromPromise(async () => {
        loads++;
        return load();
      }),
    },
    actions: {
      persistQueue: (_, params) => {
        persisted.push(params.pending);
      },
    },
  });
  const actor = createActor(machine, { input: { diagnosisId: DIAGNOSIS, version, view, pending }, ...(clock ? { clock } : {}) });
  actor.start();
  return {
    actor,
    sent,
    persisted,
    undoInputs,
    get loads() {
      return loads;
    },
    ctx: () => actor.getSnapshot().context,
  };
}

/** Lets the promise callbacks of invoked actors run. */
const flush = () => new Promise((r) => setTimeout(r, 0));

describe('wizard machine', () => {
  it('starts at the first step of the tree, synced', () => {
    const w = start();
    expect(w.ctx().stepId).toBe('line-voltage');
    expect(w.actor.getSnapshot().value).toBe('idle');
    expect(syncStatus(w.ctx(), false).text).toBe('Saved');
  });

  it('advances at once while the save is under way, then commits the answer', async () => {
    const gate = deferred<SaveOutcome>();
    const w = start({ save: () => gate.promise });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', unit: 'VAC', value: 120 } });

    // Optimistic: the next step of the tree is on screen before the server answered.
    expect(w.ctx().stepId).toBe('control-supply');
    expect(w.actor.getSnapshot().value).toBe('saving');
    expect(w.ctx().pending).toHaveLength(1);
    expect(syncStatus(w.ctx(), true).text).toBe('Saving…');
    expect(w.persisted.at(-1)).toHaveLength(1);

    gate.resolve({ type: 'saved', answer: { ...echo(w.sent[0]), band: 'Line voltage present', verdict: 'within' } });
    await flush();
    expect(w.actor.getSnapshot().value).toBe('idle');
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.ctx().saved.map((a) => a.stepId)).toEqual(['line-voltage']);
    expect(w.ctx().saved[0].band).toBe('Line voltage present');
    expect(w.ctx().stepId).toBe('control-supply');
    expect(w.persisted.at(-1)).toEqual([]);
    // Saved without a fetch of the whole diagnosis: nothing but the save was asked of the server.
    expect(w.loads).toBe(0);
  });

  it('ignores an answer to a step that is not on screen, and a reading that leads nowhere', () => {
    const w = start();
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'fuse-output', text: '24', value: 24 } });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', choice: 'calling' } });
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.ctx().stepId).toBe('line-voltage');
    expect(w.sent).toHaveLength(0);
  });

  it('retries a failed save with backoff, re-sending the same clientId, until it succeeds', async () => {
    const clock = new SimulatedClock();
    const w = start({
      clock,
      save: async (a, call) => {
        if (call <= 2) throw new Error('Failed to fetch');
        return { type: 'saved', answer: echo(a) };
      },
    });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    expect(w.actor.getSnapshot().value).toBe('waiting');
    expect(w.ctx().lastError).toBe('Failed to fetch');
    expect(syncStatus(w.ctx(), true).text).toBe('Not saved yet — 1 answer waiting, retrying');

    // First backoff is 1 s: nothing before it.
    clock.increment(999);
    await flush();
    expect(w.sent).toHaveLength(1);
    clock.increment(1);
    await flush();
    expect(w.sent).toHaveLength(2);
    expect(w.actor.getSnapshot().value).toBe('waiting');

    // Second backoff is 2 s.
    clock.increment(1999);
    await flush();
    expect(w.sent).toHaveLength(2);
    clock.increment(1);
    await flush();
    expect(w.sent).toHaveLength(3);
    expect(new Set(w.sent.map((a) => a.clientId)).size).toBe(1);
    expect(w.actor.getSnapshot().value).toBe('idle');
    expect(w.ctx().saved).toHaveLength(1);
    expect(w.ctx().attempts).toBe(0);
  });

  it('keeps answering offline, says how many wait, and sends them in order when back online', async () => {
    const clock = new SimulatedClock();
    let online = false;
    const w = start({
      clock,
      save: async (a) => {
        if (!online) throw new Error('Failed to fetch');
        return { type: 'saved', answer: echo(a) };
      },
    });
    w.actor.send({ type: 'network.offline' });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'control-supply', choice: 'low-voltage-only' } });
    await flush();
    expect(w.ctx().stepId).toBe('transformer-secondary');
    expect(w.ctx().pending.map((p) => p.stepId)).toEqual(['line-voltage', 'control-supply']);
    expect(syncStatus(w.ctx(), true).text).toBe('Offline — 2 answers waiting');

    online = true;
    w.actor.send({ type: 'network.online' });
    await flush();
    await flush();
    expect(w.ctx().saved.map((a) => a.stepId)).toEqual(['line-voltage', 'control-supply']);
    expect(w.ctx().pending).toHaveLength(0);
    // Sent in the order given: the first answer was tried once offline, then again online.
    expect(w.sent.map((a) => a.stepId)).toEqual(['line-voltage', 'line-voltage', 'control-supply']);
  });

  it('rolls back to the refused step with the server message, dropping later answers', async () => {
    const gate = deferred<SaveOutcome>();
    const w = start({ save: (_, call) => (call === 1 ? gate.promise : Promise.reject(new Error('not expected'))) });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'control-supply', choice: 'low-voltage-only' } });
    expect(w.ctx().stepId).toBe('transformer-secondary');

    gate.resolve({ type: 'refused', message: '120 VAC is outside the plausible range' });
    await flush();
    expect(w.ctx().stepId).toBe('line-voltage');
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.ctx().refusal).toEqual({
      stepId: 'line-voltage',
      message: '120 VAC is outside the plausible range',
      text: '120',
      unit: undefined,
    });
    expect(w.sent).toHaveLength(1);

    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '119', value: 119 } });
    expect(w.ctx().refusal).toBeNull();
  });

  it('on a 409 drops the queue and takes the server view', async () => {
    const elsewhere: WizardView = {
      id: DIAGNOSIS,
      path: [{ ...echo({ clientId: 'c-other', stepId: 'line-voltage', kind: 'measure', value: 50, text: '50', attempts: 0 }) }],
    };
    const w = start({
      save: async () => ({ type: 'conflict', message: 'This diagnosis is at "No line power".' }),
      load: async () => elsewhere,
    });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    await flush();
    expect(w.loads).toBe(1);
    expect(w.actor.getSnapshot().value).toBe('idle');
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.ctx().saved.map((a) => a.clientId)).toEqual(['c-other']);
    // 50 VAC at the unit is below the line-power band: the other device reached that finding.
    expect(w.ctx().findingId).toBe('f-no-line-power');
    expect(w.ctx().notice).toMatch(/reloaded/);
  });

  it('undoes the last saved answer through the server and shows the step again', async () => {
    const w = start();
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'control-supply', choice: 'low-voltage-only' } });
    await flush();
    expect(w.ctx().stepId).toBe('transformer-secondary');

    const first = w.ctx().saved[0];
    const server: WizardView = { id: DIAGNOSIS, path: [echo({ ...first, attempts: 0 })] };
    const undone = start({
      view: { id: DIAGNOSIS, path: w.ctx().saved.map((a) => echo({ ...a, attempts: 0 })) },
      undo: async () => server,
    });
    expect(undone.ctx().stepId).toBe('transformer-secondary');
    undone.actor.send({ type: 'answer.undo' });
    expect(undone.actor.getSnapshot().value).toBe('undoing');
    await flush();
    expect(undone.ctx().stepId).toBe('control-supply');
    expect(undone.ctx().saved).toHaveLength(1);
    // The undo names the answer it takes back, so a second undo sent at the same time is refused, not applied.
    expect(undone.undoInputs).toEqual([{ diagnosisId: DIAGNOSIS, last: w.ctx().saved.at(-1)?.clientId }]);
    expect(undone.loads).toBe(0);
  });

  it('does not undo while answers wait to be saved, nor with nothing to undo', async () => {
    const gate = deferred<SaveOutcome>();
    const w = start({ save: () => gate.promise });
    w.actor.send({ type: 'answer.undo' });
    expect(w.actor.getSnapshot().value).toBe('idle');
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    expect(w.actor.getSnapshot().can({ type: 'answer.undo' })).toBe(false);
    w.actor.send({ type: 'answer.undo' });
    expect(w.actor.getSnapshot().value).toBe('saving');
  });

  it('resends a stored queue after a reload, skipping what the server already holds', async () => {
    const held: PendingAnswer = { clientId: 'c-1', stepId: 'line-voltage', kind: 'measure', text: '120', value: 120, attempts: 3 };
    const waiting: PendingAnswer = { clientId: 'c-2', stepId: 'control-supply', kind: 'inspect', choice: 'low-voltage-only', attempts: 1 };
    const w = start({ view: { id: DIAGNOSIS, path: [echo(held)] }, pending: [held, waiting] });
    await flush();
    expect(w.sent.map((a) => a.clientId)).toEqual(['c-2']);
    expect(w.ctx().saved.map((a) => a.clientId)).toEqual(['c-1', 'c-2']);
    expect(w.ctx().stepId).toBe('transformer-secondary');
  });

  it('drops a stored answer that no longer follows from the server path', () => {
    const stale: PendingAnswer = { clientId: 'c-9', stepId: 'control-supply', kind: 'inspect', choice: 'low-voltage-only', attempts: 0 };
    // The server path is empty: control-supply is not the step on screen, so the stored answer cannot apply.
    const w = start({ pending: [stale], save: () => new Promise(() => {}) });
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.ctx().stepId).toBe('line-voltage');
  });

  it('ignores a view older than the answers it already saved', async () => {
    const w = start();
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    w.actor.send({ type: 'view.loaded', view: { id: DIAGNOSIS, path: [] } });
    expect(w.ctx().saved).toHaveLength(1);
    expect(w.ctx().stepId).toBe('control-supply');
  });

  it('inserts the lock-out procedure before a step that needs it, and tracks the energy state', async () => {
    const w = start();
    const answers = [
      { stepId: 'line-voltage', value: 120 },
      { stepId: 'control-supply', choice: 'low-voltage-only' },
      { stepId: 'transformer-secondary', value: 24 },
      { stepId: 'fuse-output', value: 24 },
      { stepId: 'thermostat-call', choice: 'calling' },
      { stepId: 'w-voltage', value: 24 },
      { stepId: 'control-th-input', value: 24 },
      { stepId: 'spark-observe', choice: 'at-gap' },
    ];
    for (const a of answers) w.actor.send({ type: 'answer.submit', answer: a });
    // spark-gap needs the unit locked out: the procedure comes first.
    expect(w.ctx().stepId).toBe('lock-out--spark-gap');
    expect(w.ctx().energy).toEqual({ electric: 'on', gas: 'on' });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'lock-out--spark-gap', confirmed: true } });
    expect(w.ctx().stepId).toBe('spark-gap');
    expect(w.ctx().energy).toEqual({ electric: 'off', gas: 'on' });
    await flush();
    await flush();
    expect(w.ctx().pending).toHaveLength(0);
    expect(
      pathItems(w.ctx())
        .map((p) => p.stepId)
        .at(-1),
    ).toBe('lock-out--spark-gap');
  });

  it('describes readings in the path with their band, saved or not', () => {
    const w = start({ save: () => new Promise(() => {}) });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', unit: 'VAC', value: 120 } });
    const [item] = pathItems(w.ctx());
    expect(item).toMatchObject({ stepId: 'line-voltage', text: '120', verdict: 'within', saved: false });
    expect(item.band).toBeTruthy();
  });

  it('backs off 1, 2, 4 … seconds, capped at 30 s', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 10].map(retryDelayMs)).toEqual([1000, 2000, 4000, 8000, 16000, 30000, 30000, 30000]);
  });

  it('holds the queue and stops retrying when the session has ended, until the user says they signed in again', async () => {
    let calls = 0;
    const w = start({
      save: async (a) => {
        calls++;
        return calls === 1 ? { type: 'signed-out', message: 'Your session has ended.' } : { type: 'saved', answer: echo(a) };
      },
    });
    w.actor.send({ type: 'answer.submit', answer: { stepId: 'line-voltage', text: '120', value: 120 } });
    await flush();
    expect(w.actor.getSnapshot().hasTag('signed-out')).toBe(true);
    expect(w.ctx().pending).toHaveLength(1);
    expect(w.ctx().notice).toMatch(/Sign in again — your answer is kept on this device/);
    expect(syncStatus(w.ctx(), true, true)).toMatchObject({ kind: 'signed-out' });
    // No timer brings it back: a second call only comes with retry.now.
    await new Promise((r) => setTimeout(r, 50));
    expect(calls).toBe(1);
    w.actor.send({ type: 'retry.now' });
    await flush();
    expect(calls).toBe(2);
    expect(w.ctx().pending).toHaveLength(0);
    expect(w.actor.getSnapshot().value).toBe('idle');
  });

  it('takes the finding check from the save that reaches the finding', async () => {
    const contradictions = [{ stepId: 'flame-signal', value: 4.8, expected: { to: 2 }, reason: 'A dirty rod reads low.' }];
    const w = start({
      save: async (a) => ({ type: 'saved', answer: echo(a), diagnosis: { status: 'found', contradictions } }),
    });
    // Walk until a finding: the first band or choice of every step, every procedure confirmed.
    for (let i = 0; i < 80 && !w.ctx().findingId; i++) {
      const step = version.graph.steps.find((s) => s.id === w.ctx().stepId);
      if (!step) {
        w.actor.send({ type: 'answer.submit', answer: { stepId: w.ctx().stepId, confirmed: true } });
      } else if (step.kind === 'measure') {
        const band = step.bands[0];
        const value = band.to !== undefined ? band.to - 0.001 : (band.from ?? 0) + 1;
        w.actor.send({ type: 'answer.submit', answer: { stepId: step.id, text: String(value), value } });
      } else if (step.kind === 'inspect') {
        w.actor.send({ type: 'answer.submit', answer: { stepId: step.id, choice: step.choices[0].value } });
      } else {
        w.actor.send({ type: 'answer.submit', answer: { stepId: step.id, confirmed: true } });
      }
      await flush();
    }
    expect(w.ctx().findingId).not.toBeNull();
    expect(w.ctx().findingCheck).toEqual({ findingId: w.ctx().findingId, contradictions });
    expect(w.loads).toBe(0);
  });
});
