import { createActor } from 'xstate';
import {
  advance,
  changesFor,
  createDiagnosisMachine,
  currentStep,
  getStep,
  phaseOf,
  replayAnswers,
  startState,
  walkStateOf,
  type DiagnosisSnapshot,
} from '@/machines/diagnosis-machine';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { treeGraphSchema, type TreeVersion, type UnitFacts } from '@/lib/trees/schema';
import { explore } from '../support/walk-tree';

const tree: TreeVersion = { id: 'tv-default', version: 3, graph: DEFAULT_TREE_GRAPH };
const unit: UnitFacts = { ignition: 'two-rod', fuel: 'natural-gas', controlSupply: '24v', draft: 'induced' };
const walks = explore(tree, [unit]);

function start(version: TreeVersion = tree) {
  const actor = createActor(createDiagnosisMachine(version), { input: { treeVersionId: version.id, version: version.version } });
  actor.start();
  return actor;
}

function stateOf(snap: DiagnosisSnapshot) {
  return { value: snap.value, context: snap.context };
}

describe('energy changes', () => {
  it('turns off before it turns on, gas back before power, and changes only what the step needs', () => {
    // Isolate power and gas before work; on the way back gas is leak-tested before power returns
    // (OSHA 29 CFR 1910.147 for the lock; the order is common practice, no source).
    expect(changesFor({ electric: 'off', gas: 'off' }, { electric: 'on', gas: 'on' })).toEqual(['lock-out', 'gas-off']);
    expect(changesFor({ electric: 'on', gas: 'on' }, { electric: 'off', gas: 'off' })).toEqual(['gas-on', 're-energize']);
    expect(changesFor({ electric: 'on', gas: 'any' }, { electric: 'off', gas: 'off' })).toEqual(['re-energize']);
    expect(changesFor({ electric: 'any', gas: 'any' }, { electric: 'off', gas: 'on' })).toEqual([]);
    expect(changesFor({ electric: 'on', gas: 'off' }, { electric: 'off', gas: 'on' })).toEqual(['gas-off', 're-energize']);
  });

  it('inserts one procedure with every change the next step needs, as an action step with its checklist', () => {
    const both = getStep(tree, 'lock-out+gas-off--burner-inspect');
    expect(both).toMatchObject({ kind: 'action', outcome: 'burner-inspect' });
    const list = both?.kind === 'action' ? both.checklist.join(' ') : '';
    expect(list).toMatch(/live, dead, live/);
    expect(list).toMatch(/Manual shut-off valve/);
    const back = getStep(tree, 'gas-on+re-energize--manifold-pressure');
    expect(back?.kind === 'action' && back.checklist.join(' ')).toMatch(/leak-tested/);
    expect(back?.kind === 'action' && back.checklist.join(' ')).toMatch(/removed by the person who placed them/);
    // Only change sets a step's need can call for; the first revision's ids still name the electric ones.
    expect(getStep(tree, 'lock-out--spark-gap')).toMatchObject({ kind: 'action', outcome: 'spark-gap' });
    expect(getStep(tree, 'lock-out--valve-voltage')).toBeUndefined();
    expect(getStep(tree, 'gas-off--line-voltage')).toBeUndefined();
    expect(getStep(tree, 'lock-out--nothing')).toBeUndefined();
  });
});

