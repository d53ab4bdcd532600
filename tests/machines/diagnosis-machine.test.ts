import { createActor } from 'xstate';
import {
  advance,
  createDiagnosisMachine,
  startState,
  walkStateOf,
  currentStep,
  getStep,
  LOCK_OUT_CHECKLIST,
  replayAnswers,
  type DiagnosisAnswer,
  type DiagnosisSnapshot,
} from '@/machines/diagnosis-machine';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { treeGraphSchema, type Band, type Step, type TreeVersion } from '@/lib/trees/schema';

const tree: TreeVersion = { id: 'tv-default', version: 1, graph: DEFAULT_TREE_GRAPH };

/** A value inside the band (not on its limits). */
function inside(band: Band): number {
  if (band.from !== undefined && band.to !== undefined) return (band.from + band.to) / 2;
  if (band.to !== undefined) return band.to > 0 ? band.to / 2 : band.to - 1;
  if (band.from !== undefined) return band.from > 0 ? band.from * 2 : band.from + 1;
  return 0;
}

/** One answer per way out of the step: a value per band, each choice, or the confirmation. */
function answersFor(step: Step): DiagnosisAnswer[] {
  switch (step.kind) {
    case 'measure':
      return step.bands.map((b) => ({ stepId: step.id, value: inside(b) }));
    case 'inspect':
      return step.choices.map((c) => ({ stepId: step.id, choice: c.value }));
    case 'action':
      return [{ stepId: step.id, confirmed: true }];
    case 'finding':
      return [];
  }
}

interface Walk {
  answers: DiagnosisAnswer[];
  /** Each state entered, with the energy the diagnosis was in when it entered it. */
  visits: { stateId: string; step: Step; energy: string }[];
  findingId: string;
}

/** Every path through the tree, explored with the machine itself. */
function explore(version: TreeVersion): Walk[] {
  const walks: Walk[] = [];
  const visit = (answers: DiagnosisAnswer[], visits: Walk['visits']) => {
    const r = replayAnswers(version, answers);
    if (!r.ok) throw new Error(`replay failed at ${r.index}: ${r.error}`);
    const snap = r.snapshot;
    const step = currentStep(snap);
    const here = [...visits, { stateId: step.id, step, energy: snap.context.energy }];
    if (snap.hasTag('finding')) {
      walks.push({ answers, visits: here, findingId: snap.context.findingId! });
      return;
    }
    const next = answersFor(step);
    expect(next.length, step.id).toBeGreaterThan(0);
    for (const a of next) visit([...answers, a], here);
  };
  visit([], []);
  return walks;
}

const walks = explore(tree);

function start(version: TreeVersion = tree) {
  const actor = createActor(createDiagnosisMachine(version), { input: { treeVersionId: version.id, version: version.version } });
  actor.start();
  return actor;
}

function stateOf(snap: DiagnosisSnapshot) {
  return { value: snap.value, context: snap.context };
}

