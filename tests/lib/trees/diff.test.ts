import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { bandRange, diffGraphs, fieldText, isEmptyDiff } from '@/lib/trees/diff';
import { treeGraphSchema } from '@/lib/trees/schema';

// The diff of two tree versions on a known pair (revision 1 and 2 of the built-in tree, whose step
// lists are read here from the two files independently of the diff) and on a small hand-made pair.

const r1 = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);
const r2 = DEFAULT_TREE_GRAPH;
const copy = <T>(v: T): T => JSON.parse(JSON.stringify(v));

describe('revision 1 → revision 2 of the built-in tree', () => {
  const diff = diffGraphs(r1, r2);
  const ids1 = new Set(r1.steps.map((s) => s.id));
  const ids2 = new Set(r2.steps.map((s) => s.id));

  it('lists exactly the steps only one side has', () => {
    expect(new Set(diff.added.map((s) => s.stepId))).toEqual(new Set([...ids2].filter((id) => !ids1.has(id))));
    expect(new Set(diff.removed.map((s) => s.stepId))).toEqual(new Set([...ids1].filter((id) => !ids2.has(id))));
    // Known from the two files: revision 2 added the unit-record branch on draft and the control's own
    // flame test, and dropped the first revision's "burners light" question.
    expect(diff.added.map((s) => s.stepId)).toEqual(expect.arrayContaining(['draft', 'control-flame-test', 'f-inducer-motor']));
    expect(diff.removed.map((s) => s.stepId)).toContain('burners-light');
  });

  it('reports changed steps only among those both have, each with at least one field', () => {
    for (const c of diff.changed) {
      expect(ids1.has(c.stepId) && ids2.has(c.stepId)).toBe(true);
      expect(c.fields.length).toBeGreaterThan(0);
      for (const f of c.fields) expect(f.before).not.toBe(f.after);
    }
    // Revision 2 states the energy of both sources for every step; revision 1 only electricity.
    expect(diff.changed.some((c) => c.fields.some((f) => f.field === 'energy'))).toBe(true);
  });

  it('is empty for a version against itself, and the other way round swaps added and removed', () => {
    expect(isEmptyDiff(diffGraphs(r2, copy(r2)))).toBe(true);
    const back = diffGraphs(r2, r1);
    expect(back.added.map((s) => s.stepId).sort()).toEqual(diff.removed.map((s) => s.stepId).sort());
    expect(back.removed.map((s) => s.stepId).sort()).toEqual(diff.added.map((s) => s.stepId).sort());
  });
});

describe('a band boundary moved and a choice rewired', () => {
  const before = copy(r2);
  const after = copy(r2);
  const flame = after.steps.find((s) => s.id === 'flame-signal');
  if (flame?.kind !== 'measure') throw new Error('flame-signal is a measure step');
  const low = flame.bands.findIndex((b) => b.label === 'Low flame signal');
  flame.bands[low].to = 1.5;
  flame.bands[low + 1].from = 1.5;
  const inspect = after.steps.find((s) => s.kind === 'inspect');
  if (inspect?.kind !== 'inspect') throw new Error('an inspect step');
  const oldTarget = inspect.choices[0].outcome;
  inspect.choices[0].outcome = 'f-control-not-sensing';
  const diff = diffGraphs(before, after);

  it('shows the bands as ranges in the canonical unit', () => {
    const change = diff.changed.find((c) => c.stepId === 'flame-signal');
    const bands = change?.fields.find((f) => f.field === 'bands');
    expect(bands?.before).toContain('[0.1, 2) µA "Low flame signal"');
    expect(bands?.after).toContain('[0.1, 1.5) µA "Low flame signal"');
    expect(bands?.after).toContain('[1.5, +∞) µA "Good flame signal"');
    expect(change?.fields.map((f) => f.field)).toEqual(['bands']);
  });

  it('lists the choice as rewired, not as a changed field', () => {
    expect(diff.rewired).toEqual([
      { stepId: inspect.id, via: `choice "${inspect.choices[0].value}"`, before: oldTarget, after: 'f-control-not-sensing' },
    ]);
    expect(diff.changed.find((c) => c.stepId === inspect.id)).toBeUndefined();
  });

  it('writes open limits as infinities', () => {
    expect(bandRange({ label: 'Negative', to: 0 }, 'udc')).toBe('[−∞, 0) µA "Negative"');
    expect(bandRange({ label: 'Any', from: 1 }, 'nonsense')).toBe('[1, +∞) "Any"');
  });
});

describe('drafts that do not pass the schema', () => {
  it('still compare, step by step', () => {
    const diff = diffGraphs(
      { start: 'a', steps: [{ id: 'a', kind: 'inspect', choices: [] }] },
      { start: 'b', steps: [{ id: 'b' }, 'junk'] },
    );
    expect(diff.start).toEqual({ before: 'a', after: 'b' });
    expect(diff.removed.map((s) => s.stepId)).toEqual(['a']);
    expect(diff.added.map((s) => s.stepId)).toEqual(['b']);
    expect(isEmptyDiff(diffGraphs(null, undefined))).toBe(true);
  });
});

describe('fields as a person reads them', () => {
  it('says cautions by signal word, choices by label, the probe and the observation in words', () => {
    const base = {
      id: 's',
      kind: 'inspect',
      title: 'Watch the spark',
      cautions: [{ signal: 'WARNING', text: 'Line voltage at the control.' }],
      choices: [
        { value: 'good', label: 'Sparks', outcome: 'next' },
        { value: 'none', label: 'No spark', outcome: '' },
      ],
      observe: { what: 'spark', at: 'proving', choices: { 'at-gap': 'good', none: 'none' } },
    };
    expect(fieldText(base, 'cautions')).toBe('WARNING: Line voltage at the control.');
    expect(fieldText(base, 'choices')).toBe('Sparks (good)\nNo spark (none)');
    expect(fieldText(base, 'choices', { targets: true })).toBe('Sparks (good) → next\nNo spark (none) → not connected');
    expect(fieldText(base, 'observe')).toBe(
      'The spark at the spark rod, during the trial for ignition\nSparks across the gap → Sparks (good)\nNone → No spark (none)',
    );
    expect(fieldText({ probe: { a: 'xfmr-hot', b: 'xfmr-common' } }, 'probe')).toBe(
      'Leads on Transformer secondary, 24 V side (R) and Transformer secondary, common (C)',
    );
    expect(fieldText({ probe: { series: 'flame-rod-lead' } }, 'probe')).toBe('In series in the flame-rod lead');
    expect(fieldText({ energy: { electric: 'off', gas: 'any' } }, 'energy')).toBe('electricity off, gas either');
  });

  it('lists a changed caution in the diff in words', () => {
    const before = copy(r2);
    const after = copy(r2);
    const step = after.steps.find((s) => s.id === 'flame-signal')!;
    step.cautions = [...step.cautions, { signal: 'CAUTION', text: 'Hot surfaces.' }];
    const field = diffGraphs(before, after).changed[0].fields.find((f) => f.field === 'cautions');
    expect(field?.after).toContain('CAUTION: Hot surfaces.');
    expect(field?.after).not.toContain('{');
  });
});
