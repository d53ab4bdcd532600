// The bench's electrical model: the unit's wiring as a resistive network, solved by nodal analysis.
// AC sources are taken in phase, so a voltage between two points is the magnitude of the difference
// of their potentials (RMS). The meter is part of the network when it reads volts (10 MΩ across its
// leads), which is what makes the series-circuit rules come out by themselves: a point past an open
// switch is pulled to common through the load, so the full supply appears across the open switch
// and about 0 V across a closed one. Resistances are model values (not figures of the trade) picked
// so a healthy unit reads like one; every node also leaks to earth through 10 GΩ, so a point
// connected to nothing reads about 0 V rather than making the network singular.
import type { ElementId, FaultEffect } from '@/lib/bench/faults';
import type { PointId } from '@/lib/bench/points';

export type NodeId = PointId | 'earth' | 'panel-hot' | 'switch-in' | 'control-fs' | 'spark-out' | 'valve-out';

const NODES: readonly NodeId[] = [
  'earth',
  'panel-hot',
  'switch-in',
  'line-hot',
  'line-neutral',
  'line-ground',
  'chassis',
  'burner',
  'inducer-hot',
  'xfmr-hot',
  'xfmr-common',
  'fuse-out',
  'stat-w',
  'limit-out',
  'rollout-out',
  'control-common',
  'ps-in',
  'ps-out',
  'valve-out',
  'valve-hot',
  'valve-common',
  'control-fs',
  'flame-rod',
  'ground-lead',
  'spark-out',
  'spark-rod',
];
const INDEX = new Map(NODES.map((n, i) => [n, i]));

/** Supply voltages of the model: line 120 VAC, a 24 VAC class transformer, the control's flame-rod AC. */
export const LINE_VOLTS = 120;
export const SECONDARY_EMF = 24.6;
export const ROD_VOLTS = 90;
/** A digital multimeter's input resistance on its volts ranges (a typical 10 MΩ). */
export const METER_OHMS = 10e6;
/** Above this, the ohmmeter shows OL. */
export const OHMMETER_MAX = 40e6;

const LEAK_S = 1e-10;

interface Resistor {
  a: NodeId;
  b: NodeId;
  ohms: number;
  element?: ElementId;
}

interface Source {
  /** Positive terminal, negative terminal, EMF (V) and internal resistance (Ω), as a Norton equivalent. */
  plus: NodeId;
  minus: NodeId;
  volts: number;
  ohms: number;
}

/** What the control and the switches are doing at this moment: what the sequence and the bench's actions decide. */
export interface CircuitState {
  /** The unit's service switch closed. */
  switchClosed: boolean;
  /** The thermostat's R–W contact closed (the call for heat). */
  calling: boolean;
  /** Relays of the control. */
  inducerRelay: boolean;
  psFeed: boolean;
  valveRelay: boolean;
  /** The control's flame-rod voltage on. */
  rodPowered: boolean;
  /** The inducer turning and pulling draft: the pressure switch's contact closed. */
  psClosed: boolean;
  /** The rollout switch has been reset (a tripped rollout is then closed until it trips again). */
  rolloutClosed: boolean;
}

/** The healthy resistance of each element a fault can change, in ohms. */
export const HEALTHY_OHMS: Record<ElementId, number> = {
  'feed-hot': 0.1,
  'feed-neutral': 0.1,
  'ground-wire': 0.2,
  'xfmr-primary': 400,
  fuse: 0.05,
  'stat-contact': 0.1,
  'high-limit': 0.02,
  rollout: 0.02,
  'common-wire': 0.05,
  'valve-wire': 0.05,
  'valve-return': 0.05,
  'inducer-motor': 120,
  'ps-switch': 0.05,
  'flame-rod-lead': 0.1,
  'ground-lead': 0.05,
  'spark-lead': 1,
  'rod-insulation': Infinity,
};

export class Circuit {
  readonly resistors: Resistor[];
  readonly sources: Source[];

  constructor(resistors: Resistor[], sources: Source[]) {
    this.resistors = resistors;
    this.sources = sources;
  }