describe('diagnosis machine on the default tree', () => {
  it('reaches every finding by some answer sequence', () => {
    const findings = DEFAULT_TREE_GRAPH.steps.filter((s) => s.kind === 'finding').map((s) => s.id);
    const reached = new Set(walks.map((w) => w.findingId));
    expect([...reached].sort()).toEqual([...findings].sort());
  });

  it('never enters a step in the wrong energy state, and locks out before the first locked-out step', () => {
    // OSHA 29 CFR 1910.147: no work on parts that may be live without lockout; live checks need power.
    expect(walks.length).toBeGreaterThan(40);
    for (const w of walks) {
      let lockedOutSeen = false;
      w.visits.forEach((v, i) => {
        const where = `${w.findingId}: ${w.visits.map((x) => x.stateId).join(' > ')} at ${v.stateId}`;
        if (v.step.energy === 'locked-out') expect(v.energy, where).toBe('locked-out');
        if (v.step.energy === 'energized') expect(v.energy, where).toBe('energized');
        if (v.step.energy === 'locked-out' && !lockedOutSeen) {
          expect(w.visits[i - 1]?.stateId, where).toBe(`lock-out--${v.stateId}`);
          lockedOutSeen = true;
        }
        // The energy only changes across a confirmed procedure.
        if (i > 0 && v.energy !== w.visits[i - 1].energy) {
          expect(w.visits[i - 1].stateId, where).toMatch(v.energy === 'locked-out' ? /^lock-out--/ : /^re-energize--/);
        }
      });
    }
  });

  it('inserts the lock-out and re-energize procedures as action steps with their checklists', () => {
    const lock = getStep(tree, 'lock-out--spark-gap');
    expect(lock).toMatchObject({ kind: 'action', title: 'Lock out and verify', outcome: 'spark-gap' });
    expect(lock?.kind === 'action' && lock.checklist).toEqual(LOCK_OUT_CHECKLIST);
    expect(lock?.kind === 'action' && lock.checklist.join(' ')).toMatch(/live, dead, live/);
    expect(lock?.cautions.length).toBeGreaterThan(0);
    const re = getStep(tree, 're-energize--valve-voltage');
    expect(re).toMatchObject({ kind: 'action', outcome: 'valve-voltage' });
    expect(re?.kind === 'action' && re.checklist.join(' ')).toMatch(/removed by the person who placed them/);
    // No procedure for a step that does not need one, nor for an unknown step.
    expect(getStep(tree, 'lock-out--valve-voltage')).toBeUndefined();
    expect(getStep(tree, 'lock-out--nothing')).toBeUndefined();
  });

  it('walks a path with the lock-out inserted and records it', () => {
    const actor = start();
    const send = actor.send.bind(actor);
    send({ type: 'answer.measure', stepId: 'line-voltage', value: 121 });
    send({ type: 'answer.choose', stepId: 'control-supply', choice: 'low-voltage-only' });
    send({ type: 'answer.measure', stepId: 'transformer-secondary', value: 25 });
    send({ type: 'answer.measure', stepId: 'fuse-output', value: 25 });
    send({ type: 'answer.choose', stepId: 'thermostat-call', choice: 'calling' });
    send({ type: 'answer.measure', stepId: 'w-voltage', value: 25 });
    send({ type: 'answer.measure', stepId: 'control-th-input', value: 25 });
    send({ type: 'answer.choose', stepId: 'spark-observe', choice: 'heard-not-seen' });
    let snap = actor.getSnapshot();
    expect(currentStep(snap).id).toBe('lock-out--spark-lead-inspect');
    expect(snap.context.energy).toBe('energized');
    expect(snap.hasTag('procedure')).toBe(true);
    send({ type: 'answer.confirm', stepId: 'lock-out--spark-lead-inspect' });
    snap = actor.getSnapshot();
    expect(currentStep(snap).id).toBe('spark-lead-inspect');
    expect(snap.context.energy).toBe('locked-out');
    send({ type: 'answer.choose', stepId: 'spark-lead-inspect', choice: 'lead-broken' });
    snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'f-broken-spark-lead' });
    expect(snap.context.findingId).toBe('f-broken-spark-lead');
    expect(snap.status).toBe('active');
    expect(snap.context.path.map((p) => p.stepId)).toEqual([
      'line-voltage',
      'control-supply',
      'transformer-secondary',
      'fuse-output',
      'thermostat-call',
      'w-voltage',
      'control-th-input',
      'spark-observe',
      'lock-out--spark-lead-inspect',
      'spark-lead-inspect',
    ]);
    expect(snap.context.path[0]).toMatchObject({
      kind: 'measure',
      value: 121,
      bandIndex: 1,
      outcome: 'control-supply',
      energyBefore: 'energized',
    });
    expect(snap.context.path[8]).toMatchObject({ kind: 'action', confirmed: true, energyBefore: 'energized' });
    expect(snap.context.path[9]).toMatchObject({ kind: 'inspect', choice: 'lead-broken', energyBefore: 'locked-out' });
  });

  it('sends a value exactly on a band limit to the upper band', () => {
    const actor = start();
    actor.send({ type: 'answer.measure', stepId: 'line-voltage', value: 108 });
    expect(currentStep(actor.getSnapshot()).id).toBe('control-supply');
    const low = start();
    low.send({ type: 'answer.measure', stepId: 'line-voltage', value: 107.999 });
    expect(currentStep(low.getSnapshot()).id).toBe('f-no-line-power');
    const high = start();
    high.send({ type: 'answer.measure', stepId: 'line-voltage', value: 132 });
    expect(currentStep(high.getSnapshot()).id).toBe('f-line-voltage-high');
  });

  it('ignores an answer for another step', () => {
    const actor = start();
    const before = actor.getSnapshot();
    const wrong = { type: 'answer.measure', stepId: 'transformer-secondary', value: 24 } as const;
    expect(before.can(wrong)).toBe(false);
    actor.send(wrong);
    actor.send({ type: 'answer.choose', stepId: 'control-supply', choice: 'line-powered' });
    actor.send({ type: 'answer.confirm', stepId: 'lock-out--spark-gap' });
    expect(stateOf(actor.getSnapshot())).toEqual(stateOf(before));
    expect(before.can({ type: 'answer.measure', stepId: 'line-voltage', value: 120 })).toBe(true);
    // A non-finite value and an unknown choice are refused too.
    expect(before.can({ type: 'answer.measure', stepId: 'line-voltage', value: Number.NaN })).toBe(false);
  });

  it('undoes the last answer, restoring the state and the energy', () => {
    const r = replayAnswers(tree, walks.find((w) => w.findingId === 'f-dirty-flame-rod')!.answers);
    expect(r.ok).toBe(true);
    const actor = r.actor;
    let snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'f-dirty-flame-rod' });
    const pathLength = snap.context.path.length;

    actor.send({ type: 'answer.undo' });
    snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'rod-inspect' });
    expect(snap.context.findingId).toBeNull();
    expect(snap.context.path).toHaveLength(pathLength - 1);
    expect(snap.context.energy).toBe('locked-out');

    actor.send({ type: 'answer.undo' });
    snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'lock-out--rod-inspect' });
    // Undoing the lock-out confirmation puts the diagnosis back to energized.
    expect(snap.context.energy).toBe('energized');
    actor.send({ type: 'answer.undo' });
    snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'flame-signal' });
    expect(snap.context.energy).toBe('energized');
  });

  it('undo at the start changes nothing', () => {
    const actor = start();
    const before = actor.getSnapshot();
    expect(before.can({ type: 'answer.undo' })).toBe(false);
    actor.send({ type: 'answer.undo' });
    expect(stateOf(actor.getSnapshot())).toEqual(stateOf(before));
  });

  it('resumes by replay to the same snapshot as the live walk', () => {
    for (const w of walks.filter((_, i) => i % 7 === 0)) {
      const live = start();
      for (const a of w.answers) {
        const step = currentStep(live.getSnapshot());
        if (step.kind === 'measure') live.send({ type: 'answer.measure', stepId: a.stepId, value: a.value! });
        else if (step.kind === 'inspect') live.send({ type: 'answer.choose', stepId: a.stepId, choice: a.choice! });
        else live.send({ type: 'answer.confirm', stepId: a.stepId });
      }
      const half = w.answers.slice(0, Math.ceil(w.answers.length / 2));
      const replayed = replayAnswers(tree, w.answers);
      expect(replayed.ok).toBe(true);
      expect(stateOf(replayed.snapshot)).toEqual(stateOf(live.getSnapshot()));
      expect(replayed.snapshot.context.findingId).toBe(w.findingId);
      // And resuming half-way then answering the rest ends in the same place.
      const partial = replayAnswers(tree, half);
      for (const a of w.answers.slice(half.length)) {
        const step = currentStep(partial.actor.getSnapshot());
        partial.actor.send(
          step.kind === 'measure'
            ? { type: 'answer.measure', stepId: a.stepId, value: a.value! }
            : step.kind === 'inspect'
              ? { type: 'answer.choose', stepId: a.stepId, choice: a.choice! }
              : { type: 'answer.confirm', stepId: a.stepId },
        );
      }
      expect(stateOf(partial.actor.getSnapshot())).toEqual(stateOf(live.getSnapshot()));
    }
  });

  it('moves on one transition at a time from a kept state exactly as a replay of the whole path does', () => {
    // The server keeps only (state, energy) on the diagnosis row and calls advance. Every finding,
    // by one path each, and a spread of the other paths.
    const sample = walks.filter((w, i) => i % 25 === 0 || walks.findIndex((x) => x.findingId === w.findingId) === i);
    expect(new Set(sample.map((w) => w.findingId)).size).toBe(new Set(walks.map((w) => w.findingId)).size);
    for (const w of sample) {
      const live = start();
      let state = startState(tree);
      expect(state).toEqual(walkStateOf(live.getSnapshot()));
      for (const [i, a] of w.answers.entries()) {
        const moved = advance(tree, state, a);
        expect(moved.ok, `${w.findingId} answer ${i}`).toBe(true);
        if (!moved.ok) break;
        state = moved.state;
        const step = currentStep(live.getSnapshot());
        live.send(
          step.kind === 'measure'
            ? { type: 'answer.measure', stepId: a.stepId, value: a.value! }
            : step.kind === 'inspect'
              ? { type: 'answer.choose', stepId: a.stepId, choice: a.choice! }
              : { type: 'answer.confirm', stepId: a.stepId },
        );
        expect(state).toEqual(walkStateOf(live.getSnapshot()));
        expect(moved.step.id).toBe(state.stateId);
      }
      expect(state.findingId).toBe(w.findingId);
    }
  });

  it('refuses from a kept state what a replay refuses: another step, or an answer that leads nowhere', () => {
    const state = startState(tree);
    const first = getStep(tree, state.stateId)!;
    const other = tree.graph.steps.find((s) => s.id !== first.id && s.kind === 'measure')!;
    expect(advance(tree, state, { stepId: other.id, value: 1 }).ok).toBe(false);
    if (first.kind === 'measure') expect(advance(tree, state, { stepId: first.id }).ok).toBe(false);
    expect(advance(tree, { ...state, stateId: 'no-such-step' }, { stepId: 'no-such-step', confirmed: true }).ok).toBe(false);
  });

  it('reports the index of a saved answer that does not fit', () => {
    const r = replayAnswers(tree, [
      { stepId: 'line-voltage', value: 120 },
      { stepId: 'control-supply', choice: 'no-such-choice' },
    ]);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.index).toBe(1);
      expect(r.snapshot.value).toEqual({ walk: 'control-supply' });
    }
    const skipped = replayAnswers(tree, [{ stepId: 'control-supply', choice: 'line-powered' }]);
    expect(skipped).toMatchObject({ ok: false, index: 0, error: expect.stringMatching(/diagnosis is at "line-voltage"/) });
    const noValue = replayAnswers(tree, [{ stepId: 'line-voltage' }]);
    expect(noValue).toMatchObject({ ok: false, index: 0, error: expect.stringMatching(/needs a reading/) });
  });
});

