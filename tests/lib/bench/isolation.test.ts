import { allBenchUnits, isolateFault, isolationCheck } from '@/lib/bench/isolation';
import { FAULTS, faultFits } from '@/lib/bench';
import { NO_HEAT_DSI_R2 } from '@/lib/trees/builtin/no-heat-dsi-r2';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { treeGraphSchema, type MeasureStep, type TreeGraph } from '@/lib/trees/schema';

// The isolation check: every fault of the bench's library through a tree, the bench answering each
// step. What each fault does to a furnace, and so which finding isolates it, is common practice, no
// source (TRADE.md: the DSI sequence, the safety circuit, flame rectification); the library says it
// as each fault's expectedFindingTags.

const clone = (g: TreeGraph): TreeGraph => JSON.parse(JSON.stringify(g));
const measureOf = (g: TreeGraph, id: string) => g.steps.find((s) => s.id === id) as MeasureStep;
const misses = (rows: ReturnType<typeof isolationCheck>) =>
  rows.filter((r) => !r.ok).map((r) => `${JSON.stringify(r.unit)} ${r.faultId} → ${r.reachedStepId}: ${r.reason}`);

describe('the isolation check of the default tree (revision 3)', () => {
  it('isolates every fault of the library on the default bench unit', () => {
    const rows = isolationCheck(DEFAULT_TREE_GRAPH);
    expect(rows.map((r) => r.faultId)).toEqual(FAULTS.map((f) => f.id));
    expect(misses(rows)).toEqual([]);
    for (const r of rows) {
      const finding = DEFAULT_TREE_GRAPH.steps.find((s) => s.id === r.reachedStepId);
      expect(finding?.kind, r.faultId).toBe('finding');
      expect(finding?.kind === 'finding' && finding.tags, r.faultId).toEqual(expect.arrayContaining(r.expectedFindingTags));
    }
  });

  it('isolates every fault that exists on each unit profile, single-rod (both control tests) and natural-draft included', () => {
    const covered = new Set<string>();
    for (const unit of allBenchUnits()) {
      const flameTests =
        unit.ignition === 'single-rod' ? (['dc-test-terminals', 'status-light'] as const) : (['dc-test-terminals'] as const);
      for (const flameTest of flameTests) {
        const rows = isolationCheck(DEFAULT_TREE_GRAPH, { unit, flameTest });
        expect(rows.length, JSON.stringify(unit)).toBe(FAULTS.filter((f) => faultFits(f, unit)).length);
        expect(misses(rows)).toEqual([]);
        for (const r of rows) covered.add(r.faultId);
      }
    }
    expect(covered).toEqual(new Set(FAULTS.map((f) => f.id)));
  });

  it('reads the flame signal on a single-rod unit at the control, never with a meter in the rod lead', () => {
    const row = isolateFault(DEFAULT_TREE_GRAPH, 'dirty-flame-rod', { unit: { ignition: 'single-rod' } });
    expect(row.ok).toBe(true);
    const ids = row.path.map((p) => p.stepId);
    expect(ids).toContain('control-flame-voltage');
    expect(ids).not.toContain('flame-signal');
    expect(ids).not.toContain('connect-microammeter');
  });

  it('answers the same on a replay (seeded meter noise)', () => {
    expect(isolationCheck(DEFAULT_TREE_GRAPH, { seed: 7 })).toEqual(isolationCheck(DEFAULT_TREE_GRAPH, { seed: 7 }));
  });
});

describe('the isolation check catches a tree that does not isolate', () => {
  it('reports a miss for a deliberately mis-wired band, and only for the faults it affects', () => {
    const g = clone(DEFAULT_TREE_GRAPH);
    // "No 24 V past the fuse" sent to the thermostat question instead of the blown-fuse finding.
    const fuse = measureOf(g, 'fuse-output');
    fuse.bands[0].outcome = 'thermostat-call';
    const rows = isolationCheck(g);
    const bad = rows.filter((r) => !r.ok);
    expect(bad.map((r) => r.faultId)).toEqual(['blown-fuse']);
    expect(bad[0].reachedStepId).not.toBe('f-blown-fuse');
    expect(bad[0].reason).toMatch(/lacks the tags/);
  });

  it('reports a miss when a band limit is in the wrong place (a closed switch read as open)', () => {
    const g = clone(DEFAULT_TREE_GRAPH);
    const limit = measureOf(g, 'high-limit-across');
    // About 0 V across a closed switch now falls in the "open" band.
    limit.bands = [
      { to: -1, label: 'Below zero', verdict: 'below', outcome: 'rollout-continuity' },
      { from: -1, label: 'Voltage across: the high limit is open', verdict: 'above', outcome: 'f-open-high-limit' },
    ];
    const row = isolateFault(g, 'tripped-rollout');
    expect(row).toMatchObject({ ok: false, reachedStepId: 'f-open-high-limit' });
  });

  it('ends a run as not ok, with the reason, at a step the bench cannot answer', () => {
    // Revision 2 says where to measure only in words.
    const r2 = treeGraphSchema.parse(NO_HEAT_DSI_R2.graph);
    const rows = isolationCheck(r2);
    expect(rows.every((r) => !r.ok)).toBe(true);
    expect(rows[0]).toMatchObject({ reachedStepId: 'line-voltage', reason: expect.stringMatching(/no probe/) });
    const g = clone(DEFAULT_TREE_GRAPH);
    const look = g.steps.find((s) => s.id === 'rod-inspect')!;
    if (look.kind === 'inspect') delete look.observe;
    expect(isolateFault(g, 'dirty-flame-rod')).toMatchObject({
      ok: false,
      reachedStepId: 'rod-inspect',
      reason: expect.stringMatching(/no observation/),
    });
  });

  it('refuses, as the bench does, an ohms reading a tree asks for with the power on', () => {
    const g = clone(DEFAULT_TREE_GRAPH);
    measureOf(g, 'rollout-continuity').energy = { electric: 'on', gas: 'any' };
    expect(isolateFault(g, 'tripped-rollout')).toMatchObject({
      ok: false,
      reachedStepId: 'rollout-continuity',
      reason: expect.stringMatching(/Ohms only with the power off/),
    });
  });

  it('stops a walk that would fire the burners with the gas left off', () => {
    const g = clone(DEFAULT_TREE_GRAPH);
    // The manifold reading no longer says it needs the gas on, after the manometer was moved with it off.
    measureOf(g, 'manifold-pressure').energy = { electric: 'on', gas: 'any' };
    expect(isolateFault(g, 'gas-valve-not-opening')).toMatchObject({
      ok: false,
      reachedStepId: 'manifold-pressure',
      reason: expect.stringMatching(/gas left off/),
    });
  });

  it('says so for a fault that is not in the library or not on the unit', () => {
    expect(isolateFault(DEFAULT_TREE_GRAPH, 'no-such-fault')).toMatchObject({ ok: false, reachedStepId: null });
    expect(isolateFault(DEFAULT_TREE_GRAPH, 'vent-blocked', { unit: { draft: 'natural' } })).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/does not exist on this unit/),
    });
  });
});
