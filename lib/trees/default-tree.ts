// The built-in fault tree for "no heat" on a direct spark ignition furnace, revision 3. It starts
// from what the technician sees during one trial for ignition and goes straight to what that
// implicates: no spark → power, 24 V, call, safety circuit, the induced-draft sequence (inducer,
// pressure switch, hose, port, vent) and the spark lead; spark without flame → gap and rod, valve
// voltage against the transformer under load, gas pressures; flame that drops out → polarity and
// ground, then the flame signal measured the way the unit allows (a meter in series on a two-rod
// unit, the control's own test on a single-rod one), carry-over, rod, lead and ground path.
//
// Every step says what it needs of each energy source, and every step or finding that has someone
// handle a part needs that part's energy off (lib/trees/validate.ts; tests walk every path). Facts
// the unit record holds (control supply, fuel, ignition, draft) are branches it answers.
//
// Trade facts here are common practice, no source (TRADE.md), unless a comment names one. Every band
// is a default a lead can change; the rating plate and the manufacturer's data rule. Revisions 1
// and 2 are kept in builtin/ for the upgrade of companies that never edited them.
//
// Revision 3 is revision 2 made answerable by the bench (lib/bench): every measure step says where
// the meter goes (`probe`) and, where the reading depends on the sequence, when (`at`); every
// inspect step says what it observes (`observe`); the steps read during the trial show the ignition
// sequence (`timeline`); each finding carries the tags of the library fault it isolates; and a
// single-rod unit reads its flame signal numerically at the control's own test terminals, with the
// bands of a control profile (lib/trees/control-profiles.ts), or by its status light.
import { DC_TEST_TERMINALS, dcFlameTestBands } from '@/lib/trees/control-profiles';
import { treeGraphSchema, type Caution, type EnergyNeed, type TreeGraph, type TreeGraphInput } from '@/lib/trees/schema';

export interface DefaultTree {
  slug: string;
  title: string;
  symptom: string;
  equipmentKind: string;
  /** The built-in revision: raised whenever the shipped graph changes. */
  revision: number;
  graph: TreeGraphInput;
}

const DEFER = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

// ── Energy needs ─────────────────────────────────────────────────────────────────────────────────
const LIVE: EnergyNeed = { electric: 'on', gas: 'any' };
const FIRING: EnergyNeed = { electric: 'on', gas: 'on' };
const POWER_OFF: EnergyNeed = { electric: 'off', gas: 'any' };
const ALL_OFF: EnergyNeed = { electric: 'off', gas: 'off' };
const GAS_OFF: EnergyNeed = { electric: 'any', gas: 'off' };
const ANY: EnergyNeed = { electric: 'any', gas: 'any' };

// ── Cautions ─────────────────────────────────────────────────────────────────────────────────────
const LINE_VOLTAGE: Caution = {
  signal: 'WARNING',
  text: `Line voltage (about 120 VAC) is present at the unit's supply, its junction box and a line-powered control. Contact can kill or injure. Use a meter rated for the circuit and insulated probes, keep fingers behind the probe guards and clear of bare terminals. ${DEFER}`,
};

const LINE_AT_CONTROL: Caution = {
  signal: 'WARNING',
  text: `These terminals are on the control board. On a line-powered control the same board carries line voltage (about 120 VAC) a finger's width away, and the inducer and blower connections on it are line voltage on any control. Probe only the terminals named, with insulated probes. ${DEFER}`,
};

const SPARK: Caution = {
  signal: 'WARNING',
  text: `The ignition spark is on the order of 10 kV during the trial for ignition. Keep hands, probes and tools away from the spark lead, the spark rod and the burner while the control is powered and calling for heat. ${DEFER}`,
};

const ROD_VOLTAGE: Caution = {
  signal: 'WARNING',
  text: `The control puts AC voltage on the flame rod (commonly about 50 to 180 VAC, depending on the control) during the trial and while the burner runs; a line-powered control keeps it there whenever it is powered. Make and break meter connections with power locked out; do not touch the rod, its lead or the meter leads while the unit is powered. ${DEFER}`,
};

const SINGLE_ROD: Caution = {
  signal: 'DANGER',
  text: `On a single-rod unit the one rod both sparks and senses: its lead carries the ~10 kV spark. Never put a meter in that lead or touch it while the control is powered. Use only the flame-signal test the control itself provides. ${DEFER}`,
};

const GAS: Caution = {
  signal: 'WARNING',
  text: `Natural gas and LP burn and explode. If you smell gas, stop: operate no switches, make no sparks, shut off the gas supply, ventilate and follow the gas emergency procedure. Close every pressure tap you opened and leak-test it with leak-detection solution or a gas detector before you leave. ${DEFER}`,
};

const ROLLOUT: Caution = {
  signal: 'DANGER',
  text: `A tripped rollout switch means flame has left the combustion chamber: a blocked vent or flue, a cracked heat exchanger or over-firing can release fire or carbon monoxide. Do not reset, jumper or bypass the switch to restore heat until the cause is found and corrected. ${DEFER}`,
};

const VENT: Caution = {
  signal: 'DANGER',
  text: `A blocked or disconnected vent can put carbon monoxide into the building. Do not run the unit until the vent is clear and sound, and check the building for CO if the unit ran with it blocked. Never jumper or bypass a pressure switch. ${DEFER}`,
};

const NO_BYPASS: Caution = {
  signal: 'WARNING',
  text: `Never jumper or bypass a high limit, a rollout switch or a pressure switch to make the unit run: they are what stops overheating, flame rollout and flue gas spilling. ${DEFER}`,
};

const HOT_PARTS: Caution = {
  signal: 'CAUTION',
  text: `Burner parts, rods, the inducer and the heat exchanger may be hot right after a trial or a run. Let them cool or wear gloves; ceramics are brittle, so handle the rods by their brackets. ${DEFER}`,
};

const VERIFY_CYCLES = 'Run at least three full heat cycles from a thermostat call to the end of the call without a lockout';

// Band notes are shown beside the bands in the wizard: plain words for the technician.
const TYPICAL = (what: string) =>
  `Typical values for ${what} — your company can change them. The rating plate and the manufacturer's data come first.`;
// common practice, no source: a 120 VAC supply is normal within about ±10 % (108 to 132 V)
const LINE_NOTE = TYPICAL('a 120 VAC supply (about ±10 %)');
// common practice, no source: a 24 VAC control circuit reads about 18 to 30 V in service
const LOW_VOLTAGE_NOTE = TYPICAL('a 24 VAC control circuit: below 18 V is low or absent, 18 to 30 V is normal, 30 V and over is high');
const OHMS_NOTE = TYPICAL('a closed switch or a sound wire: a fraction of an ohm; open reads OL');

const LOW_24V = { to: 18, label: 'Low or no 24 V', verdict: 'below' } as const;