describe('diagnosis machine on a tree that starts locked out', () => {
  const graph = treeGraphSchema.parse({
    start: 'gap',
    steps: [
      {
        id: 'gap',
        kind: 'measure',
        title: 'Gap',
        energy: 'locked-out',
        quantity: 'length',
        points: ['rod', 'ground'],
        bands: [
          { to: 0.2, label: 'ok', verdict: 'within', outcome: 'volts' },
          { from: 0.2, label: 'wide', verdict: 'above', outcome: 'f-wide' },
        ],
      },
      {
        id: 'volts',
        kind: 'measure',
        title: 'Volts',
        energy: 'energized',
        quantity: 'vac',
        points: ['a', 'b'],
        bands: [
          { to: 18, label: 'low', verdict: 'below', outcome: 'f-low' },
          { from: 18, label: 'ok', verdict: 'within', outcome: 'f-wide' },
        ],
      },
      { id: 'f-wide', kind: 'finding', title: 'Wide', energy: 'any', explanation: 'e', remedy: 'r', verification: ['v'] },
      { id: 'f-low', kind: 'finding', title: 'Low', energy: 'any', explanation: 'e', remedy: 'r', verification: ['v'] },
    ],
  });
  const small: TreeVersion = { id: 'tv-small', version: 3, graph };

  it('begins with the lock-out procedure and re-energizes before a live step', () => {
    const actor = start(small);
    expect(actor.getSnapshot().value).toEqual({ walk: 'lock-out--gap' });
    expect(actor.getSnapshot().context).toMatchObject({ treeVersionId: 'tv-small', version: 3, energy: 'energized' });
    actor.send({ type: 'answer.confirm', stepId: 'lock-out--gap' });
    actor.send({ type: 'answer.measure', stepId: 'gap', value: 0.125 });
    expect(actor.getSnapshot().value).toEqual({ walk: 're-energize--volts' });
    actor.send({ type: 'answer.confirm', stepId: 're-energize--volts' });
    expect(actor.getSnapshot().context.energy).toBe('energized');
    actor.send({ type: 'answer.measure', stepId: 'volts', value: 5 });
    expect(actor.getSnapshot().context.findingId).toBe('f-low');
  });
});