describe('diagnosis machine on the default tree', () => {
  it('walks a no-spark path to a broken lead, the lock-out inserted, the unit-record branches taken from the record', () => {
    const r = replayAnswers(
      tree,
      [
        { stepId: 'line-voltage', value: 121 },
        { stepId: 'trial-observe', choice: 'no-spark' },
        { stepId: 'transformer-secondary', value: 25 },
        { stepId: 'fuse-output', value: 25 },
        { stepId: 'thermostat-call', choice: 'calling' },
        { stepId: 'w-voltage', value: 25 },
        { stepId: 'control-th-input', value: 25 },
        { stepId: 'inducer-runs', choice: 'runs' },
        { stepId: 'pressure-switch-across', value: 0.2 },
        { stepId: 'spark-listen', choice: 'ticking' },
      ],
      { unit },
    );
    expect(r.ok).toBe(true);
    let snap = r.snapshot;
    expect(currentStep(snap).id).toBe('lock-out--spark-lead-inspect');
    expect(snap.context.energy).toEqual({ electric: 'on', gas: 'on' });
    expect(snap.hasTag('procedure')).toBe(true);
    r.actor.send({ type: 'answer.confirm', stepId: 'lock-out--spark-lead-inspect' });
    r.actor.send({ type: 'answer.choose', stepId: 'spark-lead-inspect', choice: 'lead-broken' });
    snap = r.actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'f-broken-spark-lead' });
    expect(snap.context.findingId).toBe('f-broken-spark-lead');
    expect(snap.context.energy).toEqual({ electric: 'off', gas: 'on' });
    // The record's answers are on the path as answers of their own.
    expect(snap.context.path.filter((p) => p.kind === 'fact').map((p) => [p.stepId, p.choice])).toEqual([
      ['control-supply', '24v'],
      ['draft', 'induced'],
    ]);
    expect(snap.context.path[0]).toMatchObject({ kind: 'measure', value: 121, bandIndex: 1, outcome: 'trial-observe' });
  });

  it('goes on after the finding: repair, restore both sources, the checks, done', () => {
    const r = replayAnswers(
      tree,
      [
        { stepId: 'line-voltage', value: 120 },
        { stepId: 'trial-observe', choice: 'lights-drops' },
        { stepId: 'neutral-ground', value: 0.3 },
        { stepId: 'hot-ground', value: 120 },
        { stepId: 'lock-out--connect-microammeter', confirmed: true },
        { stepId: 'connect-microammeter', confirmed: true },
        { stepId: 're-energize--flame-signal', confirmed: true },
        { stepId: 'flame-signal', value: 0.6 },
        { stepId: 'carry-over', choice: 'carries' },
        { stepId: 'lock-out--rod-inspect', confirmed: true },
        { stepId: 'rod-inspect', choice: 'dirty' },
      ],
      { unit },
    );
    expect(r.ok).toBe(true);
    const send = r.actor.send.bind(r.actor);
    const at = () => walkStateOf(r.actor.getSnapshot()).stateId;
    expect(at()).toBe('f-dirty-flame-rod');
    expect(phaseOf(tree, at())).toBe('repair');
    send({ type: 'answer.confirm', stepId: 'f-dirty-flame-rod' });
    // The meter goes back in series with the power still off, then power returns for the reading.
    expect(at()).toBe('reconnect--flame-signal--f-dirty-flame-rod');
    send({ type: 'answer.confirm', stepId: at() });
    expect(at()).toBe('re-energize--recheck--flame-signal--f-dirty-flame-rod');
    send({ type: 'answer.confirm', stepId: at() });
    expect(at()).toBe('recheck--flame-signal--f-dirty-flame-rod');
    send({ type: 'answer.measure', stepId: at(), value: 4.1 });
    expect(at()).toBe('verify--f-dirty-flame-rod');
    const verify = getStep(tree, at());
    expect(verify?.kind === 'action' && verify.checklist).toEqual(
      (DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'f-dirty-flame-rod') as { verification: string[] }).verification,
    );
    send({ type: 'answer.confirm', stepId: at() });
    expect(at()).toBe('done--f-dirty-flame-rod');
    expect(phaseOf(tree, at())).toBe('done');
    expect(r.actor.getSnapshot().context.readings['recheck--flame-signal--f-dirty-flame-rod']).toBe(4.1);
    // Undo still works at the end, back to the checks.
    send({ type: 'answer.undo' });
    expect(at()).toBe('verify--f-dirty-flame-rod');
    expect(r.actor.getSnapshot().context.findingId).toBe('f-dirty-flame-rod');
  });

  it('on a single-rod unit retakes the flame signal at the control after the repair, and only that one', () => {
    const singleRod: UnitFacts = { ...unit, ignition: 'single-rod' };
    const r = replayAnswers(
      tree,
      [
        { stepId: 'line-voltage', value: 120 },
        { stepId: 'trial-observe', choice: 'lights-drops' },
        { stepId: 'neutral-ground', value: 0.3 },
        { stepId: 'hot-ground', value: 120 },
        { stepId: 'control-flame-test', choice: 'test-terminals' },
        { stepId: 'lock-out--connect-flame-test-meter', confirmed: true },
        { stepId: 'connect-flame-test-meter', confirmed: true },
        { stepId: 're-energize--control-flame-voltage', confirmed: true },
        { stepId: 'control-flame-voltage', value: 0.5 },
        { stepId: 'carry-over', choice: 'carries' },
        { stepId: 'lock-out--rod-inspect', confirmed: true },
        { stepId: 'rod-inspect', choice: 'dirty' },
      ],
      { unit: singleRod },
    );
    expect(r.ok).toBe(true);
    const send = r.actor.send.bind(r.actor);
    const at = () => walkStateOf(r.actor.getSnapshot()).stateId;
    expect(at()).toBe('f-dirty-flame-rod');
    send({ type: 'answer.confirm', stepId: 'f-dirty-flame-rod' });
    // The walk never read microamps: the meter goes back on the test terminals, not in the rod lead.
    expect(at()).toBe('reconnect--control-flame-voltage--f-dirty-flame-rod');
    send({ type: 'answer.confirm', stepId: at() });
    expect(at()).toBe('re-energize--recheck--control-flame-voltage--f-dirty-flame-rod');
    send({ type: 'answer.confirm', stepId: at() });
    expect(at()).toBe('recheck--control-flame-voltage--f-dirty-flame-rod');
    send({ type: 'answer.measure', stepId: at(), value: 4.3 });
    expect(at()).toBe('verify--f-dirty-flame-rod');
  });

  it('sends a value exactly on a band limit to the upper band, and OL to the band open above', () => {
    const actor = start();
    actor.send({ type: 'answer.measure', stepId: 'line-voltage', value: 108 });
    expect(currentStep(actor.getSnapshot()).id).toBe('trial-observe');
    const low = start();
    low.send({ type: 'answer.measure', stepId: 'line-voltage', value: 107.999 });
    expect(currentStep(low.getSnapshot()).id).toBe('f-no-line-power');
    const open = replayAnswers(
      tree,
      [
        { stepId: 'line-voltage', value: 120 },
        { stepId: 'trial-observe', choice: 'no-spark' },
        { stepId: 'transformer-secondary', value: 25 },
        { stepId: 'fuse-output', value: 25 },
        { stepId: 'thermostat-call', choice: 'calling' },
        { stepId: 'w-voltage', value: 25 },
        { stepId: 'control-th-input', value: 2 },
        { stepId: 'high-limit-across', value: 0 },
        { stepId: 'lock-out--rollout-continuity', confirmed: true },
        { stepId: 'rollout-continuity', overRange: true },
      ],
      { unit },
    );
    expect(open.ok).toBe(true);
    // The rollout's repair needs the gas off too: that procedure comes first.
    expect(walkStateOf(open.snapshot).stateId).toBe('gas-off--f-tripped-rollout');
    open.actor.send({ type: 'answer.confirm', stepId: 'gas-off--f-tripped-rollout' });
    expect(open.actor.getSnapshot().context.findingId).toBe('f-tripped-rollout');
    // OL is for resistance only.
    const volts = replayAnswers(tree, [{ stepId: 'line-voltage', overRange: true }]);
    expect(volts).toMatchObject({ ok: false, index: 0, error: expect.stringMatching(/not a resistance/) });
  });

  it('refuses a reading in a band that asks again, and an answer for another step', () => {
    const before = start().getSnapshot();
    expect(before.can({ type: 'answer.measure', stepId: 'transformer-secondary', value: 24 })).toBe(false);
    expect(before.can({ type: 'answer.measure', stepId: 'line-voltage', value: Number.NaN })).toBe(false);
    const flame = walks.find((w) => w.answers.some((a) => a.stepId === 'flame-signal'))!;
    const upTo = flame.answers.slice(
      0,
      flame.answers.findIndex((a) => a.stepId === 'flame-signal'),
    );
    const r = replayAnswers(tree, upTo, { unit });
    expect(currentStep(r.snapshot).id).toBe('flame-signal');
    expect(r.snapshot.can({ type: 'answer.measure', stepId: 'flame-signal', value: -1.8 })).toBe(false);
    expect(r.snapshot.can({ type: 'answer.measure', stepId: 'flame-signal', value: 1.8 })).toBe(true);
  });

  it('undoes the last answer, restoring the state, the energy and the readings', () => {
    const w = walks.find((x) => x.findingId === 'f-dirty-flame-rod')!;
    const toFinding = w.answers.slice(
      0,
      w.answers.findIndex((a) => a.stepId === 'f-dirty-flame-rod'),
    );
    const r = replayAnswers(tree, toFinding, { unit });
    const actor = r.actor;
    expect(actor.getSnapshot().value).toEqual({ walk: 'f-dirty-flame-rod' });
    actor.send({ type: 'answer.undo' });
    let snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'rod-inspect' });
    expect(snap.context.findingId).toBeNull();
    expect(snap.context.energy.electric).toBe('off');
    actor.send({ type: 'answer.undo' });
    snap = actor.getSnapshot();
    expect(snap.value).toEqual({ walk: 'lock-out--rod-inspect' });
    expect(snap.context.energy.electric).toBe('on');
    const start0 = start();
    expect(start0.getSnapshot().can({ type: 'answer.undo' })).toBe(false);
  });

  it('resumes by replay to the same snapshot as the live walk, and half-way then onward', () => {
    for (const w of walks.filter((_, i) => i % 9 === 0)) {
      const whole = replayAnswers(tree, w.answers, { unit });
      expect(whole.ok, w.findingId).toBe(true);
      expect(phaseOf(tree, walkStateOf(whole.snapshot).stateId)).toBe('done');
      // The unit-record answers can be left out: a replay with the record takes the same branches.
      const withoutFacts = replayAnswers(
        tree,
        w.answers.filter((a) => !a.auto),
        { unit },
      );
      expect(stateOf(withoutFacts.snapshot).value).toEqual(stateOf(whole.snapshot).value);
      const half = replayAnswers(tree, w.answers.slice(0, Math.ceil(w.answers.length / 2)), { unit });
      for (const a of w.answers.slice(Math.ceil(w.answers.length / 2))) {
        const step = currentStep(half.actor.getSnapshot());
        half.actor.send(
          step.kind === 'measure'
            ? { type: 'answer.measure', stepId: a.stepId, value: a.overRange ? Number.POSITIVE_INFINITY : a.value! }
            : step.kind === 'inspect'
              ? { type: 'answer.choose', stepId: a.stepId, choice: a.choice! }
              : step.kind === 'fact'
                ? { type: 'answer.fact', stepId: a.stepId, value: a.choice! }
                : { type: 'answer.confirm', stepId: a.stepId },
        );
      }
      expect(stateOf(half.actor.getSnapshot())).toEqual(stateOf(whole.snapshot));
    }
  });

  it('moves on one transition at a time from a kept state exactly as a replay of the whole path does', () => {
    // The server keeps only (state, energy) on the diagnosis row and calls advance, giving it the
    // unit record and the earlier reading a relative band needs.
    const sample = walks.filter((w, i) => i % 11 === 0 || walks.findIndex((x) => x.findingId === w.findingId) === i);
    expect(new Set(sample.map((w) => w.findingId)).size).toBe(new Set(walks.map((w) => w.findingId)).size);
    for (const w of sample) {
      let { state } = startState(tree, unit);
      const readings: Record<string, number> = {};
      const manual = w.answers.filter((a) => !a.auto);
      for (const [i, a] of manual.entries()) {
        const moved = advance(tree, state, a, { unit, readings });
        expect(moved.ok, `${w.findingId} answer ${i} ${a.stepId}`).toBe(true);
        if (!moved.ok) break;
        if (a.value !== undefined) readings[a.stepId] = a.value;
        state = moved.state;
        const replay = replayAnswers(tree, manual.slice(0, i + 1), { unit });
        expect(state).toEqual(walkStateOf(replay.snapshot));
        expect(moved.step.id).toBe(state.stateId);
      }
      expect(state.findingId).toBe(w.findingId);
    }
  });

  it('says which saved answer does not fit', () => {
    const r = replayAnswers(tree, [
      { stepId: 'line-voltage', value: 120 },
      { stepId: 'trial-observe', choice: 'no-such-choice' },
    ]);
    expect(r).toMatchObject({ ok: false, index: 1 });
    expect(replayAnswers(tree, [{ stepId: 'trial-observe', choice: 'no-spark' }])).toMatchObject({
      ok: false,
      index: 0,
      error: expect.stringMatching(/diagnosis is at "line-voltage"/),
    });
    expect(replayAnswers(tree, [{ stepId: 'line-voltage' }])).toMatchObject({ ok: false, error: expect.stringMatching(/needs a reading/) });
  });
});

describe('diagnosis machine on a tree that starts locked out (first-revision energy words)', () => {
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

  it('reads "locked-out" and "energized" as the electric need, and begins with the lock-out', () => {
    expect(graph.steps[0].energy).toEqual({ electric: 'off', gas: 'any' });
    const actor = start(small);
    expect(actor.getSnapshot().value).toEqual({ walk: 'lock-out--gap' });
    actor.send({ type: 'answer.confirm', stepId: 'lock-out--gap' });
    actor.send({ type: 'answer.measure', stepId: 'gap', value: 0.125 });
    expect(actor.getSnapshot().value).toEqual({ walk: 're-energize--volts' });
    actor.send({ type: 'answer.confirm', stepId: 're-energize--volts' });
    actor.send({ type: 'answer.measure', stepId: 'volts', value: 5 });
    expect(actor.getSnapshot().context.findingId).toBe('f-low');
    // No readings to retake: the repair goes straight to the checks.
    actor.send({ type: 'answer.confirm', stepId: 'f-low' });
    expect(walkStateOf(actor.getSnapshot()).stateId).toBe('verify--f-low');
  });
});