  /** Node potentials (V) with an optional extra resistor (the meter) across two nodes. */
  potentials(extra?: { a: NodeId; b: NodeId; ohms: number }, injected?: { into: NodeId; outOf: NodeId; amps: number }): Float64Array {
    const n = NODES.length;
    // Node 0 (earth) is the reference: solve for the others.
    const m = n - 1;
    const g = new Float64Array(m * m);
    const rhs = new Float64Array(m);
    const stamp = (a: NodeId, b: NodeId, s: number) => {
      const i = INDEX.get(a)! - 1;
      const j = INDEX.get(b)! - 1;
      if (i >= 0) g[i * m + i] += s;
      if (j >= 0) g[j * m + j] += s;
      if (i >= 0 && j >= 0) {
        g[i * m + j] -= s;
        g[j * m + i] -= s;
      }
    };
    const inject = (node: NodeId, amps: number) => {
      const i = INDEX.get(node)! - 1;
      if (i >= 0) rhs[i] += amps;
    };
    for (let i = 0; i < m; i++) g[i * m + i] += LEAK_S;
    for (const r of this.resistors) if (Number.isFinite(r.ohms)) stamp(r.a, r.b, 1 / r.ohms);
    if (extra) stamp(extra.a, extra.b, 1 / extra.ohms);
    for (const s of this.sources) {
      stamp(s.plus, s.minus, 1 / s.ohms);
      inject(s.plus, s.volts / s.ohms);
      inject(s.minus, -s.volts / s.ohms);
    }
    if (injected) {
      inject(injected.into, injected.amps);
      inject(injected.outOf, -injected.amps);
    }
    const x = gauss(g, rhs, m);
    const v = new Float64Array(n);
    for (let i = 1; i < n; i++) v[i] = x[i - 1];
    return v;
  }

  /** AC volts (RMS) a meter reads between two points. */
  volts(a: NodeId, b: NodeId): number {
    const v = this.potentials({ a, b, ohms: METER_OHMS });
    return Math.abs(v[INDEX.get(a)!] - v[INDEX.get(b)!]);
  }

  /** Ohms between two points with every source dead (power off): a 1 mA test current. Infinity past the meter's range. */
  ohms(a: NodeId, b: NodeId): number {
    if (a === b) return 0;
    const amps = 1e-3;
    const dead = new Circuit(
      this.resistors,
      this.sources.map((s) => ({ ...s, volts: 0 })),
    );
    const v = dead.potentials(undefined, { into: a, outOf: b, amps });
    const r = (v[INDEX.get(a)!] - v[INDEX.get(b)!]) / amps;
    return r > OHMMETER_MAX ? Infinity : r;
  }
}

function gauss(a: Float64Array, b: Float64Array, m: number): Float64Array {
  for (let col = 0; col < m; col++) {
    let pivot = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(a[r * m + col]) > Math.abs(a[pivot * m + col])) pivot = r;
    if (pivot !== col) {
      for (let c = 0; c < m; c++) {
        const t = a[col * m + c];
        a[col * m + c] = a[pivot * m + c];
        a[pivot * m + c] = t;
      }
      const t = b[col];
      b[col] = b[pivot];
      b[pivot] = t;
    }
    const d = a[col * m + col];
    for (let r = col + 1; r < m; r++) {
      const f = a[r * m + col] / d;
      if (f === 0) continue;
      for (let c = col; c < m; c++) a[r * m + c] -= f * a[col * m + c];
      b[r] -= f * b[col];
    }
  }
  const x = new Float64Array(m);
  for (let r = m - 1; r >= 0; r--) {
    let s = b[r];
    for (let c = r + 1; c < m; c++) s -= a[r * m + c] * x[c];
    x[r] = s / a[r * m + r];
  }
  return x;
}

/** The resistance of an element on this unit with this fault, in ohms (Infinity: open). */
export function elementOhms(effect: FaultEffect | undefined, element: ElementId): number {
  if (effect?.open?.includes(element)) return Infinity;
  return effect?.resistance?.[element] ?? HEALTHY_OHMS[element];
}

