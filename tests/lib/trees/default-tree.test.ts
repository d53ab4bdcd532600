// The built-in tree, revision 3, against the trade: every path of the whole visit walked with the
// machine for every combination of unit facts. Where a check is about a defect of revision 1 (or 2),
// it is run on that revision too and must find the defect there (so the check can fail).
import { DEFAULT_TREE, DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import { NO_HEAT_DSI_R1 } from '@/lib/trees/builtin/no-heat-dsi-r1';
import { NO_HEAT_DSI_R2 } from '@/lib/trees/builtin/no-heat-dsi-r2';
import { DC_TEST_TERMINALS } from '@/lib/trees/control-profiles';
import { stepMap } from '@/lib/trees/graph';
import {
  treeGraphSchema,
  type FindingStep,
  type InspectStep,
  type MeasureStep,
  type TreeGraph,
  type TreeVersion,
} from '@/lib/trees/schema';
import { validateGraph } from '@/lib/trees/validate';
import { findBand, shiftedBands } from '@/lib/bands';
import { explore, manualAnswers, visitsBefore, type Walk } from '../../support/walk-tree';

const graph = DEFAULT_TREE_GRAPH;
const r1Graph: TreeGraph = treeGraphSchema.parse(NO_HEAT_DSI_R1.graph);
const r2Graph: TreeGraph = treeGraphSchema.parse(NO_HEAT_DSI_R2.graph);
const tree: TreeVersion = { id: 'tv-r3', version: 3, graph };
const r1: TreeVersion = { id: 'tv-r1', version: 1, graph: r1Graph };
const steps = stepMap(graph);
const findings = graph.steps.filter((s): s is FindingStep => s.kind === 'finding');
const measure = (id: string) => steps.get(id) as MeasureStep;
const inspect = (id: string) => steps.get(id) as InspectStep;

const walks = explore(tree);
const r1Walks = explore(r1);

const where = (w: Walk, at?: string) => `${JSON.stringify(w.unit)} ${w.visits.map((v) => v.stateId).join(' > ')}${at ? ` @ ${at}` : ''}`;

/** Steps entered with an energy source on that the step (or the repair at a finding) handles parts of. */
function handlingLive(ws: Walk[]): string[] {
  const out: string[] = [];
  for (const w of ws) {
    for (const v of w.visits) {
      // A finding's repair with parts to fit is handling them, whatever the author declared.
      const handles = new Set(v.step.handles);
      if (v.step.kind === 'finding' && v.step.parts.length > 0) handles.add('electric');
      for (const source of handles) if (v.energy[source] !== 'off') out.push(where(w, `${v.stateId} (${source} on)`));
    }
  }
  return out;
}

describe('the built-in tree, revision 3', () => {
  it('passes the validator and has its identity', () => {
    const r = validateGraph(DEFAULT_TREE.graph);
    expect(r.ok ? [] : r.problems).toEqual([]);
    expect(DEFAULT_TREE).toMatchObject({ slug: 'no-heat-dsi', title: 'No heat — direct spark ignition', revision: 3 });
    expect(NO_HEAT_DSI_R1.revision).toBe(1);
    expect(NO_HEAT_DSI_R2.revision).toBe(2);
    const r2 = validateGraph(NO_HEAT_DSI_R2.graph);
    expect(r2.ok ? [] : r2.problems).toEqual([]);
  });

  it('keeps the step ids, titles and choices of revision 2 where it can, and adds the single-rod test steps', () => {
    const r2Steps = stepMap(r2Graph);
    const changed = ['control-flame-test'];
    for (const old of r2Graph.steps) {
      const now = steps.get(old.id);
      expect(now, old.id).toBeDefined();
      if (changed.includes(old.id)) continue;
      expect(now!.title, old.id).toBe(old.title);
      expect(now!.kind, old.id).toBe(old.kind);
      if (old.kind === 'inspect') expect((now as InspectStep).choices, old.id).toEqual(old.choices);
      if (old.kind === 'measure') expect((now as MeasureStep).bands, old.id).toEqual(old.bands);
    }
    const added = graph.steps.filter((s) => !r2Steps.has(s.id)).map((s) => s.id);
    expect(added.sort()).toEqual(['connect-flame-test-meter', 'control-flame-voltage', 'control-status-light']);
  });

  it('says where every reading is taken and what every look observes, so the bench can answer each step; revision 2 did not', () => {
    for (const s of graph.steps) {
      if (s.kind === 'measure') expect(s.probe, s.id).toBeDefined();
      if (s.kind === 'inspect') expect(s.observe, s.id).toBeDefined();
    }
    expect(r2Graph.steps.some((s) => (s.kind === 'measure' && s.probe) || (s.kind === 'inspect' && s.observe))).toBe(false);
    // A reading of the valve or the gas only exists while the control powers the valve (TRADE.md, the DSI sequence).
    for (const id of ['valve-voltage', 'control-valve-output', 'inlet-pressure', 'manifold-pressure', 'flame-signal']) {
      expect(measure(id).at, id).toBe('proving');
    }
  });

  it('reaches every finding, and every walk goes on through repair, restore and verification to the end', () => {
    expect(walks.length).toBeGreaterThan(500);
    expect(new Set(walks.map((w) => w.findingId))).toEqual(new Set(findings.map((f) => f.id)));
    for (const w of walks) {
      const phases = w.visits.map((v) => v.phase);
      const repair = phases.indexOf('repair');
      expect(repair, where(w)).toBeGreaterThan(0);
      expect(phases.at(-1), where(w)).toBe('done');
      // The checks come last, with power and gas back on.
      const verify = w.visits.findIndex((v) => v.phase === 'verify');
      expect(verify, where(w)).toBeGreaterThan(repair);
      expect(w.visits[verify].energy, where(w)).toEqual({ electric: 'on', gas: 'on' });
    }
  });

  it('isolates every fault the product brief lists', () => {
    // The fault list of the product brief (BRIEF.md, "The default fault tree"), mapped to finding ids.
    const faults = [
      'f-no-line-power',
      'f-open-transformer',
      'f-blown-fuse',
      'f-no-call-for-heat',
      'f-open-high-limit',
      'f-tripped-rollout',
      'f-broken-spark-lead',
      'f-cracked-lead-insulation',
      'f-spark-gap-or-rod',
      'f-control-not-sparking',
      'f-no-valve-voltage-from-control',
      'f-valve-wiring-resistance',
      'f-gas-valve-not-opening',
      'f-no-gas-or-low-pressure',
      'f-blocked-orifices',
      'f-rusted-carry-over',
      'f-dirty-flame-rod',
      'f-cracked-rod-ceramic',
      'f-open-ground-lead',
      'f-control-not-sensing',
    ];
    const reached = new Set(walks.map((w) => w.findingId));
    for (const id of faults) expect(reached.has(id), id).toBe(true);
  });

  // ── Safety ────────────────────────────────────────────────────────────────────────────────────
  it('never has anyone handle a part with its energy on; revision 1 did (findings never locked out)', () => {
    // Lockout/tagout before servicing: OSHA 29 CFR 1910.147; gas isolated before a gas part is opened:
    // common practice, no source.
    expect(handlingLive(walks)).toEqual([]);
    expect(handlingLive(r1Walks).length).toBeGreaterThan(0);
  });

  it('enters every step in the energy state it declares, changing it only across a confirmed procedure', () => {
    for (const w of walks) {
      w.visits.forEach((v, i) => {
        for (const source of ['electric', 'gas'] as const) {
          const need = v.step.energy[source];
          if (need !== 'any') expect(v.energy[source], where(w, v.stateId)).toBe(need);
          if (i > 0 && v.energy[source] !== w.visits[i - 1].energy[source]) {
            expect(w.visits[i - 1].phase, where(w, v.stateId)).toBe('procedure');
          }
        }
      });
    }
  });

  it('ends the blown-fuse walk locked out before the fuse is changed', () => {
    const fuse = walks.filter((w) => w.findingId === 'f-blown-fuse');
    expect(fuse.length).toBeGreaterThan(0);
    for (const w of fuse) {
      const at = w.visits.findIndex((v) => v.stateId === 'f-blown-fuse');
      expect(w.visits[at].energy.electric, where(w)).toBe('off');
      expect(w.visits[at - 1].stateId, where(w)).toMatch(/^lock-out.*--f-blown-fuse$/);
    }
    // Revision 1 ended that walk energized.
    expect(
      r1Walks
        .filter((w) => w.findingId === 'f-blown-fuse')
        .every((w) => w.visits.find((v) => v.stateId === 'f-blown-fuse')!.energy.electric === 'on'),
    ).toBe(true);
  });

  it('isolates the gas before burners come out, and leak-tests before the gas comes back', () => {
    for (const id of ['burner-inspect', 'connect-manometer', 'move-manometer', 'remove-manometer']) {
      expect(steps.get(id)!.energy.gas, id).toBe('off');
    }
    for (const w of walks) {
      w.visits.forEach((v, i) => {
        if (i > 0 && w.visits[i - 1].energy.gas === 'off' && v.energy.gas === 'on') {
          const procedure = w.visits[i - 1];
          expect(procedure.stateId, where(w)).toMatch(/gas-on/);
          expect(procedure.step.kind === 'action' && procedure.step.checklist.join(' '), where(w)).toMatch(/leak-tested/);
          expect(procedure.step.kind === 'action' && procedure.step.checklist.join(' '), where(w)).toMatch(
            /pressure tap you opened closed/,
          );
        }
      });
    }
    // Revision 1 told the technician to remove the burners with the gas never isolated.
    expect(r1Graph.steps.find((s) => s.id === 'burner-inspect')!.energy.gas).toBe('any');
  });

  it('never puts a meter in series on a single-rod unit, whose rod lead carries the spark; revision 1 did', () => {
    // A single-rod unit sparks and senses on one rod (TRADE.md); the meter in the rod lead would be in
    // the ~10 kV spark circuit.
    const series = (w: Walk) =>
      w.visits.some((v) => v.stateId.includes('connect-microammeter') || (v.step.kind === 'measure' && v.step.quantity === 'udc'));
    const single = walks.filter((w) => w.unit.ignition === 'single-rod');
    expect(single.length).toBeGreaterThan(0);
    expect(single.filter(series).map((w) => where(w))).toEqual([]);
    expect(single.some((w) => w.visits.some((v) => v.stateId === 'control-flame-test'))).toBe(true);
    // Both of the control's own tests are reached on a single-rod unit, each with the DANGER caution.
    for (const id of ['control-flame-test', 'connect-flame-test-meter', 'control-flame-voltage', 'control-status-light']) {
      expect(
        single.some((w) => w.visits.some((v) => v.stateId === id)),
        id,
      ).toBe(true);
      expect(
        steps.get(id)!.cautions.map((c) => c.signal),
        id,
      ).toContain('DANGER');
    }
    expect(walks.filter((w) => w.unit.ignition === 'two-rod' && w.visits.some((v) => v.stateId === 'control-flame-test'))).toEqual([]);
    expect(inspect('control-status-light').note?.required).toBe(true);
    // The test terminals are read in DC volts with the meter on the control, never on the rod or its lead.
    const volts = measure('control-flame-voltage');
    expect(volts.quantity).toBe('vdc');
    expect(volts.probe).toEqual({ a: 'flame-test-plus', b: 'flame-test-minus' });
    // The bands are the control profile's (lib/trees/control-profiles.ts; from memory, the manufacturer's values come first).
    expect(findBand(volts.bands, DC_TEST_TERMINALS.lowBelow - 0.01)!.band.outcome).toBe('carry-over');
    expect(findBand(volts.bands, DC_TEST_TERMINALS.lowBelow)!.band.outcome).toBe('f-control-not-sensing');
    expect(findBand(volts.bands, -1)!.band.askAgain).toMatch(/leads are reversed/);
    expect(volts.instruction).toMatch(/manufacturer's instructions and values/);
    // Revision 2 read the control's test as a choice only.
    expect(r2Graph.steps.find((s) => s.id === 'control-flame-test')!.kind).toBe('inspect');
    expect(r2Graph.steps.some((s) => s.kind === 'measure' && s.quantity === 'vdc')).toBe(false);
    // Revision 1 had no ignition branch: every unit reached the series meter.
    expect(r1Graph.steps.some((s) => s.kind === 'fact')).toBe(false);
    expect(r1Walks.filter(series).length).toBe(r1Walks.filter((w) => w.visits.some((v) => v.stateId === 'flame-signal')).length);
  });

  it('separates "stays lit" from "lights then drops out": a unit that stays lit never walks to a new control', () => {
    const trial = inspect('trial-observe');
    const stays = trial.choices.find((c) => c.value === 'stays-lit')!;
    const drops = trial.choices.find((c) => c.value === 'lights-drops')!;
    expect(stays.outcome).not.toBe(drops.outcome);
    const staysWalks = walks.filter((w) => w.answers.some((a) => a.stepId === 'trial-observe' && a.choice === 'stays-lit'));
    expect(staysWalks.length).toBeGreaterThan(0);
    for (const w of staysWalks) expect(w.findingId, where(w)).toBe('f-ignition-proven');
    // Revision 1 had one answer for both: "light (then drop out, or stay lit)".
    expect(
      r1Graph.steps.find((s) => s.id === 'burners-light')!.kind === 'inspect' &&
        (r1Graph.steps.find((s) => s.id === 'burners-light') as InspectStep).choices.length,
    ).toBe(2);
  });

  it('reaches the flame signal in at most 12 answers when the flame lights then drops out; revision 1 took 27', () => {
    const drops = walks.filter(
      (w) => w.unit.ignition === 'two-rod' && w.answers.some((a) => a.stepId === 'trial-observe' && a.choice === 'lights-drops'),
    );
    const counts = drops
      .map((w) => {
        const i = w.answers.findIndex((a) => a.stepId === 'flame-signal');
        return i === -1 ? null : manualAnswers({ answers: w.answers.slice(0, i) }).length + 1;
      })
      .filter((n): n is number => n !== null);
    expect(counts.length).toBeGreaterThan(0);
    expect(Math.max(...counts)).toBeLessThanOrEqual(12);
    const r1Counts = r1Walks
      .map((w) => w.answers.findIndex((a) => a.stepId === 'flame-signal'))
      .filter((i) => i >= 0)
      .map((i) => i + 1);
    expect(Math.min(...r1Counts)).toBeGreaterThan(12);
  });

  it('checks the inducer, the pressure switch, its hose and port and the vent on an induced-draft unit before the control', () => {
    const induced = walks.filter((w) => w.unit.draft === 'induced' && w.visits.some((v) => v.stateId === 'pressure-switch-across'));
    expect(induced.length).toBeGreaterThan(0);
    // An open pressure switch never ends at "replace the control".
    for (const w of induced.filter((w) => w.answers.some((a) => a.stepId === 'pressure-switch-across' && (a.value ?? 0) >= 2))) {
      expect(['f-pressure-hose', 'f-pressure-port-blocked', 'f-vent-blocked', 'f-pressure-switch-failed'], where(w)).toContain(w.findingId);
    }
    // The no-spark control finding is reached on an induced-draft unit only with the switch proven closed.
    for (const w of walks.filter((w) => w.unit.draft === 'induced' && w.findingId === 'f-control-not-sparking')) {
      const ps = w.answers.find((a) => a.stepId === 'pressure-switch-across');
      expect(ps?.value, where(w)).toBeLessThan(2);
    }
    // A natural-draft unit is never asked about an inducer.
    expect(walks.filter((w) => w.unit.draft === 'natural' && w.visits.some((v) => v.stateId === 'inducer-runs'))).toEqual([]);
    expect(steps.get('f-vent-blocked')!.cautions.map((c) => c.signal)).toContain('DANGER');
    expect(r1Graph.steps.some((s) => /pressure switch/i.test(s.title))).toBe(false);
  });

  it('checks neutral-to-ground and hot-to-ground before every flame-signal step', () => {
    for (const w of walks) {
      for (const flame of ['connect-microammeter', 'control-flame-test']) {
        const before = visitsBefore(w, flame);
        if (!before) continue;
        const ids = before.map((v) => v.stateId);
        expect(ids, where(w)).toContain('neutral-ground');
        expect(ids, where(w)).toContain('hot-ground');
      }
    }
    // Reversed polarity (about line voltage neutral to ground) and a lost ground (hot to ground low) have findings.
    // Common practice, no source: neutral to ground reads near 0 V on a sound circuit.
    expect(findBand(measure('neutral-ground').bands, 0.4)!.band.outcome).toBe('hot-ground');
    expect(findBand(measure('neutral-ground').bands, 119)!.band.outcome).toBe('f-reversed-polarity');
    expect(findBand(measure('hot-ground').bands, 3)!.band.outcome).toBe('f-lost-ground');
    expect(r1Graph.steps.some((s) => s.id.includes('ground') && s.kind === 'measure' && s.quantity === 'vac')).toBe(false);
  });

  it('gives both fuels an inlet range whose floor is above the manifold setting, and an over-pressure finding', () => {
    // Natural-gas manifold about 3.5 inWC, LP about 10–11 inWC: TRADE.md, common practice, no source.
    // The setting is taken as the middle of the manifold's normal band.
    const setting = (id: string) => {
      const b = measure(id).bands.find((x) => x.verdict === 'within')!;
      return (b.from! + b.to!) / 2;
    };
    const floor = (id: string) => measure(id).bands.find((x) => x.verdict === 'within')!.from!;
    expect(floor('inlet-pressure')).toBeGreaterThan(setting('manifold-pressure'));
    expect(floor('lp-inlet-pressure')).toBeGreaterThan(setting('lp-manifold-pressure'));
    // 14 inWC is about 1/2 psi: 0.5 × 27.68 inWC/psi (NIST SP 811 via TRADE.md) = 13.84.
    expect(Math.abs(14 - 0.5 * 27.68)).toBeLessThan(0.2);
    expect(findBand(measure('inlet-pressure').bands, 28)!.band.outcome).toBe('f-inlet-over-pressure');
    expect(findBand(measure('lp-inlet-pressure').bands, 28)!.band.outcome).toBe('f-inlet-over-pressure');
    // Revision 1: the LP inlet "normal" began at 8 inWC, below the LP manifold setting.
    const r1Lp = (r1Graph.steps.find((s) => s.id === 'lp-inlet-pressure') as MeasureStep).bands.find((b) => b.verdict === 'within')!;
    expect(r1Lp.from!).toBeLessThan(10.5);
  });

  it('asks again instead of walking on when a microamp reading is negative (leads reversed)', () => {
    // A DC meter in series with its leads reversed reads negative: common practice, no source.
    const band = findBand(measure('flame-signal').bands, -1.8)!.band;
    expect(band.outcome).toBeUndefined();
    expect(band.askAgain).toMatch(/leads are reversed/);
    for (const w of walks) expect(w.answers.filter((a) => a.stepId === 'flame-signal' && (a.value ?? 0) < 0)).toEqual([]);
    // Revision 1 sent -1.8 µA to "no flame signal".
    expect(findBand((r1Graph.steps.find((s) => s.id === 'flame-signal') as MeasureStep).bands, -1.8)!.band.outcome).toBe('rod-inspect');
  });

  it('cautions the measurements taken at the control board', () => {
    for (const id of ['fuse-output', 'w-voltage', 'control-th-input']) {
      expect(
        steps
          .get(id)!
          .cautions.map((c) => c.text)
          .join(' '),
        id,
      ).toMatch(/line-powered control/);
      expect(r1Graph.steps.find((s) => s.id === id)!.cautions, id).toEqual([]);
    }
    for (const s of graph.steps) {
      for (const c of s.cautions) {
        // Every caution defers to codes, the manufacturer and licensed practice (BRIEF.md, "caution").
        expect(c.text, s.id).toMatch(/local codes, the equipment manufacturer's instructions and licensed practice\.$/);
      }
    }
  });

  it('judges the valve voltage against the transformer read on the same walk', () => {
    // A drop of more than about 2 V under load points at wiring or contacts: common practice, no source.
    const valve = measure('valve-voltage');
    expect(valve.reference?.step).toBe('valve-secondary');
    const at = (secondary: number, v: number) => findBand(shiftedBands(valve, { 'valve-secondary': secondary }), v)!.band.outcome;
    expect(at(24.3, 21.5)).toBe('control-valve-output');
    expect(at(22.0, 21.5)).toBe('connect-manometer');
    expect(at(27.1, 24.6)).toBe('control-valve-output');
    // Revision 1 took 18.5 V at the valve as normal whatever the transformer gave.
    expect(findBand((r1Graph.steps.find((s) => s.id === 'valve-voltage') as MeasureStep).bands, 18.5)!.band.verdict).toBe('within');
  });

  it('takes "OL" on the rollout switch as open, and keeps the spark-gap band at 1/8 in ±1/32 in', () => {
    // An open switch reads OL (over range) on an ohmmeter: common practice, no source.
    expect(findBand(measure('rollout-continuity').bands, Number.POSITIVE_INFINITY)!.band.outcome).toBe('f-tripped-rollout');
    // Spark gap about 1/8 in (TRADE.md); ±1/32 in gives 3/32 to 5/32 in exactly.
    const gap = measure('spark-gap').bands.find((b) => b.verdict === 'within')!;
    expect([gap.from, gap.to]).toEqual([3 / 32, 5 / 32]);
    const r1Gap = (r1Graph.steps.find((s) => s.id === 'spark-gap') as MeasureStep).bands.find((b) => b.verdict === 'within')!;
    expect([r1Gap.from, r1Gap.to]).not.toEqual([3 / 32, 5 / 32]);
  });

  it('answers the unit facts from the unit record instead of asking them', () => {
    const facts = graph.steps.filter((s) => s.kind === 'fact').map((s) => s.kind === 'fact' && s.fact);
    expect(new Set(facts)).toEqual(new Set(['controlSupply', 'fuel', 'ignition', 'draft']));
    // No inspect step asks what the record holds (revision 1 asked the fuel and the control supply).
    expect(
      graph.steps.some((s) => s.id === 'fuel-type' || (s.kind === 'inspect' && /rating plate name|control powered/i.test(s.title))),
    ).toBe(false);
    expect(r1Graph.steps.some((s) => s.id === 'fuel-type')).toBe(true);
  });

  it('retakes the flame signal after the repair where the walk took it, with the meter put back first', () => {
    for (const w of walks) {
      for (const reading of ['flame-signal', 'control-flame-voltage']) {
        const took = w.visits.some((v) => v.stateId === reading);
        const recheck = w.visits.findIndex((v) => v.stateId.startsWith(`recheck--${reading}--`));
        expect(recheck >= 0, where(w)).toBe(took);
        if (recheck >= 0) {
          const reconnect = w.visits.findIndex((v) => v.stateId.startsWith(`reconnect--${reading}--`));
          expect(reconnect, where(w)).toBeGreaterThan(-1);
          expect(reconnect, where(w)).toBeLessThan(recheck);
          expect(w.visits[reconnect].energy.electric, where(w)).toBe('off');
          expect(w.visits[recheck].energy, where(w)).toEqual({ electric: 'on', gas: 'on' });
        }
      }
    }
    expect(walks.some((w) => w.visits.some((v) => v.stateId.startsWith('recheck--control-flame-voltage--')))).toBe(true);
  });

  it('never contradicts itself: on every path, each reading lies inside what the finding expects of that step', () => {
    for (const w of walks) {
      const finding = steps.get(w.findingId) as FindingStep;
      for (const a of w.answers) {
        const value = a.overRange ? Number.POSITIVE_INFINITY : a.value;
        if (value === undefined) continue;
        for (const exp of finding.expects.filter((e) => e.step === a.stepId)) {
          expect(value, where(w, a.stepId)).toBeGreaterThanOrEqual(exp.from ?? -Infinity);
          if (exp.to !== undefined) expect(value, where(w, a.stepId)).toBeLessThan(exp.to);
        }
      }
    }
  });

  it('says "typical values" in plain words beside the bands, not editor notes', () => {
    for (const s of graph.steps) {
      if (s.kind !== 'measure') continue;
      expect(s.bandsNote, s.id).toMatch(/^Typical values/);
      expect(s.bandsNote, s.id).not.toMatch(/common practice|no source|Default bands/);
    }
  });
});
