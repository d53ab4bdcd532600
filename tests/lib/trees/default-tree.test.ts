import { DEFAULT_TREE, DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { outgoingEdges, stepMap } from '@/lib/trees/graph';
import type { FindingStep, MeasureStep, Step } from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';

const graph = DEFAULT_TREE_GRAPH;
const steps = stepMap(graph);
const findings = graph.steps.filter((s): s is FindingStep => s.kind === 'finding');
const measures = graph.steps.filter((s): s is MeasureStep => s.kind === 'measure');

/** Every path from the start, as the list of [step, edge index] pairs ending at a finding. */
function allPaths(): { finding: FindingStep; taken: { step: Step; band?: number }[] }[] {
  const out: { finding: FindingStep; taken: { step: Step; band?: number }[] }[] = [];
  const walk = (id: string, taken: { step: Step; band?: number }[]) => {
    const step = steps.get(id)!;
    if (step.kind === 'finding') return out.push({ finding: step, taken });
    for (const edge of outgoingEdges(step)) {
      walk(edge.to, [...taken, { step, band: edge.via.kind === 'band' ? edge.via.index : undefined }]);
    }
  };
  walk(graph.start, []);
  return out;
}

describe('DEFAULT_TREE', () => {
  it('passes the validator', () => {
    const r = validateGraph(DEFAULT_TREE.graph);
    expect(r.ok ? [] : r.problems).toEqual([]);
  });

  it('has its identity', () => {
    expect(DEFAULT_TREE).toMatchObject({
      slug: 'no-heat-dsi',
      title: 'No heat — direct spark ignition',
      symptom: 'No heat',
      equipmentKind: 'dsi-furnace',
    });
  });

  it('uses all four step kinds and has at least 20 findings', () => {
    expect(new Set(graph.steps.map((s) => s.kind))).toEqual(new Set(['measure', 'inspect', 'action', 'finding']));
    expect(findings.length).toBeGreaterThanOrEqual(20);
  });

  it('isolates every fault the product brief lists', () => {
    // The fault list of the product brief (BRIEF.md, "The default fault tree"), mapped to finding ids.
    const faults: Record<string, string> = {
      'no line power': 'f-no-line-power',
      'open transformer': 'f-open-transformer',
      'blown control fuse': 'f-blown-fuse',
      'no call for heat': 'f-no-call-for-heat',
      'open high limit': 'f-open-high-limit',
      'tripped rollout switch': 'f-tripped-rollout',
      'broken spark lead': 'f-broken-spark-lead',
      'cracked lead insulation': 'f-cracked-lead-insulation',
      'gap too wide or rod bent': 'f-spark-gap-or-rod',
      'control not sparking': 'f-control-not-sparking',
      'no valve voltage from the control': 'f-no-valve-voltage-from-control',
      'low valve voltage from wiring resistance': 'f-valve-wiring-resistance',
      'gas valve not opening with 24 V': 'f-gas-valve-not-opening',
      'no gas or low gas pressure': 'f-no-gas-or-low-pressure',
      'blocked orifices': 'f-blocked-orifices',
      'rusted carry-over': 'f-rusted-carry-over',
      'dirty or oxidized flame rod': 'f-dirty-flame-rod',
      'cracked rod ceramic': 'f-cracked-rod-ceramic',
      'open or loose ground lead': 'f-open-ground-lead',
      'control not sensing a good signal': 'f-control-not-sensing',
    };
    const reached = new Set(allPaths().map((p) => p.finding.id));
    for (const [fault, id] of Object.entries(faults)) {
      expect(steps.get(id)?.kind, fault).toBe('finding');
      expect(reached.has(id), fault).toBe(true);
    }
    expect(reached).toEqual(new Set(findings.map((f) => f.id)));
  });

  it('follows the isolation order of the brief along the healthy path', () => {
    // The path where every check passes, up to the flame signal.
    const healthy: string[] = [];
    let id = graph.start;
    const pass: Record<string, string> = {
      'control-supply': 'low-voltage-only',
      'thermostat-call': 'calling',
      'spark-observe': 'at-gap',
      'rod-condition': 'good',
      'fuel-type': 'natural-gas',
      'burners-light': 'light',
      'carry-over': 'carries',
      'rod-inspect': 'good',
      'burner-surface': 'clean',
    };
    const goodBand: Record<string, number> = { 'flame-signal': 1, 'ground-path': 0 };
    for (;;) {
      const step = steps.get(id)!;
      healthy.push(id);
      if (step.kind === 'finding') break;
      if (step.kind === 'action') id = step.outcome;
      else if (step.kind === 'inspect') id = step.choices.find((c) => c.value === pass[id])!.outcome;
      else id = step.bands[goodBand[id] ?? step.bands.findIndex((b) => b.verdict === 'within')].outcome;
    }
    // BRIEF.md's order: line power → 24 V and fuse → thermostat call → safety circuit to the control
    // input → spark → gap and rod → valve voltage → gas → carry-over → flame signal → rod, ceramic,
    // burner surface, ground → the control.
    const order = [
      'line-voltage',
      'transformer-secondary',
      'fuse-output',
      'thermostat-call',
      'w-voltage',
      'control-th-input',
      'spark-observe',
      'spark-gap',
      'rod-condition',
      'valve-voltage',
      'inlet-pressure',
      'manifold-pressure',
      'burners-light',
      'carry-over',
      'flame-signal',
      'rod-inspect',
      'burner-surface',
      'ground-path',
      'f-control-not-sensing',
    ];
    expect(healthy.filter((s) => order.includes(s))).toEqual(order);
  });

  it('declares energy as the trade requires', () => {
    for (const s of graph.steps) {
      if (s.kind === 'finding') expect(s.energy, s.id).toBe('any');
      if (s.kind !== 'measure') continue;
      // Live readings need power; ohms and the gap gauge need the unit de-energized
      // (OSHA 29 CFR 1910.147; an ohmmeter on a live circuit also reads wrong — common practice, no source).
      const live = ['vac', 'vdc', 'udc', 'pressure'].includes(s.quantity);
      expect(s.energy, s.id).toBe(live ? 'energized' : 'locked-out');
    }
    for (const id of ['spark-lead-inspect', 'arcing-inspect', 'rod-condition', 'rod-inspect', 'burner-inspect', 'connect-microammeter']) {
      expect(steps.get(id)!.energy, id).toBe('locked-out');
    }
    expect(steps.get('thermostat-call')!.energy).toBe('any');
  });

  it('gives every measure step bands a value can fall in, with a note', () => {
    for (const s of measures) {
      expect(s.bandsNote, s.id).toMatch(/common practice, no source/);
      expect(s.bands[0].from, s.id).toBeUndefined();
      expect(s.bands[0].to, s.id).toBeGreaterThan(0);
    }
  });

  it('uses the quantities the brief names for its measurements', () => {
    const q = (id: string) => (steps.get(id) as MeasureStep).quantity;
    expect(q('line-voltage')).toBe('vac');
    expect(q('transformer-secondary')).toBe('vac');
    expect(q('valve-voltage')).toBe('vac');
    expect(q('flame-signal')).toBe('udc');
    expect(q('spark-gap')).toBe('length');
    expect(q('manifold-pressure')).toBe('pressure');
    expect(q('ground-path')).toBe('ohm');
    expect(q('rollout-continuity')).toBe('ohm');
  });

  it('bands match the trade values', () => {
    const bands = (id: string) => (steps.get(id) as MeasureStep).bands;
    // Flame signal: below about 2 µA is getting low — common practice, no source (TRADE.md).
    expect(bands('flame-signal').map((b) => [b.from, b.to])).toEqual([
      [undefined, 0.1],
      [0.1, 2],
      [2, undefined],
    ]);
    // Spark gap about 1/8 in = 0.125 in — common practice, no source (TRADE.md).
    const gap = bands('spark-gap').find((b) => b.verdict === 'within')!;
    expect(0.125).toBeGreaterThanOrEqual(gap.from!);
    expect(0.125).toBeLessThan(gap.to!);
    // Natural gas manifold about 3.5 inWC — common practice, no source (TRADE.md).
    const manifold = bands('manifold-pressure').find((b) => b.verdict === 'within')!;
    expect(3.5).toBeGreaterThanOrEqual(manifold.from!);
    expect(3.5).toBeLessThan(manifold.to!);
    // 24 VAC control circuit — common practice, no source.
    const secondary = bands('transformer-secondary').find((b) => b.verdict === 'within')!;
    expect(24).toBeGreaterThanOrEqual(secondary.from!);
    expect(24).toBeLessThan(secondary.to!);
    // 120 VAC line — common practice, no source.
    const line = bands('line-voltage').find((b) => b.verdict === 'within')!;
    expect(120).toBeGreaterThanOrEqual(line.from!);
    expect(120).toBeLessThan(line.to!);
  });

  it('puts real cautions on the dangerous steps', () => {
    const signals = (id: string) => steps.get(id)!.cautions.map((c) => c.signal);
    const text = (id: string) =>
      steps
        .get(id)!
        .cautions.map((c) => c.text)
        .join(' ');
    expect(text('line-voltage')).toMatch(/Line voltage/);
    expect(text('flame-signal')).toMatch(/line-powered control keeps it/);
    expect(text('spark-observe')).toMatch(/10 kV/);
    expect(text('inlet-pressure')).toMatch(/smell gas/);
    expect(signals('rollout-continuity')).toContain('DANGER');
    expect(signals('f-tripped-rollout')).toContain('DANGER');
    expect(text('f-tripped-rollout')).toMatch(/Do not reset/);
    for (const s of graph.steps) {
      for (const c of s.cautions) {
        // Every caution defers to codes, the manufacturer and licensed practice (BRIEF.md, "caution").
        expect(c.text, s.id).toMatch(/local codes, the equipment manufacturer's instructions and licensed practice\.$/);
      }
    }
  });

  it('explains most steps and completes every finding', () => {
    const nonFinding = graph.steps.filter((s) => s.kind !== 'finding');
    expect(nonFinding.filter((s) => s.why).length / nonFinding.length).toBeGreaterThan(0.8);
    for (const f of findings) {
      expect(f.verification.length, f.id).toBeGreaterThan(0);
      expect(f.tags.length, f.id).toBeGreaterThan(0);
    }
    const dirty = steps.get('f-dirty-flame-rod') as FindingStep;
    expect(dirty.expects).toContainEqual(expect.objectContaining({ step: 'flame-signal', to: 2 }));
    expect((steps.get('f-no-line-power') as FindingStep).expects).toContainEqual(
      expect.objectContaining({ step: 'line-voltage', to: 108 }),
    );
  });

  it('never contradicts itself: on every path, each band taken lies inside what the finding expects of that step', () => {
    const paths = allPaths();
    expect(paths.length).toBeGreaterThan(findings.length);
    for (const { finding, taken } of paths) {
      for (const { step, band } of taken) {
        if (step.kind !== 'measure' || band === undefined) continue;
        const b = step.bands[band];
        for (const exp of finding.expects.filter((e) => e.step === step.id)) {
          const lo = b.from ?? -Infinity;
          const hi = b.to ?? Infinity;
          const where = `${finding.id} via ${step.id} band ${band}`;
          expect(lo, where).toBeGreaterThanOrEqual(exp.from ?? -Infinity);
          expect(hi, where).toBeLessThanOrEqual(exp.to ?? Infinity);
        }
      }
    }
  });

  it('branches on the fuel so LP readings meet LP bands', () => {
    const bandFor = (id: string, value: number) =>
      (steps.get(id) as MeasureStep).bands.find((b) => (b.from ?? -Infinity) <= value && value < (b.to ?? Infinity))!;
    // Natural-gas manifold about 3.5 inWC, LP about 10–11 inWC: TRADE.md, common practice, no source.
    expect(bandFor('manifold-pressure', 3.5)).toMatchObject({ verdict: 'within', outcome: 'burners-light' });
    expect(bandFor('lp-manifold-pressure', 10.5)).toMatchObject({ verdict: 'within', outcome: 'burners-light' });
    // An LP setting read against the natural-gas bands would be "high": the reason for the branch.
    expect(bandFor('manifold-pressure', 10.5).verdict).toBe('above');
    expect(bandFor('lp-manifold-pressure', 3.5).verdict).toBe('below');
    const fuel = steps.get('fuel-type');
    expect(fuel?.kind === 'inspect' && fuel.choices.map((c) => c.outcome)).toEqual(['inlet-pressure', 'lp-inlet-pressure']);
  });
});