/** Builds the network of the unit at one moment. */
export function buildCircuit(effect: FaultEffect | undefined, state: CircuitState, unit: { draft: 'induced' | 'natural' }): Circuit {
  const el = (element: ElementId) => elementOhms(effect, element);
  const closed = (on: boolean, ohms = 0.05) => (on ? ohms : Infinity);
  const reversed = effect?.reversedPolarity === true;
  const r: Resistor[] = [
    // Line side. The panel's neutral is bonded to earth; the unit's service switch is in the
    // conductor landed on its hot terminal, so with the polarity reversed it switches the neutral.
    { a: 'panel-hot', b: reversed ? 'line-neutral' : 'switch-in', ohms: el('feed-hot'), element: 'feed-hot' },
    { a: 'earth', b: reversed ? 'switch-in' : 'line-neutral', ohms: el('feed-neutral'), element: 'feed-neutral' },
    { a: 'switch-in', b: 'line-hot', ohms: closed(state.switchClosed, 0.01) },
    { a: 'earth', b: 'line-ground', ohms: el('ground-wire'), element: 'ground-wire' },
    { a: 'line-ground', b: 'chassis', ohms: 0.01 },
    { a: 'chassis', b: 'burner', ohms: 0.05 },
    { a: 'line-hot', b: 'line-neutral', ohms: el('xfmr-primary'), element: 'xfmr-primary' },
    { a: 'line-hot', b: 'inducer-hot', ohms: closed(state.inducerRelay) },
    // Secondary side: transformer common bonded to the cabinet, then the series safety circuit.
    { a: 'xfmr-common', b: 'chassis', ohms: 0.01 },
    { a: 'xfmr-hot', b: 'fuse-out', ohms: el('fuse'), element: 'fuse' },
    { a: 'fuse-out', b: 'stat-w', ohms: state.calling ? el('stat-contact') : Infinity, element: 'stat-contact' },
    { a: 'stat-w', b: 'limit-out', ohms: el('high-limit'), element: 'high-limit' },
    { a: 'limit-out', b: 'rollout-out', ohms: state.rolloutClosed ? HEALTHY_OHMS.rollout : el('rollout'), element: 'rollout' },
    // The control's thermostat input and its own supply from R, returning on its common (TR).
    { a: 'rollout-out', b: 'control-common', ohms: 1000 },
    { a: 'fuse-out', b: 'control-common', ohms: 150 },
    { a: 'control-common', b: 'xfmr-common', ohms: el('common-wire'), element: 'common-wire' },
    // Valve circuit: the control's valve relay, the wire to the valve, its coil, the common return.
    { a: 'fuse-out', b: 'valve-out', ohms: closed(state.valveRelay) },
    { a: 'valve-out', b: 'valve-hot', ohms: el('valve-wire'), element: 'valve-wire' },
    { a: 'valve-hot', b: 'valve-common', ohms: 40 },
    { a: 'valve-common', b: 'control-common', ohms: el('valve-return'), element: 'valve-return' },
    // Flame circuit: flame-sense terminal → lead → rod; burner → ground lead → the control's ground terminal.
    { a: 'control-fs', b: 'flame-rod', ohms: el('flame-rod-lead'), element: 'flame-rod-lead' },
    { a: 'burner', b: 'ground-lead', ohms: el('ground-lead'), element: 'ground-lead' },
    { a: 'flame-rod', b: 'burner', ohms: el('rod-insulation'), element: 'rod-insulation' },
    // Spark: the control's spark output (its high-voltage winding returns to the cabinet) → lead → rod.
    { a: 'spark-out', b: 'chassis', ohms: 1000 },
    { a: 'spark-out', b: 'spark-rod', ohms: el('spark-lead'), element: 'spark-lead' },
  ];
  if (unit.draft === 'induced') {
    r.push(
      { a: 'inducer-hot', b: 'line-neutral', ohms: el('inducer-motor'), element: 'inducer-motor' },
      { a: 'fuse-out', b: 'ps-in', ohms: closed(state.psFeed) },
      { a: 'ps-in', b: 'ps-out', ohms: state.psClosed ? el('ps-switch') : Infinity, element: 'ps-switch' },
      { a: 'ps-out', b: 'control-common', ohms: 1000 },
    );
  }
  const primaryVolts = primaryLive(effect, state) ? LINE_VOLTS : 0;
  const s: Source[] = [
    { plus: 'panel-hot', minus: 'earth', volts: LINE_VOLTS, ohms: 0.05 },
    { plus: 'xfmr-hot', minus: 'xfmr-common', volts: (SECONDARY_EMF * primaryVolts) / LINE_VOLTS, ohms: 1 },
    { plus: 'control-fs', minus: 'ground-lead', volts: state.rodPowered ? ROD_VOLTS : 0, ohms: 100_000 },
  ];
  return new Circuit(r, s);
}

/** Line voltage across the unit's hot and neutral terminals (either way round). */
export function lineLive(effect: FaultEffect | undefined, state: Pick<CircuitState, 'switchClosed'>): boolean {
  return state.switchClosed && elementOhms(effect, 'feed-hot') < Infinity && elementOhms(effect, 'feed-neutral') < Infinity;
}

function primaryLive(effect: FaultEffect | undefined, state: CircuitState): boolean {
  return lineLive(effect, state) && elementOhms(effect, 'xfmr-primary') < Infinity;
}

export function nodeExists(node: string): node is NodeId {
  return INDEX.has(node as NodeId);
}