export const DEFAULT_TREE: DefaultTree = {
  slug: 'no-heat-dsi',
  title: 'No heat — direct spark ignition',
  symptom: 'No heat',
  equipmentKind: 'dsi-furnace',
  revision: 3,
  graph: {
    start: 'line-voltage',
    afterRepair: [
      { measure: 'flame-signal', reconnect: 'connect-microammeter' },
      { measure: 'control-flame-voltage', reconnect: 'connect-flame-test-meter' },
    ],
    steps: [
      // ── Line power, then one trial watched ───────────────────────────────────
      {
        id: 'line-voltage',
        kind: 'measure',
        title: 'Line voltage at the unit',
        instruction:
          'Meter on AC volts. Measure between the supply hot and neutral where power enters the unit (the junction box or the unit service switch, load side).',
        cautions: [LINE_VOLTAGE],
        why: 'Nothing in the unit works without line power. Starting here rules out the simplest cause before you open the burner compartment.',
        energy: LIVE,
        probe: { a: 'line-hot', b: 'line-neutral' },
        quantity: 'vac',
        points: ['unit supply hot (L1), load side of the service switch', 'unit supply neutral'],
        bands: [
          { to: 108, label: 'Low or no line voltage', verdict: 'below', outcome: 'f-no-line-power' },
          { from: 108, to: 132, label: 'Normal line voltage', verdict: 'within', outcome: 'trial-observe' },
          { from: 132, label: 'High line voltage', verdict: 'above', outcome: 'f-line-voltage-high' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'trial-observe',
        kind: 'inspect',
        title: 'Watch one trial for ignition',
        instruction:
          'Set the thermostat to call for heat (reset the control first by removing the call for a few seconds). Watch the burner through the sight glass and listen from the moment the call starts. If the control has a status light, note what it shows against the legend on the control.',
        cautions: [SPARK, GAS],
        why: 'What happens during one trial tells you which part of the sequence failed, so the walk goes straight there instead of checking everything in order.',
        energy: FIRING,
        observe: {
          what: 'trial',
          at: 'after-proving',
          choices: { 'no-spark': 'no-spark', 'spark-no-flame': 'spark-no-flame', 'lights-drops': 'lights-drops', 'stays-lit': 'stays-lit' },
        },
        timeline: true,
        note: { label: "Status light (what it shows, against the control's own legend), if the control has one", required: false },
        choices: [
          { value: 'no-spark', label: 'No spark (whether or not the inducer starts)', outcome: 'control-supply' },
          { value: 'spark-no-flame', label: 'Spark, but the burners do not light', outcome: 'spark-observe' },
          { value: 'lights-drops', label: 'The burners light, then go out within seconds', outcome: 'neutral-ground' },
          { value: 'stays-lit', label: 'The burners light and stay lit', outcome: 'f-ignition-proven' },
        ],
      },
      // ── No spark: 24 V, call and safety circuit ──────────────────────────────
      {
        id: 'control-supply',
        kind: 'fact',
        title: 'How the ignition control is powered',
        instruction:
          'From the unit record: a line-powered control needs its own line voltage; a 24 V control takes everything from the transformer.',
        energy: ANY,
        fact: 'controlSupply',
        cases: [
          { value: '24v', label: '24 V only (the transformer feeds the control)', outcome: 'transformer-secondary' },
          { value: 'line', label: 'Line-powered control', outcome: 'control-line-voltage' },
        ],
      },
      {
        id: 'control-line-voltage',
        kind: 'measure',
        title: 'Line voltage at the control',
        instruction:
          "Measure between the control's line input and neutral terminals with the blower door switch held closed as the panel would hold it.",
        cautions: [LINE_VOLTAGE],
        why: 'Line voltage at the unit does not prove it reaches the control: the door switch, a connector or a wire between them may be open.',
        energy: LIVE,
        probe: { a: 'line-hot', b: 'line-neutral' },
        quantity: 'vac',
        points: ['control line input (L1)', 'control neutral'],
        bands: [
          { to: 108, label: 'Low or no line voltage at the control', verdict: 'below', outcome: 'f-no-power-to-control' },
          { from: 108, label: 'Line voltage present at the control', verdict: 'within', outcome: 'transformer-secondary' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'transformer-secondary',
        kind: 'measure',
        title: '24 V at the transformer secondary',
        instruction: "Measure across the transformer's low-voltage terminals (R and C side).",
        cautions: [LINE_VOLTAGE],
        why: 'The whole control circuit — thermostat, safety switches, control and gas valve — runs on this 24 V.',
        energy: LIVE,
        probe: { a: 'xfmr-hot', b: 'xfmr-common' },
        quantity: 'vac',
        points: ['transformer secondary, R side', 'transformer secondary, common (C)'],
        bands: [
          { ...LOW_24V, outcome: 'transformer-primary' },
          { from: 18, to: 30, label: 'Normal 24 V', verdict: 'within', outcome: 'fuse-output' },
          { from: 30, label: 'High: check the primary tap against the supply', verdict: 'above', outcome: 'fuse-output' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
        aids: ['transformer-load'],
      },
      {
        id: 'transformer-primary',
        kind: 'measure',
        title: 'Line voltage at the transformer primary',
        instruction: "Measure across the transformer's primary leads where they connect (line side).",
        cautions: [LINE_VOLTAGE],
        why: 'No output with line voltage on the primary condemns the transformer; no line voltage on the primary points upstream.',
        energy: LIVE,
        probe: { a: 'line-hot', b: 'line-neutral' },
        quantity: 'vac',
        points: ['transformer primary, line lead', 'transformer primary, neutral lead'],
        bands: [
          { to: 108, label: 'Low or no line voltage at the primary', verdict: 'below', outcome: 'f-no-power-to-transformer' },
          { from: 108, label: 'Line voltage present at the primary', verdict: 'within', outcome: 'f-open-transformer' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'fuse-output',
        kind: 'measure',
        title: '24 V past the control fuse',
        instruction: 'Measure from the load side of the low-voltage fuse (the R that feeds the thermostat) to common.',
        cautions: [LINE_AT_CONTROL],
        why: 'The fuse sits between the transformer and the thermostat circuit; a short anywhere downstream blows it.',
        energy: LIVE,
        probe: { a: 'fuse-out', b: 'xfmr-common' },
        quantity: 'vac',
        points: ['control fuse, load side (R past the fuse)', 'transformer common (C)'],
        bands: [
          { ...LOW_24V, label: 'Low or no 24 V past the fuse', outcome: 'f-blown-fuse' },
          { from: 18, label: '24 V past the fuse', verdict: 'within', outcome: 'thermostat-call' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
      },
      {
        id: 'thermostat-call',
        kind: 'inspect',
        title: 'Is the thermostat calling for heat?',
        instruction:
          'Set the thermostat to heat, a few degrees above room temperature. Does it show a call for heat (display on, heat indicator, a click)?',
        why: 'Without a call (R closed to W) the control has no reason to start.',
        energy: ANY,
        observe: { what: 'thermostat', at: 'call', choices: { calling: 'calling', 'not-calling': 'not-calling' } },
        choices: [
          { value: 'calling', label: 'It calls for heat', outcome: 'w-voltage' },
          { value: 'not-calling', label: 'No call: blank display, wrong mode, or no response', outcome: 'f-no-call-for-heat' },
        ],
      },
      {
        id: 'w-voltage',
        kind: 'measure',
        title: 'Call for heat at the furnace (W to C)',
        instruction: 'With the thermostat calling, measure between the W and C terminals on the furnace terminal board.',
        cautions: [LINE_AT_CONTROL],
        why: 'The thermostat closing R to W puts 24 V on W. Measuring at the furnace proves the thermostat and its wire together.',
        energy: LIVE,
        probe: { a: 'stat-w', b: 'xfmr-common' },
        at: 'call',
        quantity: 'vac',
        points: ['furnace terminal W', 'furnace terminal C'],
        bands: [
          { ...LOW_24V, label: 'No call reaching the furnace', outcome: 'f-no-call-for-heat' },
          { from: 18, label: 'Call present (24 V on W)', verdict: 'within', outcome: 'control-th-input' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
      },
      {
        id: 'control-th-input',
        kind: 'measure',
        title: '24 V at the control thermostat input',
        instruction: "With the call on, measure from the control's thermostat input (TH) to its common (TR).",
        cautions: [LINE_AT_CONTROL],
        why: 'The call passes through the high limit and the rollout switch in series before it reaches the control. 24 V here proves the whole safety circuit closed.',
        energy: LIVE,
        probe: { a: 'rollout-out', b: 'control-common' },
        at: 'call',
        quantity: 'vac',
        points: ['control thermostat input (TH)', 'control common (TR)'],
        bands: [
          { ...LOW_24V, label: 'Call not reaching the control', outcome: 'high-limit-across' },
          { from: 18, label: 'Call reaches the control', verdict: 'within', outcome: 'draft' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
      },
      {
        id: 'high-limit-across',
        kind: 'measure',
        title: 'Voltage across the high limit',
        instruction:
          'With the call on, measure across the two terminals of the high limit switch. A closed switch shows about 0 V; an open one shows about 24 V.',
        cautions: [NO_BYPASS],
        why: 'Measuring across each switch in the series string finds the open one without removing wires.',
        energy: LIVE,
        probe: { a: 'stat-w', b: 'limit-out' },
        at: 'call',
        quantity: 'vac',
        points: ['high limit, supply-side terminal', 'high limit, load-side terminal'],
        bands: [
          { to: 2, label: 'About 0 V: the high limit is closed', verdict: 'within', outcome: 'rollout-continuity' },
          { from: 2, label: 'Voltage across: the high limit is open', verdict: 'above', outcome: 'f-open-high-limit' },
        ],
        bandsNote: TYPICAL('a switch in a 24 V series circuit: near 0 V when closed, near 24 V when open'),
      },
      {
        id: 'rollout-continuity',
        kind: 'measure',
        title: 'Rollout switch continuity',
        instruction:
          'Disconnect one wire from each rollout switch and measure across its terminals with the meter on ohms. Look for a popped reset button and scorching near the burner opening, but do not press the reset.',
        cautions: [ROLLOUT],
        why: 'The high limit is closed, so the open point is the rollout switch or the wiring. A tripped rollout is a warning of a combustion hazard, not a part failure.',
        energy: POWER_OFF,
        probe: { a: 'limit-out', b: 'rollout-out' },
        handles: ['electric'],
        quantity: 'ohm',
        points: ['rollout switch, terminal 1 (wire removed)', 'rollout switch, terminal 2'],
        bands: [
          { to: 2, label: 'Continuity: the rollout switch is closed', verdict: 'within', outcome: 'f-safety-circuit-wiring-open' },
          { from: 2, label: 'Open (OL) or high: the rollout switch is open', verdict: 'above', outcome: 'f-tripped-rollout' },
        ],
        bandsNote: OHMS_NOTE,
      },
      // ── No spark: the induced-draft sequence ─────────────────────────────────
      {
        id: 'draft',
        kind: 'fact',
        title: 'How the unit vents',
        instruction:
          'From the unit record: an induced-draft unit runs its inducer and must prove draft with its pressure switch before the control sparks; a natural-draft unit sparks straight away.',
        energy: ANY,
        fact: 'draft',
        cases: [
          { value: 'induced', label: 'Induced draft (inducer and pressure switch)', outcome: 'inducer-runs' },
          { value: 'natural', label: 'Natural draft', outcome: 'spark-listen' },
        ],
      },
      {
        id: 'inducer-runs',
        kind: 'inspect',
        title: 'Does the inducer run on the call?',
        instruction: 'With the call on, listen and feel for the inducer motor starting within a few seconds of the call.',
        cautions: [HOT_PARTS],
        why: 'The control starts the inducer first and waits for the pressure switch to close before it sparks: no inducer, no spark.',
        energy: LIVE,
        observe: { what: 'inducer', at: 'call', choices: { runs: 'runs', 'not-running': 'not-running' } },
        choices: [
          { value: 'runs', label: 'The inducer runs', outcome: 'pressure-switch-across' },
          { value: 'not-running', label: 'The inducer does not run', outcome: 'inducer-voltage' },
        ],
      },
      {
        id: 'inducer-voltage',
        kind: 'measure',
        title: 'Line voltage to the inducer on the call',
        instruction: "With the call on, measure across the inducer's two supply terminals on the control (or at its connector).",
        cautions: [LINE_AT_CONTROL, LINE_VOLTAGE],
        why: 'Voltage there with a motor that does not turn condemns the motor; no voltage points to the control.',
        energy: LIVE,
        probe: { a: 'inducer-hot', b: 'line-neutral' },
        at: 'call',
        quantity: 'vac',
        points: ['control inducer output (line side)', 'control inducer output (neutral side)'],
        bands: [
          { to: 108, label: 'Low or no voltage to the inducer', verdict: 'below', outcome: 'f-no-inducer-output' },
          { from: 108, label: 'Line voltage reaches the inducer', verdict: 'within', outcome: 'f-inducer-motor' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'pressure-switch-across',
        kind: 'measure',
        title: 'Voltage across the pressure switch',
        instruction:
          'With the call on and the inducer running, measure across the two terminals of the pressure switch. A closed switch shows about 0 V; an open one about 24 V.',
        cautions: [NO_BYPASS],
        why: 'The pressure switch proves the inducer is moving flue gas out; until it closes, the control will not spark.',
        energy: LIVE,
        probe: { a: 'ps-in', b: 'ps-out' },
        at: 'call',
        quantity: 'vac',
        points: ['pressure switch, terminal 1', 'pressure switch, terminal 2'],
        bands: [
          { to: 2, label: 'About 0 V: the pressure switch is closed', verdict: 'within', outcome: 'spark-listen' },
          { from: 2, label: 'Voltage across: the pressure switch stays open', verdict: 'above', outcome: 'pressure-hose-inspect' },
        ],
        bandsNote: TYPICAL('a switch in a 24 V series circuit: near 0 V when closed, near 24 V when open'),
      },
      {
        id: 'pressure-hose-inspect',
        kind: 'inspect',
        title: 'Pressure switch hose and port',
        instruction:
          "Pull the hose off the pressure switch and look along it and into the inducer's (or the collector box's) sensing port: cracks, kinks, water in the hose, a port blocked by scale or debris.",
        cautions: [HOT_PARTS],
        why: 'The switch sees draft only through its hose: a kinked, cracked or water-logged hose or a blocked port keeps it open with a good inducer.',
        energy: POWER_OFF,
        observe: { what: 'pressure-hose', choices: { faulty: 'hose-faulty' } },
        observeMore: [{ what: 'pressure-port', choices: { blocked: 'port-blocked', clear: 'clear' } }],
        choices: [
          { value: 'hose-faulty', label: 'Hose cracked, kinked, off or holding water', outcome: 'f-pressure-hose' },
          { value: 'port-blocked', label: 'Sensing port blocked', outcome: 'f-pressure-port-blocked' },
          { value: 'clear', label: 'Hose and port clear', outcome: 'vent-inspect' },
        ],
      },
      {
        id: 'vent-inspect',
        kind: 'inspect',
        title: 'Vent pipe and termination',
        instruction:
          'Follow the vent from the inducer to its termination outside: look for a blockage (nest, snow, ice, debris), a disconnected or crushed pipe, and a sag that holds water.',
        cautions: [VENT],
        why: 'A restricted vent keeps the inducer from pulling enough draft, and the switch stays open as it should.',
        energy: POWER_OFF,
        observe: { what: 'vent', choices: { blocked: 'blocked', clear: 'clear' } },
        choices: [
          { value: 'blocked', label: 'Blocked, disconnected, crushed or holding water', outcome: 'f-vent-blocked' },
          { value: 'clear', label: 'Vent clear and sound', outcome: 'f-pressure-switch-failed' },
        ],
      },
      {
        id: 'spark-listen',
        kind: 'inspect',
        title: 'Is the spark escaping somewhere?',
        instruction: 'Reset and call for heat again. During the trial, listen for the ticking of the spark and look at the gap.',
        cautions: [SPARK],
        why: 'A spark heard but not seen is escaping inside the lead; silence with the call at the control and draft proven points to the control.',
        energy: LIVE,
        observe: { what: 'spark', at: 'proving', choices: { 'heard-not-seen': 'ticking', none: 'silent' } },
        timeline: true,
        choices: [
          { value: 'ticking', label: 'Ticking heard, no spark at the gap', outcome: 'spark-lead-inspect' },
          { value: 'silent', label: 'No ticking and no spark', outcome: 'f-control-not-sparking' },
        ],
      },
      {
        id: 'spark-lead-inspect',
        kind: 'inspect',
        title: 'Spark lead condition',
        instruction:
          'Disconnect the spark lead at both ends. Flex it along its length and look inside the boots for a broken or burnt conductor and loose end terminals.',
        cautions: [HOT_PARTS],
        why: 'A spark heard but not seen at the gap is jumping a break inside the lead or inside the control.',
        energy: POWER_OFF,
        observe: { what: 'spark-lead', choices: { broken: 'lead-broken', intact: 'lead-intact' } },
        handles: ['electric'],
        choices: [
          { value: 'lead-broken', label: 'Conductor broken, burnt or terminal loose', outcome: 'f-broken-spark-lead' },
          { value: 'lead-intact', label: 'Lead intact', outcome: 'f-control-not-sparking' },
        ],
      },
      // ── Spark, no flame: gap and rod, valve voltage, gas ─────────────────────
      {
        id: 'spark-observe',
        kind: 'inspect',
        title: 'Where does the spark go?',
        instruction: 'Reset and call for heat again; watch the spark during the trial for ignition.',
        cautions: [SPARK],
        why: 'A spark off the gap is escaping to the frame; a spark at the gap that lights nothing points to its position or to the gas.',
        energy: LIVE,
        observe: { what: 'spark', at: 'proving', choices: { 'at-gap': 'at-gap', 'to-frame': 'arcing-elsewhere' } },
        timeline: true,
        choices: [
          { value: 'at-gap', label: 'Spark jumps the gap at the burner', outcome: 'spark-gap' },
          {
            value: 'arcing-elsewhere',
            label: 'Spark seen jumping to the frame or the burner away from the gap',
            outcome: 'arcing-inspect',
          },
        ],
      },
      {
        id: 'arcing-inspect',
        kind: 'inspect',
        title: 'Where is the spark escaping?',
        instruction:
          'Look along the spark lead, its boot and the spark rod ceramic for cracks and carbon tracks, and at the rod for a bend toward the frame.',
        cautions: [HOT_PARTS],
        why: 'The spark takes the easiest path to ground; a crack or a bent rod gives it one before the gap.',
        energy: POWER_OFF,
        observe: {
          what: 'arcing',
          choices: { 'lead-insulation': 'lead-insulation-cracked', 'rod-ceramic': 'rod-ceramic-cracked', 'rod-bent': 'rod-bent' },
        },
        handles: ['electric'],
        choices: [
          { value: 'lead-insulation-cracked', label: 'Lead insulation or boot cracked or tracked', outcome: 'f-cracked-lead-insulation' },
          { value: 'rod-ceramic-cracked', label: 'Spark rod ceramic cracked', outcome: 'f-cracked-rod-ceramic' },
          { value: 'rod-bent', label: 'Spark rod bent toward the frame or burner', outcome: 'f-spark-gap-or-rod' },
        ],
      },
      {
        id: 'spark-gap',
        kind: 'measure',
        title: 'Spark gap',
        instruction:
          'Measure the gap between the spark rod and its ground (the ground rod, or the burner on a single-rod design) with a gap gauge or drill shanks.',
        cautions: [HOT_PARTS],
        why: 'A spark at the gap can still fail to light the gas if the gap is wrong: too wide and it weakens or goes elsewhere, too close and it is short and weak.',
        energy: POWER_OFF,
        probe: { gauge: 'spark-gap' },
        handles: ['electric'],
        quantity: 'length',
        points: ['spark rod tip', 'ground rod or burner'],
        // common practice, no source: a gap of about 1/8 in, ±1/32 in (3/32 to 5/32 in)
        bands: [
          { to: 0.09375, label: 'Too close (under 3/32 in)', verdict: 'below', outcome: 'f-spark-gap-or-rod' },
          { from: 0.09375, to: 0.15625, label: 'About 1/8 in', verdict: 'within', outcome: 'rod-condition' },
          { from: 0.15625, label: 'Too wide (over 5/32 in)', verdict: 'above', outcome: 'f-spark-gap-or-rod' },
        ],
        bandsNote: TYPICAL('a spark gap of about 1/8 in (3.2 mm), ±1/32 in; the manufacturer’s gap comes first'),
      },
      {
        id: 'rod-condition',
        kind: 'inspect',
        title: 'Spark rod position and ceramic',
        instruction: 'Check that the spark rod sits over the burner port where the gas comes out and that its ceramic is whole.',
        cautions: [HOT_PARTS],
        why: 'The spark must be in the gas stream to light it.',
        energy: POWER_OFF,
        observe: { what: 'spark-rod', choices: { good: 'good', bent: 'bent', 'ceramic-cracked': 'ceramic-cracked' } },
        handles: ['electric'],
        choices: [
          { value: 'good', label: 'Rod in position, ceramic whole', outcome: 'valve-secondary' },
          { value: 'bent', label: 'Rod bent or out of the gas stream', outcome: 'f-spark-gap-or-rod' },
          { value: 'ceramic-cracked', label: 'Ceramic cracked', outcome: 'f-cracked-rod-ceramic' },
        ],
      },
      {
        id: 'valve-secondary',
        kind: 'measure',
        title: '24 V at the transformer during the trial',
        instruction:
          "Reset and call for heat. During the trial, measure across the transformer's secondary (R to C): this is what the valve voltage is judged against.",
        cautions: [SPARK],
        why: 'The transformer under load is the reference for the valve: a valve that gets much less than the transformer gives is losing voltage in the wiring or a contact.',
        energy: FIRING,
        probe: { a: 'xfmr-hot', b: 'xfmr-common' },
        at: 'proving',
        timeline: true,
        quantity: 'vac',
        points: ['transformer secondary, R side', 'transformer secondary, common (C)'],
        bands: [
          { ...LOW_24V, label: 'Low 24 V under load', outcome: 'f-secondary-low-under-load' },
          { from: 18, to: 30, label: 'Normal 24 V under load', verdict: 'within', outcome: 'valve-voltage' },
          { from: 30, label: 'High 24 V under load', verdict: 'above', outcome: 'valve-voltage' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
        aids: ['transformer-load'],
      },
      {
        id: 'valve-voltage',
        kind: 'measure',
        title: '24 V at the gas valve during the trial',
        instruction:
          'Put the meter leads on the gas valve terminals, reset the control and call for heat. The valve is powered only during the trial for ignition: read within the first seconds after the spark starts.',
        cautions: [SPARK],
        why: 'The spark is proven; now prove the control opens the valve. Judged against the transformer you just read: a drop of more than about 2 V under load points at the wiring or a contact.',
        energy: FIRING,
        probe: { a: 'valve-hot', b: 'valve-common' },
        at: 'proving',
        timeline: true,
        quantity: 'vac',
        points: ['gas valve terminal (from the control valve output)', 'gas valve common terminal'],
        // common practice, no source: more than about 2 V lost between transformer and valve under load is a wiring or contact fault
        reference: { step: 'valve-secondary', fallback: 24 },
        bands: [
          { to: -2, label: 'More than 2 V below the transformer', verdict: 'below', outcome: 'control-valve-output' },
          { from: -2, label: 'Within 2 V of the transformer', verdict: 'within', outcome: 'connect-manometer' },
        ],
        bandsNote: TYPICAL('the valve against the transformer under load: within about 2 V'),
        aids: ['voltage-drop'],
      },
      {
        id: 'control-valve-output',
        kind: 'measure',
        title: 'Valve output at the control during the trial',
        instruction: "Measure from the control's valve output terminal to its common during the trial, as close to the control as you can.",
        cautions: [SPARK, LINE_AT_CONTROL],
        why: 'Comparing the control end with the valve end splits the fault between the control and the wiring in between.',
        energy: FIRING,
        probe: { a: 'valve-out', b: 'control-common' },
        at: 'proving',
        timeline: true,
        quantity: 'vac',
        points: ['control valve output terminal', 'control common (TR)'],
        bands: [
          { to: 18, label: 'The control gives no valve voltage', verdict: 'below', outcome: 'f-no-valve-voltage-from-control' },
          { from: 18, label: 'The control gives 24 V', verdict: 'within', outcome: 'f-valve-wiring-resistance' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
        aids: ['voltage-drop'],
      },
      {
        id: 'connect-manometer',
        kind: 'action',
        title: 'Connect the manometer to the inlet tap',
        instruction: "Open the gas valve's inlet pressure tap and connect a manometer, zeroed, to it.",
        cautions: [GAS],
        why: 'The valve gets its voltage; the next question is whether gas at the right pressure reaches and leaves it.',
        energy: ALL_OFF,
        handles: ['gas'],
        checklist: ['Inlet pressure tap opened (screw backed out, or plug removed)', 'Manometer zeroed and connected to the inlet tap'],
        outcome: 'fuel',
      },
      {
        id: 'fuel',
        kind: 'fact',
        title: 'Which gas the unit burns',
        instruction: 'From the unit record (the rating plate, and its conversion label if the unit was converted).',
        energy: ANY,
        fact: 'fuel',
        cases: [
          { value: 'natural-gas', label: 'Natural gas', outcome: 'inlet-pressure' },
          { value: 'lp', label: 'LP (propane)', outcome: 'lp-inlet-pressure' },
        ],
      },
      {
        id: 'inlet-pressure',
        kind: 'measure',
        title: 'Gas inlet pressure',
        instruction: 'Read the inlet pressure with the gas on, then again during the trial for ignition; enter the lower reading.',
        cautions: [GAS],
        why: 'A supply that is off, or drops when the valve opens, cannot give the burners enough gas; one far above the appliance maximum is a supply regulator fault.',
        energy: FIRING,
        probe: { gauge: 'inlet-pressure' },
        at: 'proving',
        timeline: true,
        quantity: 'pressure',
        points: ['gas valve inlet pressure tap', 'atmosphere (manometer open side)'],
        // common practice, no source: natural-gas inlet about 4.5 to 10.5 inWC (above the ~3.5 inWC manifold setting); 14 inWC is about 1/2 psi
        bands: [
          { to: 4.5, label: 'Low or no inlet pressure', verdict: 'below', outcome: 'f-no-gas-or-low-pressure' },
          { from: 4.5, to: 10.5, label: 'Normal natural-gas inlet pressure', verdict: 'within', outcome: 'move-manometer' },
          {
            from: 10.5,
            to: 14,
            label: 'Above the usual range: check the rating plate maximum',
            verdict: 'above',
            outcome: 'move-manometer',
          },
          { from: 14, label: 'Over-pressure (about 1/2 psi or more)', verdict: 'above', outcome: 'f-inlet-over-pressure' },
        ],
        bandsNote: TYPICAL("natural gas: the inlet must stay above the manifold setting and below the appliance's maximum"),
      },
      {
        id: 'move-manometer',
        kind: 'action',
        title: 'Move the manometer to the outlet tap',
        instruction: "Close the inlet pressure tap, open the valve's outlet (manifold) tap and connect the manometer there.",
        cautions: [GAS],
        why: 'The outlet pressure shows whether the valve opens and regulates.',
        energy: ALL_OFF,
        handles: ['gas'],
        checklist: ['Manometer off the inlet tap; inlet tap closed', 'Outlet (manifold) tap opened and the manometer connected'],
        outcome: 'manifold-pressure',
      },
      {
        id: 'manifold-pressure',
        kind: 'measure',
        title: 'Manifold (outlet) pressure during the trial',
        instruction: 'Reset and call for heat; read the outlet pressure during the trial for ignition.',
        cautions: [GAS, SPARK],
        why: 'Inlet pressure with no outlet pressure while the valve has its voltage means the valve is not opening.',
        energy: FIRING,
        probe: { gauge: 'manifold-pressure' },
        at: 'proving',
        timeline: true,
        quantity: 'pressure',
        points: ['gas valve outlet (manifold) pressure tap', 'atmosphere (manometer open side)'],
        // common practice, no source: natural-gas manifold about 3.5 inWC (TRADE.md)
        bands: [
          { to: 0.5, label: 'No outlet pressure: the valve does not open', verdict: 'below', outcome: 'f-gas-valve-not-opening' },
          { from: 0.5, to: 3, label: 'Low manifold pressure', verdict: 'below', outcome: 'f-manifold-pressure-low' },
          { from: 3, to: 4, label: 'About 3.5 inWC', verdict: 'within', outcome: 'remove-manometer' },
          { from: 4, label: 'High manifold pressure', verdict: 'above', outcome: 'f-manifold-pressure-high' },
        ],
        bandsNote: TYPICAL('a natural-gas manifold setting of about 3.5 inWC; the rating plate comes first'),
      },
      {
        id: 'lp-inlet-pressure',
        kind: 'measure',
        title: 'LP inlet pressure',
        instruction: 'Read the inlet pressure with the gas on, then again during the trial for ignition; enter the lower reading.',
        cautions: [GAS],
        why: 'An empty tank, a closed tank valve or a failing regulator starves the burners; the valve cannot regulate from an inlet below its own setting.',
        energy: FIRING,
        probe: { gauge: 'inlet-pressure' },
        at: 'proving',
        timeline: true,
        quantity: 'pressure',
        points: ['gas valve inlet pressure tap', 'atmosphere (manometer open side)'],
        // common practice, no source: LP inlet about 11 to 13 inWC, above the 10–11 inWC LP manifold setting; 14 inWC is about 1/2 psi
        bands: [
          {
            to: 11,
            label: 'Low or no LP inlet pressure (at or below the manifold setting)',
            verdict: 'below',
            outcome: 'f-no-gas-or-low-pressure',
          },
          { from: 11, to: 13, label: 'Normal LP inlet pressure', verdict: 'within', outcome: 'lp-move-manometer' },
          {
            from: 13,
            to: 14,
            label: 'Above the usual range: check the rating plate maximum',
            verdict: 'above',
            outcome: 'lp-move-manometer',
          },
          { from: 14, label: 'Over-pressure (about 1/2 psi or more)', verdict: 'above', outcome: 'f-inlet-over-pressure' },
        ],
        bandsNote: TYPICAL("LP: the inlet must stay above the manifold setting and below the appliance's maximum"),
      },
      {
        id: 'lp-move-manometer',
        kind: 'action',
        title: 'Move the manometer to the outlet tap',
        instruction: "Close the inlet pressure tap, open the valve's outlet (manifold) tap and connect the manometer there.",
        cautions: [GAS],
        why: 'The outlet pressure shows whether the valve opens and regulates at the LP setting.',
        energy: ALL_OFF,
        handles: ['gas'],
        checklist: ['Manometer off the inlet tap; inlet tap closed', 'Outlet (manifold) tap opened and the manometer connected'],
        outcome: 'lp-manifold-pressure',
      },
      {
        id: 'lp-manifold-pressure',
        kind: 'measure',
        title: 'LP manifold (outlet) pressure during the trial',
        instruction: 'Reset and call for heat; read the outlet pressure during the trial for ignition.',
        cautions: [GAS, SPARK],
        why: 'The outlet pressure shows whether the valve opens and regulates at the LP setting.',
        energy: FIRING,
        probe: { gauge: 'manifold-pressure' },
        at: 'proving',
        timeline: true,
        quantity: 'pressure',
        points: ['gas valve outlet (manifold) pressure tap', 'atmosphere (manometer open side)'],
        // common practice, no source: LP manifold about 10 to 11 inWC (TRADE.md)
        bands: [
          { to: 0.5, label: 'No outlet pressure: the valve does not open', verdict: 'below', outcome: 'f-gas-valve-not-opening' },
          { from: 0.5, to: 9.5, label: 'Low LP manifold pressure', verdict: 'below', outcome: 'f-manifold-pressure-low' },
          { from: 9.5, to: 11.5, label: 'About 10 to 11 inWC', verdict: 'within', outcome: 'remove-manometer' },
          { from: 11.5, label: 'High LP manifold pressure', verdict: 'above', outcome: 'f-manifold-pressure-high' },
        ],
        bandsNote: TYPICAL('an LP manifold setting of about 10 to 11 inWC; the rating plate comes first'),
      },
      {
        id: 'remove-manometer',
        kind: 'action',
        title: 'Take the manometer off',
        instruction: 'Disconnect the manometer and close the outlet pressure tap (screw in snug, or plug back in).',
        cautions: [GAS],
        why: 'Gas reaches the burners at the right pressure; the burners come out next, so nothing stays open on the valve.',
        energy: ALL_OFF,
        handles: ['gas'],
        checklist: ['Manometer disconnected', 'Outlet pressure tap closed'],
        outcome: 'burner-inspect',
      },
      {
        id: 'burner-inspect',
        kind: 'inspect',
        title: 'Orifices and burner inlets',
        instruction:
          'Remove the burner assembly as the manufacturer describes and look into the orifices and the burner inlets for debris, rust scale, spider webs or insect nests.',
        cautions: [HOT_PARTS, GAS],
        why: 'Gas at the right pressure that never lights is often gas that cannot get out of the orifices or mix with air.',
        energy: ALL_OFF,
        observe: { what: 'orifices', choices: { blocked: 'orifices-blocked', clear: 'nothing-found' } },
        handles: ['electric', 'gas'],
        choices: [
          { value: 'orifices-blocked', label: 'Orifices or burner inlets blocked', outcome: 'f-blocked-orifices' },
          { value: 'nothing-found', label: 'Orifices and inlets clear', outcome: 'f-no-ignition-not-isolated' },
        ],
      },
      // ── Flame that drops out: polarity and ground, then the flame signal ─────
      {
        id: 'neutral-ground',
        kind: 'measure',
        title: 'Neutral to ground at the unit',
        instruction: 'Meter on AC volts. Measure between the supply neutral and the equipment ground where power enters the unit.',
        cautions: [LINE_VOLTAGE],
        why: 'The control proves flame through the ground: reversed polarity or a neutral that floats above ground lets it see no flame although the burners are lit.',
        energy: LIVE,
        probe: { a: 'line-neutral', b: 'line-ground' },
        quantity: 'vac',
        points: ['unit supply neutral', 'equipment ground (green or bare conductor, or the cabinet)'],
        // common practice, no source: neutral to ground reads near 0 V; about line voltage there means hot and neutral are swapped
        bands: [
          { to: 2, label: 'Near 0 V', verdict: 'within', outcome: 'hot-ground' },
          { from: 2, to: 90, label: 'Voltage between neutral and ground', verdict: 'above', outcome: 'f-neutral-ground-voltage' },
          { from: 90, label: 'About line voltage: hot and neutral reversed', verdict: 'above', outcome: 'f-reversed-polarity' },
        ],
        bandsNote: TYPICAL('neutral to ground: near 0 V'),
      },
      {
        id: 'hot-ground',
        kind: 'measure',
        title: 'Hot to ground at the unit',
        instruction: 'Measure between the supply hot and the equipment ground where power enters the unit.',
        cautions: [LINE_VOLTAGE],
        why: 'Hot to ground should read the same as hot to neutral; much less means the ground is open or poor, and the flame current has no sure way back.',
        energy: LIVE,
        probe: { a: 'line-hot', b: 'line-ground' },
        quantity: 'vac',
        points: ['unit supply hot (L1)', 'equipment ground (green or bare conductor, or the cabinet)'],
        bands: [
          { to: 108, label: 'Low or none: the ground is open or poor', verdict: 'below', outcome: 'f-lost-ground' },
          { from: 108, label: 'Line voltage to ground', verdict: 'within', outcome: 'ignition' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'ignition',
        kind: 'fact',
        title: 'How the unit senses flame',
        instruction:
          'From the unit record: a two-rod unit senses on its own flame rod, where a meter can go in series; a single-rod unit sparks and senses on one rod, whose lead carries the spark.',
        energy: ANY,
        fact: 'ignition',
        cases: [
          { value: 'two-rod', label: 'Two rods (separate flame rod)', outcome: 'connect-microammeter' },
          { value: 'single-rod', label: 'Single rod (sparks and senses)', outcome: 'control-flame-test' },
        ],
      },
      {
        id: 'connect-microammeter',
        kind: 'action',
        title: 'Put the meter in series in the flame-rod lead',
        instruction:
          "Set the meter to DC microamps. Disconnect the flame-rod lead at the control and connect the meter between the control's flame-sense terminal and the lead, so the flame current flows through the meter.",
        cautions: [ROD_VOLTAGE],
        why: 'Flame current is a few DC microamps; it can only be measured with the meter in series, and the connection must be made with no voltage on the rod.',
        energy: POWER_OFF,
        handles: ['electric'],
        checklist: [
          'Meter set to DC µA',
          'Meter in series between the control flame-sense terminal and the flame-rod lead',
          'Leads routed clear of the burner and the spark lead',
        ],
        outcome: 'flame-signal',
      },
      {
        id: 'flame-signal',
        kind: 'measure',
        title: 'Flame signal (DC microamps)',
        instruction: 'Call for heat and read the steadiest value once the burners are lit, before the control drops out.',
        cautions: [ROD_VOLTAGE, SPARK],
        why: 'The control proves flame by rectification: the flame conducts a small DC current from the rod to the grounded burner. A weak current points to the flame reaching the rod, the rod, its lead or the ground path.',
        energy: FIRING,
        probe: { series: 'flame-rod-lead' },
        at: 'proving',
        timeline: true,
        quantity: 'udc',
        points: ['control flame-sense terminal', 'flame-rod lead, meter in series'],
        // common practice, no source: a few µA is a good signal, below about 2 µA it is low (TRADE.md); a meter in series reads negative with its leads reversed
        bands: [
          {
            to: 0,
            label: 'Negative: meter leads reversed',
            verdict: 'below',
            askAgain:
              'A negative reading means the meter leads are reversed, not that there is no flame. Lock out, swap the leads at the meter, restore power and read again.',
          },
          { from: 0, to: 0.1, label: 'No flame signal', verdict: 'below', outcome: 'carry-over' },
          { from: 0.1, to: 2, label: 'Low flame signal', verdict: 'below', outcome: 'carry-over' },
          { from: 2, label: 'Good flame signal', verdict: 'within', outcome: 'f-control-not-sensing' },
        ],
        bandsNote: TYPICAL(
          "a flame signal: a few microamps is good, below about 2 µA is low; the control's own minimum is lower and varies",
        ),
      },
      {
        id: 'control-flame-test',
        kind: 'inspect',
        title: "Flame signal by the control's own test",
        instruction:
          "Find which flame-signal test the control provides, on its label or in its instructions: test terminals read with the meter on DC volts, or a status light read against the control's own legend. Do not put a meter in the rod lead.",
        cautions: [SINGLE_ROD],
        why: 'On a single-rod unit the control is the only safe place to read the flame signal; its own test says whether it sees the flame.',
        energy: ANY,
        observe: { what: 'flame-test-method', choices: { 'dc-test-terminals': 'test-terminals', 'status-light': 'status-light' } },
        choices: [
          { value: 'test-terminals', label: 'Flame-signal test terminals, read in DC volts', outcome: 'connect-flame-test-meter' },
          { value: 'status-light', label: "A status light, read against the control's legend", outcome: 'control-status-light' },
        ],
      },
      {
        id: 'connect-flame-test-meter',
        kind: 'action',
        title: "Put the meter on the control's flame-signal test terminals",
        instruction:
          "Set the meter to DC volts. With the power locked out, connect its leads to the control's flame-signal test terminals (+ and −) as the control's instructions show. Nothing goes on the rod or its lead.",
        cautions: [SINGLE_ROD],
        why: "The test terminals give a DC voltage that follows the flame current, away from the spark: the meter never joins the rod's circuit.",
        energy: POWER_OFF,
        handles: ['electric'],
        checklist: [
          'Meter set to DC volts',
          "Meter leads on the control's flame-signal test terminals (+ and −), as its instructions show",
          'Nothing connected to the rod or its lead; meter leads routed clear of the spark lead and the burner',
        ],
        outcome: 'control-flame-voltage',
      },
      {
        id: 'control-flame-voltage',
        kind: 'measure',
        title: "Flame signal at the control's test terminals (DC volts)",
        instruction: `Call for heat and read the DC volts at the test terminals once the burners are lit, before the control drops out. The bands assume a control that gives about ${DC_TEST_TERMINALS.voltsPerMicroamp} VDC per µA of flame current, a figure recalled from such controls and not from a published source: use the control manufacturer's instructions and values where they say otherwise.`,
        cautions: [SINGLE_ROD, SPARK],
        why: 'The control turns its flame current into a DC voltage at its test terminals: the same rectification signal, read where it is safe on a single-rod unit.',
        energy: FIRING,
        probe: { a: 'flame-test-plus', b: 'flame-test-minus' },
        at: 'proving',
        timeline: true,
        quantity: 'vdc',
        points: ['control flame-signal test terminal (+)', 'control flame-signal test terminal (−)'],
        bands: dcFlameTestBands(DC_TEST_TERMINALS, { none: 'carry-over', low: 'carry-over', good: 'f-control-not-sensing' }),
        bandsNote: TYPICAL(
          `a control whose test terminals give about ${DC_TEST_TERMINALS.voltsPerMicroamp} VDC per µA: below ${DC_TEST_TERMINALS.lowBelow} VDC is low. The control manufacturer's values come first`,
        ),
      },
      {
        id: 'control-status-light',
        kind: 'inspect',
        title: "Flame signal by the control's status light",
        instruction:
          "During a trial, read the control's status light against the legend on the control or in its instructions, exactly as they describe. Do not put a meter in the rod lead.",
        cautions: [SINGLE_ROD, SPARK],
        why: 'A control without test terminals reports what it sees of the flame by its status light; its own legend says what each pattern means.',
        energy: FIRING,
        observe: { what: 'flame-test', at: 'proving', choices: { good: 'good', weak: 'weak', none: 'none' } },
        timeline: true,
        note: { label: 'What the control reports (a light pattern, against its own legend)', required: true },
        choices: [
          { value: 'good', label: 'The control reports a good flame signal', outcome: 'f-control-not-sensing' },
          { value: 'weak', label: 'It reports a weak flame signal', outcome: 'carry-over' },
          { value: 'none', label: 'It reports no flame', outcome: 'carry-over' },
        ],
      },
      {
        id: 'carry-over',
        kind: 'inspect',
        title: 'Does the flame carry across to the sensing side?',
        instruction:
          'During the trial, watch the flame travel from the burner at the spark rod across every burner to the one at the flame rod.',
        cautions: [SPARK],
        why: 'The flame rod is usually on the far burner: if the flame never gets there, the control cannot prove it.',
        energy: FIRING,
        observe: { what: 'flame', at: 'proving', choices: { 'all-burners': 'carries', partial: 'not-carrying' } },
        timeline: true,
        choices: [
          { value: 'carries', label: 'Flame reaches every burner and the rod', outcome: 'rod-inspect' },
          { value: 'not-carrying', label: 'Flame stops before the rod', outcome: 'carry-over-inspect' },
        ],
      },
      {
        id: 'carry-over-inspect',
        kind: 'inspect',
        title: 'Carry-over and far burners',
        instruction: "Look at the carry-over (cross-lighting) slots between the burners and at the far burners' orifices.",
        cautions: [HOT_PARTS],
        why: 'Rust in the carry-over slots or a blocked orifice on a far burner stops the flame short of the rod.',
        energy: ALL_OFF,
        observe: { what: 'carry-over', choices: { rusted: 'rusted' } },
        observeMore: [{ what: 'orifices', choices: { blocked: 'orifice-blocked', clear: 'clear' } }],
        choices: [
          { value: 'rusted', label: 'Carry-over rusted, scaled or blocked', outcome: 'f-rusted-carry-over' },
          { value: 'orifice-blocked', label: "A far burner's orifice or inlet blocked", outcome: 'f-blocked-orifices' },
          { value: 'clear', label: 'Carry-over and orifices clear', outcome: 'rod-inspect' },
        ],
      },
      {
        id: 'rod-inspect',
        kind: 'inspect',
        title: 'Flame rod condition',
        instruction:
          'Remove the flame rod. Look at the metal where the flame touches it, at the ceramic, and at where the rod sits in the flame.',
        cautions: [HOT_PARTS],
        why: 'An oxide or deposit film on the rod, a cracked ceramic leaking current to ground, or a rod out of the flame are the common causes of a weak signal.',
        energy: POWER_OFF,
        observe: {
          what: 'flame-rod',
          choices: { dirty: 'dirty', 'ceramic-cracked': 'ceramic-cracked', 'out-of-flame': 'out-of-flame', good: 'good' },
        },
        handles: ['electric'],
        choices: [
          { value: 'dirty', label: 'Rod dirty, coated or oxidized', outcome: 'f-dirty-flame-rod' },
          { value: 'ceramic-cracked', label: 'Ceramic cracked', outcome: 'f-cracked-rod-ceramic' },
          { value: 'out-of-flame', label: 'Rod bent or out of the flame', outcome: 'f-flame-rod-out-of-flame' },
          { value: 'good', label: 'Rod clean, ceramic whole, in the flame', outcome: 'burner-surface' },
        ],
      },
      {
        id: 'burner-surface',
        kind: 'inspect',
        title: 'Burner surface under the flame',
        instruction: 'Look at the burner surface the flame touches near the rod: it carries the flame current back to ground.',
        cautions: [HOT_PARTS],
        why: 'Flame rectification needs the grounded burner to be much larger and cleaner than the rod; rust and scale there weaken the signal.',
        energy: POWER_OFF,
        observe: { what: 'burner-surface', choices: { rusted: 'rusted', clean: 'clean' } },
        choices: [
          { value: 'rusted', label: 'Rusted or scaled', outcome: 'f-burner-surface-rust' },
          { value: 'clean', label: 'Clean metal', outcome: 'flame-lead-continuity' },
        ],
      },
      {
        id: 'flame-lead-continuity',
        kind: 'measure',
        title: 'Flame-rod lead continuity',
        instruction:
          'Disconnect the flame-rod lead at both ends. Meter on ohms: measure from end to end, and flex the lead along its length while you read.',
        cautions: [HOT_PARTS],
        why: 'A lead broken inside its insulation, or a terminal that lets go when warm, cuts the flame current with a rod that looks fine.',
        energy: POWER_OFF,
        probe: { lead: 'flame-rod-lead' },
        handles: ['electric'],
        quantity: 'ohm',
        points: ['flame-rod lead, control end', 'flame-rod lead, rod end'],
        bands: [
          { to: 2, label: 'Continuity, steady when flexed', verdict: 'within', outcome: 'ground-path' },
          { from: 2, label: 'High, unsteady or open (OL)', verdict: 'above', outcome: 'f-flame-lead-open' },
        ],
        bandsNote: OHMS_NOTE,
      },
      {
        id: 'ground-path',
        kind: 'measure',
        title: 'Ground path from the burner to the control',
        instruction:
          "Meter on ohms. Measure from the burner (where the flame touches it) to the control's ground terminal, and wiggle the ground lead and its connections while you read.",
        cautions: [HOT_PARTS],
        why: 'The flame current returns through the burner, its mounting and the ground lead: a loose or open ground lead breaks the circuit.',
        energy: POWER_OFF,
        probe: { a: 'burner', b: 'ground-lead' },
        handles: ['electric'],
        quantity: 'ohm',
        points: ['burner, where the flame touches it', 'control ground terminal'],
        bands: [
          { to: 2, label: 'Good ground path', verdict: 'within', outcome: 'f-control-not-sensing' },
          { from: 2, label: 'High, unsteady or open ground path', verdict: 'above', outcome: 'f-open-ground-lead' },
        ],
        bandsNote: OHMS_NOTE,
      },
      // ── Findings: each says the energy its repair needs ──────────────────────
      {
        id: 'f-no-line-power',
        kind: 'finding',
        title: 'No line power to the unit',
        explanation:
          'Line voltage does not reach the unit: a tripped breaker or blown fuse, the unit service switch off, or an open supply circuit.',
        remedy:
          'Find why power is off before restoring it: reset or replace the overcurrent device only after checking the circuit for a fault; turn on the service switch; have open supply wiring repaired by a licensed electrician.',
        cautions: [LINE_VOLTAGE],
        energy: ANY,
        verification: ['Line voltage at the unit between 108 and 132 VAC', VERIFY_CYCLES],
        tags: ['power', 'no-line-power'],
        expects: [{ step: 'line-voltage', to: 108, reason: 'No line power means the unit supply reads low or zero' }],
      },
      {
        id: 'f-line-voltage-high',
        kind: 'finding',
        title: 'Line voltage high',
        explanation:
          'The supply voltage is above the usual range for a 120 V appliance; controls and transformers may be damaged or shut down.',
        remedy:
          'Do not run the unit on a high supply. Have the supply checked by the utility or a licensed electrician; then recheck the transformer and the control.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        verification: ['Line voltage at the unit between 108 and 132 VAC', VERIFY_CYCLES],
        tags: ['power'],
        expects: [{ step: 'line-voltage', from: 132, reason: 'A high-supply finding needs a high line reading' }],
      },
      {
        id: 'f-neutral-ground-voltage',
        kind: 'finding',
        title: 'Voltage between neutral and ground',
        explanation:
          'The neutral sits well above ground at the unit: a loose or corroded neutral, or a ground bonded wrongly. The control may not see the flame current return.',
        remedy:
          'Have the supply neutral and the ground connections of the circuit checked and corrected by a licensed electrician, from the unit back to the panel.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        verification: ['Neutral to ground near 0 V at the unit', 'Burners stay lit past the flame-proving window', VERIFY_CYCLES],
        tags: ['power', 'flame-signal'],
        expects: [{ step: 'neutral-ground', from: 2, to: 90, reason: 'Voltage between neutral and ground' }],
      },
      {
        id: 'f-reversed-polarity',
        kind: 'finding',
        title: 'Reversed polarity at the unit',
        explanation:
          'Hot and neutral are swapped at the unit supply: the control senses flame against what it takes to be neutral, so it sees no flame and drops out.',
        remedy:
          'Correct the supply wiring so the hot lands on the line terminal and the neutral on the neutral, at the unit and upstream where it was swapped.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        verification: [
          'Neutral to ground near 0 V and hot to ground at line voltage',
          'Burners stay lit past the flame-proving window',
          VERIFY_CYCLES,
        ],
        tags: ['power', 'flame-signal', 'reversed-polarity'],
        expects: [{ step: 'neutral-ground', from: 90, reason: 'Line voltage between neutral and ground' }],
      },
      {
        id: 'f-lost-ground',
        kind: 'finding',
        title: 'Open or poor ground at the unit',
        explanation:
          'Hot to ground reads far less than hot to neutral: the equipment ground is open or poor, and the flame current has no sure return.',
        remedy:
          'Restore the equipment ground from the panel to the unit cabinet and the control; tighten and clean every ground connection.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        verification: [
          'Hot to ground at line voltage, the same as hot to neutral',
          'Burners stay lit past the flame-proving window',
          VERIFY_CYCLES,
        ],
        tags: ['power', 'flame-signal', 'lost-ground'],
        expects: [{ step: 'hot-ground', to: 108, reason: 'Hot to ground reads low' }],
      },
      {
        id: 'f-no-power-to-control',
        kind: 'finding',
        title: 'Line power not reaching the control',
        explanation:
          'Line voltage is at the unit but not at the line-powered control: the blower door switch, a connector or the wiring between them is open.',
        remedy:
          'Check the door switch with the door on, the connectors and the wiring from the junction box to the control; repair or replace the open part.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Door interlock switch (if open)'],
        verification: ['Line voltage at the control between 108 and 132 VAC with the door on', VERIFY_CYCLES],
        tags: ['power'],
        expects: [
          { step: 'line-voltage', from: 108, reason: 'Line power was present at the unit' },
          { step: 'control-line-voltage', to: 108, reason: 'Line power is missing at the control' },
        ],
      },
      {
        id: 'f-no-power-to-transformer',
        kind: 'finding',
        title: 'Line power not reaching the transformer',
        explanation:
          "Line voltage is at the unit but not on the transformer primary: the door switch, a connector, the control's transformer feed (on a line-powered control) or the wiring is open.",
        remedy: 'Trace the primary feed back from the transformer to the supply and repair the open switch, connector or wire.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        verification: ['Line voltage on the transformer primary and 24 V on the secondary', VERIFY_CYCLES],
        tags: ['power'],
        expects: [
          { step: 'transformer-secondary', to: 18, reason: 'No 24 V was the starting symptom' },
          { step: 'transformer-primary', to: 108, reason: 'No line voltage on the primary' },
        ],
      },
      {
        id: 'f-open-transformer',
        kind: 'finding',
        title: 'Open control transformer',
        explanation:
          "Line voltage is on the primary but the secondary gives no 24 V: a winding or the transformer's internal protection is open.",
        remedy:
          'Replace the transformer with one of the same voltages and at least the same VA rating. Before powering the new one, look for the short that may have burnt the old one (chafed thermostat wire, shorted valve coil).',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['24 VAC control transformer, matching primary voltage and VA rating'],
        verification: ['24 VAC (18 to 30 V) at the secondary under load', 'Transformer load within its VA rating', VERIFY_CYCLES],
        tags: ['power', 'open-transformer'],
        expects: [
          { step: 'transformer-secondary', to: 18, reason: 'An open transformer gives no 24 V' },
          { step: 'transformer-primary', from: 108, reason: 'Line voltage reaches the primary' },
        ],
      },
      {
        id: 'f-blown-fuse',
        kind: 'finding',
        title: 'Blown control fuse',
        explanation: 'The transformer gives 24 V but nothing passes the low-voltage fuse: a short in the control circuit has blown it.',
        remedy:
          'Find and repair the short before replacing the fuse (chafed thermostat or outdoor-unit wire, shorted valve coil, wire touching the cabinet), then fit a fuse of the rating the control calls for (3 A is common).',
        cautions: [LINE_AT_CONTROL],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Low-voltage fuse of the rating printed on the control'],
        verification: ['24 V past the fuse', 'Fuse intact after several heat cycles', VERIFY_CYCLES],
        tags: ['power', 'blown-fuse'],
        expects: [
          { step: 'transformer-secondary', from: 18, reason: 'The transformer itself gives 24 V' },
          { step: 'fuse-output', to: 18, reason: 'No 24 V past the fuse' },
        ],
      },
      {
        id: 'f-no-call-for-heat',
        kind: 'finding',
        title: 'No call for heat',
        explanation:
          'The thermostat does not close R to W at the furnace: thermostat set wrong, dead batteries, a failed thermostat, or an open wire between the thermostat and the furnace.',
        remedy:
          'Set the thermostat correctly, replace batteries, then check the wire from the thermostat to W; repair the wire or replace the thermostat.',
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Thermostat batteries or thermostat, as found'],
        verification: ['24 V from W to C at the furnace when the thermostat calls', VERIFY_CYCLES],
        tags: ['thermostat', 'no-call-for-heat'],
        expects: [
          { step: 'fuse-output', from: 18, reason: '24 V is available to the thermostat' },
          { step: 'w-voltage', to: 18, reason: 'No call reaches W' },
        ],
      },
      {
        id: 'f-open-high-limit',
        kind: 'finding',
        title: 'Open high limit',
        explanation:
          'The high limit is open: the furnace overheated (blower not running, dirty filter, closed or blocked registers, dirty coil) or the switch has failed open.',
        remedy:
          'Find why it overheated: check the blower, the filter, the registers and the airflow through the heat exchanger. Replace the limit only if it is open when cool, with the exact rated part. Never jumper it.',
        cautions: [NO_BYPASS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['High limit of the exact rating (only if failed)'],
        verification: ['About 0 V across the high limit with the call on', 'Temperature rise within the rating plate range', VERIFY_CYCLES],
        tags: ['safety-circuit', 'open-high-limit'],
        expects: [
          { step: 'control-th-input', to: 18, reason: 'The call did not reach the control' },
          { step: 'high-limit-across', from: 2, reason: 'Voltage across the switch means it is open' },
        ],
      },
      {
        id: 'f-tripped-rollout',
        kind: 'finding',
        title: 'Tripped rollout switch',
        explanation:
          'A rollout switch is open: flame has left the combustion chamber. Common causes are a blocked vent or flue, a cracked heat exchanger and over-firing. It is a sign of a combustion hazard, not just a failed switch.',
        remedy:
          'Do not reset it to restore heat. Find the cause first: inspect and test the vent and flue, inspect the heat exchanger, check manifold pressure and orifices for over-firing. Correct the cause, then reset the switch (or replace it if it will not reset) and check the combustion.',
        cautions: [ROLLOUT],
        energy: ALL_OFF,
        handles: ['electric'],
        parts: ['Rollout switch of the exact rating (only if it will not reset)'],
        verification: [
          'Cause of the rollout found and corrected, and recorded',
          'Vent draft and combustion checked',
          'No flame rollout watched through several full heat cycles',
          VERIFY_CYCLES,
        ],
        tags: ['safety-circuit', 'combustion', 'tripped-rollout'],
        expects: [
          { step: 'control-th-input', to: 18, reason: 'The call did not reach the control' },
          { step: 'rollout-continuity', from: 2, reason: 'An open rollout switch reads OL' },
        ],
      },
      {
        id: 'f-safety-circuit-wiring-open',
        kind: 'finding',
        title: 'Open wire or connector in the safety circuit',
        explanation:
          'The call reaches the furnace and both safety switches are closed, but 24 V does not reach the control: a wire or connector in the series string is open.',
        remedy:
          'Follow the string from W through each switch to the control thermostat input, measuring as you go; repair the open wire or connector.',
        energy: POWER_OFF,
        handles: ['electric'],
        verification: ['24 V at the control thermostat input with the call on', VERIFY_CYCLES],
        tags: ['safety-circuit', 'wiring'],
        expects: [
          { step: 'w-voltage', from: 18, reason: 'The call reaches the furnace' },
          { step: 'control-th-input', to: 18, reason: 'The call does not reach the control' },
          { step: 'high-limit-across', to: 2, reason: 'The high limit is closed' },
          { step: 'rollout-continuity', to: 2, reason: 'The rollout switch is closed' },
        ],
      },
      {
        id: 'f-no-inducer-output',
        kind: 'finding',
        title: 'Control not starting the inducer',
        explanation: 'The control has its call but puts no line voltage on its inducer output, so the sequence never starts.',
        remedy:
          'Confirm the control is not in its own lockout (reset it by removing the call for a few seconds); if it still gives the inducer nothing, replace the control with one that matches the unit.',
        cautions: [LINE_AT_CONTROL],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['DSI ignition control matching the unit'],
        verification: ['Inducer starts within seconds of each call', VERIFY_CYCLES],
        tags: ['draft', 'control', 'no-inducer-output'],
        expects: [
          { step: 'control-th-input', from: 18, reason: 'The control has its call' },
          { step: 'inducer-voltage', to: 108, reason: 'No voltage to the inducer' },
        ],
      },
      {
        id: 'f-inducer-motor',
        kind: 'finding',
        title: 'Inducer motor failed',
        explanation:
          'Line voltage reaches the inducer on the call but the motor does not run: seized bearings, an open winding or a blocked wheel.',
        remedy:
          'Check the wheel turns freely and is not blocked; replace the inducer motor (or assembly) with the matching part and its gasket.',
        cautions: [HOT_PARTS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Inducer motor or assembly, with gasket'],
        verification: ['Inducer runs and the pressure switch closes on each call', VERIFY_CYCLES],
        tags: ['draft', 'inducer-motor'],
        expects: [{ step: 'inducer-voltage', from: 108, reason: 'Line voltage reaches the inducer' }],
      },
      {
        id: 'f-pressure-hose',
        kind: 'finding',
        title: 'Pressure switch hose faulty',
        explanation:
          'The hose from the sensing port to the pressure switch is cracked, kinked, off its fitting or holding water, so the switch does not see the draft.',
        remedy: 'Replace the hose with the right material and length, routed so it drains back to the port with no sag or kink.',
        cautions: [NO_BYPASS],
        energy: POWER_OFF,
        parts: ['Pressure switch hose'],
        verification: ['About 0 V across the pressure switch with the inducer running', VERIFY_CYCLES],
        tags: ['draft', 'pressure-hose'],
        expects: [{ step: 'pressure-switch-across', from: 2, reason: 'The pressure switch stays open' }],
      },
      {
        id: 'f-pressure-port-blocked',
        kind: 'finding',
        title: 'Pressure sensing port blocked',
        explanation: 'Scale or debris blocks the sensing port on the inducer or the collector box, so the switch does not see the draft.',
        remedy: 'Clear the port as the manufacturer describes without enlarging it; find the water or debris source.',
        cautions: [NO_BYPASS, HOT_PARTS],
        energy: POWER_OFF,
        verification: ['About 0 V across the pressure switch with the inducer running', VERIFY_CYCLES],
        tags: ['draft', 'pressure-port-blocked'],
        expects: [{ step: 'pressure-switch-across', from: 2, reason: 'The pressure switch stays open' }],
      },
      {
        id: 'f-vent-blocked',
        kind: 'finding',
        title: 'Vent blocked or disconnected',
        explanation:
          'The vent is blocked, crushed, disconnected or holding water: the inducer cannot move the flue gas out, and the pressure switch rightly stays open.',
        remedy:
          'Clear or repair the vent to the manufacturer’s venting instructions and the local code; do not run the unit until it is clear and sound. Check the building for carbon monoxide if the unit ran with it blocked.',
        cautions: [VENT],
        energy: ALL_OFF,
        verification: ['Vent clear and sound to its termination', 'Pressure switch closes with the inducer running', VERIFY_CYCLES],
        tags: ['draft', 'combustion', 'vent-blocked'],
        expects: [{ step: 'pressure-switch-across', from: 2, reason: 'The pressure switch stays open' }],
      },
      {
        id: 'f-pressure-switch-failed',
        kind: 'finding',
        title: 'Pressure switch failed open',
        explanation: 'The inducer runs, the hose, port and vent are sound, but the switch does not close.',
        remedy: 'Replace the pressure switch with the exact part (same setting). Never jumper it.',
        cautions: [NO_BYPASS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Pressure switch of the exact setting'],
        verification: ['About 0 V across the pressure switch with the inducer running', VERIFY_CYCLES],
        tags: ['draft', 'pressure-switch-failed'],
        expects: [{ step: 'pressure-switch-across', from: 2, reason: 'The pressure switch stays open' }],
      },
      {
        id: 'f-broken-spark-lead',
        kind: 'finding',
        title: 'Broken spark lead (sparking inside)',
        explanation:
          'The conductor inside the spark lead is broken or burnt, so the spark jumps the break inside the lead instead of the gap.',
        remedy: 'Replace the spark lead with one of the right length and type, routed away from metal edges and the flame-rod lead.',
        cautions: [SPARK],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Spark (ignition) lead'],
        verification: ['Spark seen at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark', 'broken-spark-lead'],
        expects: [{ step: 'control-th-input', from: 18, reason: 'The control has its call, so it should spark' }],
      },
      {
        id: 'f-cracked-lead-insulation',
        kind: 'finding',
        title: 'Cracked spark lead insulation (arcing to the frame)',
        explanation:
          'The spark lead insulation or boot is cracked or carbon-tracked, so the spark goes to the frame before it reaches the gap.',
        remedy: 'Replace the spark lead and boot; route the new lead away from the cabinet and sharp edges.',
        cautions: [SPARK],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Spark (ignition) lead with boot'],
        verification: ['No arcing away from the gap, watched in the dark', 'Spark seen at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark', 'cracked-lead-insulation'],
      },
      {
        id: 'f-spark-gap-or-rod',
        kind: 'finding',
        title: 'Spark gap out of range or spark rod bent',
        explanation:
          'The spark gap is too wide or too close, or the rod is bent so the spark is not in the gas stream or goes to the frame.',
        remedy:
          "Straighten or replace the spark rod and set the gap (about 1/8 in is common; the manufacturer's gap rules). Replace a rod that will not hold its position.",
        cautions: [SPARK, HOT_PARTS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Spark rod (if it will not hold its gap)'],
        verification: [
          'Gap measured within the band after the repair',
          'Burners light within the first seconds of the trial',
          VERIFY_CYCLES,
        ],
        tags: ['spark', 'spark-gap'],
      },
      {
        id: 'f-control-not-sparking',
        kind: 'finding',
        title: 'Control not sparking at the rod',
        explanation:
          "The control has its 24 V call (and its draft proven, on an induced-draft unit) and the spark lead is sound, but no spark reaches the rod: the control's spark circuit has failed.",
        remedy:
          "Reset the control once by removing the call for a few seconds to rule out the control's own lockout; if it still does not spark, replace the control with one that matches the unit.",
        cautions: [SPARK, LINE_AT_CONTROL],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['DSI ignition control matching the unit'],
        verification: ['Spark at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark', 'control', 'control-not-sparking'],
        expects: [{ step: 'control-th-input', from: 18, reason: 'The control has its call' }],
      },
      {
        id: 'f-secondary-low-under-load',
        kind: 'finding',
        title: '24 V drops under load',
        explanation:
          'The transformer gives less than 18 V during the trial: it is overloaded (too many loads for its VA rating, a partly shorted valve coil) or failing.',
        remedy:
          'Add up the loads on the transformer against its VA rating (the transformer-load aid); replace an undersized or failing transformer, or the shorted load.',
        cautions: [LINE_VOLTAGE],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['24 VAC control transformer of an adequate VA rating (if undersized or failing)'],
        verification: ['18 to 30 V at the secondary during the trial', VERIFY_CYCLES],
        tags: ['power'],
        expects: [{ step: 'valve-secondary', to: 18, reason: 'Low 24 V during the trial' }],
      },
      {
        id: 'f-no-valve-voltage-from-control',
        kind: 'finding',
        title: 'No valve voltage from the control',
        explanation: 'The control sparks but does not put 24 V on its valve output during the trial.',
        remedy: 'Confirm the control is not in its own lockout and is getting a proper call; then replace the control.',
        cautions: [LINE_AT_CONTROL],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['DSI ignition control matching the unit'],
        verification: ['24 V at the gas valve within the first seconds of the trial', VERIFY_CYCLES],
        tags: ['control', 'gas-valve', 'no-valve-voltage'],
        expects: [{ step: 'control-valve-output', to: 18, reason: 'No voltage at the control valve output' }],
      },
      {
        id: 'f-valve-wiring-resistance',
        kind: 'finding',
        title: 'Valve voltage lost in the wiring',
        explanation:
          'The control puts out 24 V but the valve gets more than about 2 V less than the transformer gives: resistance in the wiring or a connection between them (a loose, corroded or burnt terminal, a broken strand).',
        remedy:
          'Clean or replace the terminals and repair or replace the wire between the control and the valve; the voltage-drop aid shows what a wire of that gauge and length should drop.',
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Valve wiring harness or terminals, as found'],
        verification: ['Valve voltage within about 2 V of the transformer during the trial', VERIFY_CYCLES],
        tags: ['gas-valve', 'wiring', 'valve-wiring-resistance'],
        expects: [{ step: 'control-valve-output', from: 18, reason: 'Normal voltage at the control' }],
      },
      {
        id: 'f-gas-valve-not-opening',
        kind: 'finding',
        title: 'Gas valve not opening with 24 V',
        explanation: 'The valve has its voltage during the trial and gas at its inlet, but no gas leaves it.',
        remedy:
          "Check that the valve's own on/off control is on; if it is, replace the gas valve with the matching part for the fuel, and leak-test every joint.",
        cautions: [GAS],
        energy: ALL_OFF,
        handles: ['electric', 'gas'],
        parts: ['Gas valve matching the fuel and the unit'],
        verification: ['Manifold pressure set to the rating plate', 'Every gas joint leak-tested', VERIFY_CYCLES],
        tags: ['gas-valve', 'gas-supply', 'valve-not-opening'],
        expects: [
          { step: 'inlet-pressure', from: 4.5, reason: 'Gas reaches the valve' },
          { step: 'manifold-pressure', to: 0.5, reason: 'No gas leaves the valve' },
          { step: 'lp-inlet-pressure', from: 11, reason: 'LP reaches the valve' },
          { step: 'lp-manifold-pressure', to: 0.5, reason: 'No gas leaves the valve' },
        ],
      },
      {
        id: 'f-no-gas-or-low-pressure',
        kind: 'finding',
        title: 'No gas or low gas supply pressure',
        explanation:
          'Gas does not reach the valve at its normal pressure: a closed shutoff, an empty LP tank, a supply or meter problem, or undersized piping that drops when the burners open.',
        remedy:
          'Open closed shutoffs; have the LP tank filled or the utility check the meter and supply; have undersized piping corrected. Purge air per the gas code before lighting.',
        cautions: [GAS],
        energy: ANY,
        verification: ['Inlet pressure within the band, steady when the burners fire', VERIFY_CYCLES],
        tags: ['gas-supply', 'no-gas'],
        expects: [
          { step: 'inlet-pressure', to: 4.5, reason: 'Low or no gas at the inlet' },
          { step: 'lp-inlet-pressure', to: 11, reason: 'Low or no LP at the inlet' },
        ],
      },
      {
        id: 'f-inlet-over-pressure',
        kind: 'finding',
        title: 'Gas supply over-pressure',
        explanation:
          "The inlet pressure is far above what the appliance takes: the supply regulator (at the meter or the tank, or a line regulator) is failing or set wrong. The valve's own regulator cannot be relied on above its rated inlet.",
        remedy:
          'Leave the unit off at its gas valve and have the supply regulator checked and corrected by the gas supplier or a licensed gas fitter before the unit runs again.',
        cautions: [GAS],
        energy: GAS_OFF,
        verification: ["Inlet pressure within the appliance's range, steady when the burners fire", VERIFY_CYCLES],
        tags: ['gas-supply', 'inlet-over-pressure'],
        expects: [
          { step: 'inlet-pressure', from: 14, reason: 'Natural-gas inlet over-pressure' },
          { step: 'lp-inlet-pressure', from: 14, reason: 'LP inlet over-pressure' },
        ],
      },
      {
        id: 'f-manifold-pressure-low',
        kind: 'finding',
        title: 'Manifold pressure low',
        explanation:
          'The supply is good but the valve delivers less than its set pressure: the regulator is set low or failing, so the flame is weak and may not carry across or hold the rod.',
        remedy:
          "With the manometer on the outlet tap and the burners firing, set the manifold pressure to the rating plate with the valve's regulator. A valve that will not regulate has to be replaced, with power and gas off: send the diagnosis to a lead rather than changing it here.",
        cautions: [GAS],
        energy: FIRING,
        verification: ['Manifold pressure at the rating plate value', 'Outlet tap closed and leak-tested', VERIFY_CYCLES],
        tags: ['gas-supply', 'gas-valve'],
        expects: [
          { step: 'inlet-pressure', from: 4.5, reason: 'The supply is good' },
          { step: 'manifold-pressure', from: 0.5, to: 3, reason: 'Low outlet pressure' },
          { step: 'lp-inlet-pressure', from: 11, reason: 'The LP supply is good' },
          { step: 'lp-manifold-pressure', from: 0.5, to: 9.5, reason: 'Low LP outlet pressure' },
        ],
      },
      {
        id: 'f-manifold-pressure-high',
        kind: 'finding',
        title: 'Manifold pressure high (over-firing)',
        explanation:
          'The valve delivers more than the usual setting: the flame can lift off the burner and the rod, and over-firing can overheat the heat exchanger and trip the rollout switch.',
        remedy:
          'With the manometer on the outlet tap and the burners firing, set the manifold pressure to the rating plate and check the orifices match the fuel. A valve that will not regulate has to be replaced, with power and gas off: send the diagnosis to a lead rather than changing it here.',
        cautions: [GAS],
        energy: FIRING,
        verification: [
          'Manifold pressure at the rating plate value',
          'Flame steady on the burners and the rod',
          'Outlet tap closed and leak-tested',
          VERIFY_CYCLES,
        ],
        tags: ['gas-supply', 'gas-valve', 'combustion'],
        expects: [
          { step: 'manifold-pressure', from: 4, reason: 'High outlet pressure' },
          { step: 'lp-manifold-pressure', from: 11.5, reason: 'High LP outlet pressure' },
        ],
      },
      {
        id: 'f-blocked-orifices',
        kind: 'finding',
        title: 'Blocked orifices or burner inlets',
        explanation:
          'Gas at the right pressure cannot get out of the orifices or mix in the burner: debris, rust scale, spider webs or insect nests.',
        remedy:
          'Clean the orifices with a soft tool that does not enlarge them, blow out the burners and their inlets; replace damaged orifices with the size for the fuel.',
        cautions: [GAS, HOT_PARTS],
        energy: ALL_OFF,
        handles: ['electric', 'gas'],
        parts: ['Orifices of the size for the fuel (if damaged)'],
        verification: ['Every burner lights and carries across on each trial', 'Every gas joint leak-tested', VERIFY_CYCLES],
        tags: ['gas-supply', 'burner', 'blocked-orifices'],
      },
      {
        id: 'f-no-ignition-not-isolated',
        kind: 'finding',
        title: 'Burners do not light: not isolated by this tree',
        explanation:
          'Spark, valve voltage, gas pressure and orifices all check out, yet the burners do not light. The cause is outside what this tree isolates (for example the wrong orifices for the fuel or spark timing).',
        remedy:
          "Recheck the steps, compare the orifices with the fuel on the rating plate, and escalate to a lead or the manufacturer's technical support.",
        energy: ALL_OFF,
        verification: ['Cause found and recorded by the person it was escalated to', VERIFY_CYCLES],
        tags: ['escalate'],
        expects: [{ step: 'manifold-pressure', from: 3, to: 4, reason: 'Gas leaves the valve at its set pressure' }],
      },
      {
        id: 'f-ignition-proven',
        kind: 'finding',
        title: 'Ignition works: the burners stay lit',
        explanation:
          'The control lights the burners and proves the flame, so the no-heat complaint lies outside the ignition sequence: the blower, the airflow, the thermostat ending the call early, or a limit cycling the burners.',
        remedy:
          'Watch a whole cycle: does the blower start and move air, does the call hold, does a limit open after a few minutes? Follow what you see; escalate to a lead if it is not clear.',
        energy: ANY,
        verification: ['Complaint reproduced and its cause recorded', VERIFY_CYCLES],
        tags: ['escalate'],
      },
      {
        id: 'f-rusted-carry-over',
        kind: 'finding',
        title: 'Rusted carry-over',
        explanation:
          'Rust or scale in the cross-lighting slots stops the flame from travelling across the burners to the flame rod, so the control never sees flame.',
        remedy:
          'Remove the burners; clean the carry-over slots and the burners with a wire brush; replace burners that are rusted through. Look for the water source (condensate, vent, humidifier) that rusted them.',
        cautions: [HOT_PARTS, GAS],
        energy: ALL_OFF,
        handles: ['electric', 'gas'],
        parts: ['Burners (if rusted through)'],
        verification: [
          'Flame carries across every burner within a second or two',
          'Flame signal in the good band',
          'Every gas joint leak-tested',
          VERIFY_CYCLES,
        ],
        tags: ['burner', 'flame-signal', 'rusted-carry-over'],
      },
      {
        id: 'f-dirty-flame-rod',
        kind: 'finding',
        title: 'Dirty or oxidized flame rod',
        explanation: 'A film of oxide or deposits on the flame rod resists the small flame current, so the signal is low or absent.',
        remedy:
          'Clean the rod with fine abrasive cloth or a fine abrasive pad — not soap-filled steel wool — and wipe it; replace the rod if it is pitted or will not clean.',
        cautions: [HOT_PARTS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Flame rod (if pitted)'],
        verification: ['Flame signal after the repair in the good band (2 µA or more)', VERIFY_CYCLES],
        tags: ['flame-signal', 'dirty-flame-rod'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A dirty rod gives a low or no flame signal' }],
      },
      {
        id: 'f-cracked-rod-ceramic',
        kind: 'finding',
        title: 'Cracked rod ceramic',
        explanation:
          'The ceramic insulator of a rod is cracked: on the spark rod the spark leaks to ground through it; on the flame rod the flame current leaks to ground without passing through the flame, and the signal is low.',
        remedy: "Replace the rod (or the rod assembly) and set it to the manufacturer's position and gap.",
        cautions: [HOT_PARTS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Spark rod or flame rod, as found'],
        verification: ['Spark at the gap on every trial', 'Burners light and stay lit on every trial', VERIFY_CYCLES],
        tags: ['spark', 'flame-signal', 'cracked-rod-ceramic'],
      },
      {
        id: 'f-flame-rod-out-of-flame',
        kind: 'finding',
        title: 'Flame rod bent or out of the flame',
        explanation: 'The flame rod is not where the flame envelops it, so little current flows.',
        remedy: "Set the rod back into the flame at the manufacturer's position, or replace it if bent or burnt.",
        cautions: [HOT_PARTS],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Flame rod (if bent or burnt)'],
        verification: ['Flame signal after the repair in the good band (2 µA or more)', VERIFY_CYCLES],
        tags: ['flame-signal'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A rod out of the flame gives a low signal' }],
      },
      {
        id: 'f-burner-surface-rust',
        kind: 'finding',
        title: 'Rust on the burner surface under the flame',
        explanation: 'The grounded burner surface the flame touches is rusted or scaled, so the flame current has a poor return to ground.',
        remedy: "Remove the burner; clean its surface to bare metal around the rod's flame, or replace the burner.",
        cautions: [HOT_PARTS, GAS],
        energy: ALL_OFF,
        handles: ['electric', 'gas'],
        parts: ['Burner (if rusted through)'],
        verification: ['Flame signal after the repair in the good band (2 µA or more)', 'Every gas joint leak-tested', VERIFY_CYCLES],
        tags: ['flame-signal', 'burner', 'burner-surface-rust'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A poor return gives a low signal' }],
      },
      {
        id: 'f-flame-lead-open',
        kind: 'finding',
        title: 'Flame-rod lead open or intermittent',
        explanation:
          'The lead from the control to the flame rod is broken inside, or a terminal lets go, so the flame current cannot reach the control.',
        remedy: 'Replace the flame-rod lead and its terminals; route it away from the spark lead and hot surfaces.',
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Flame-rod lead'],
        verification: ['Lead continuity steady when flexed', 'Burners stay lit past the flame-proving window', VERIFY_CYCLES],
        tags: ['flame-signal', 'wiring', 'flame-lead-open'],
        expects: [{ step: 'flame-lead-continuity', from: 2, reason: 'The lead reads high or open' }],
      },
      {
        id: 'f-open-ground-lead',
        kind: 'finding',
        title: 'Open or loose ground lead',
        explanation: 'The ground path from the burner back to the control is open, loose or corroded, so the flame current cannot return.',
        remedy: 'Clean and tighten the ground connections at the burner and the control; replace a broken ground lead.',
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['Ground lead (if broken)'],
        verification: [
          'Ground path a fraction of an ohm, steady when wiggled',
          'Burners stay lit past the flame-proving window',
          VERIFY_CYCLES,
        ],
        tags: ['flame-signal', 'wiring', 'open-ground-lead'],
        expects: [{ step: 'ground-path', from: 2, reason: 'The ground path reads high or open' }],
      },
      {
        id: 'f-control-not-sensing',
        kind: 'finding',
        title: 'Control not sensing a good flame signal',
        explanation:
          'Polarity and ground are right and the flame signal is good (or the rod, its lead and the ground path are sound), yet the control does not hold the flame: its flame-sensing circuit has failed.',
        remedy:
          'Confirm the rod lead is on the right terminal and the control is grounded to the cabinet, then replace the control with one that matches the unit.',
        cautions: [LINE_AT_CONTROL],
        energy: POWER_OFF,
        handles: ['electric'],
        parts: ['DSI ignition control matching the unit'],
        verification: ['Burners stay lit past the flame-proving window on every trial', VERIFY_CYCLES],
        tags: ['flame-signal', 'control', 'control-not-sensing'],
        expects: [
          { step: 'neutral-ground', to: 2, reason: 'Polarity is right' },
          { step: 'hot-ground', from: 108, reason: 'The ground is sound' },
          { step: 'ground-path', to: 2, reason: 'The ground path is sound' },
        ],
      },
    ],
  },
};

/** The default graph parsed (defaults applied); importing this module fails loudly if the data is invalid. */
export const DEFAULT_TREE_GRAPH: TreeGraph = treeGraphSchema.parse(DEFAULT_TREE.graph);
