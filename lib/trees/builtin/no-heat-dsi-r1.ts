// Revision 1 of the built-in "no heat" tree, as it was seeded before revision 2 (default-tree.ts).
// Kept unchanged so that a company whose published tree is still exactly this revision is upgraded
// on start (lib/trees/builtin.ts); never edit it. It knows one energy source (electricity).
//
// The seeded fault tree for "no heat" on a direct spark ignition furnace, in the order a technician
// isolates the fault: line power → 24 V and fuse → thermostat call → safety circuit → spark → gap
// and rod → valve voltage → gas → carry-over → flame signal → rod, burner and ground → the control.
// Trade facts here are common practice, no source (TRADE.md), unless a comment names one. Every band
// is a default a lead can change; the rating plate and the manufacturer's data rule.
import type { Caution } from '@/lib/trees/schema';
import type { DefaultTree } from '@/lib/trees/default-tree';

const DEFER = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

const LINE_VOLTAGE: Caution = {
  signal: 'WARNING',
  text: `Line voltage (about 120 VAC) is present at the unit's supply, its junction box and a line-powered control. Contact can kill or injure. Use a meter rated for the circuit and insulated probes, keep fingers behind the probe guards and clear of bare terminals. ${DEFER}`,
};

const SPARK: Caution = {
  signal: 'WARNING',
  text: `The ignition spark is on the order of 10 kV during the trial for ignition. Keep hands, probes and tools away from the spark lead, the spark rod and the burner while the control is powered and calling for heat. ${DEFER}`,
};

const ROD_VOLTAGE: Caution = {
  signal: 'WARNING',
  text: `The control puts AC voltage on the flame rod (commonly about 50 to 180 VAC, depending on the control) during the trial and while the burner runs; a line-powered control keeps it there whenever it is powered. Make and break meter connections with power locked out; do not touch the rod, its lead or the meter leads while the unit is powered. ${DEFER}`,
};

const GAS: Caution = {
  signal: 'WARNING',
  text: `Natural gas and LP burn and explode. If you smell gas, stop: operate no switches, make no sparks, shut off the gas supply, ventilate and follow the gas emergency procedure. Close every pressure tap you opened and leak-test it with leak-detection solution or a gas detector before you leave. ${DEFER}`,
};

const ROLLOUT: Caution = {
  signal: 'DANGER',
  text: `A tripped rollout switch means flame has left the combustion chamber: a blocked vent or flue, a cracked heat exchanger or over-firing can release fire or carbon monoxide. Do not reset, jumper or bypass the switch to restore heat until the cause is found and corrected. ${DEFER}`,
};

const NO_BYPASS: Caution = {
  signal: 'WARNING',
  text: `Never jumper or bypass a high limit or a rollout switch to make the unit run: they are what stops overheating and flame rollout. ${DEFER}`,
};

const HOT_PARTS: Caution = {
  signal: 'CAUTION',
  text: `Burner parts, rods and the heat exchanger may be hot right after a trial or a run. Let them cool or wear gloves; ceramics are brittle, so handle the rods by their brackets. ${DEFER}`,
};

const VERIFY_CYCLES = 'Run at least three full heat cycles from a thermostat call to the end of the call without a lockout';

const VAC_NOTE = (what: string) =>
  `Default bands for ${what} — common practice, no source. A lead can change them; the rating plate and the manufacturer's data rule.`;

const LINE_NOTE = VAC_NOTE('a 120 VAC supply (nominal ±10 %)');
const LOW_VOLTAGE_NOTE = VAC_NOTE('a 24 VAC control circuit: below 18 V is low or absent, 18 to 30 V is normal, 30 V and over is high');

export const NO_HEAT_DSI_R1: DefaultTree = {
  revision: 1,
  slug: 'no-heat-dsi',
  title: 'No heat — direct spark ignition',
  symptom: 'No heat',
  equipmentKind: 'dsi-furnace',
  graph: {
    start: 'line-voltage',
    steps: [
      // ── Line power ────────────────────────────────────────────────────────────
      {
        id: 'line-voltage',
        kind: 'measure',
        title: 'Line voltage at the unit',
        instruction:
          'Meter on AC volts. Measure between the supply hot and neutral where power enters the unit (the junction box or the unit service switch, load side).',
        cautions: [LINE_VOLTAGE],
        why: 'Nothing in the unit works without line power. Starting here rules out the simplest cause before you open the burner compartment.',
        energy: 'energized',
        quantity: 'vac',
        points: ['unit supply hot (L1), load side of the service switch', 'unit supply neutral'],
        bands: [
          { to: 108, label: 'Low or no line voltage', verdict: 'below', outcome: 'f-no-line-power' },
          { from: 108, to: 132, label: 'Normal line voltage', verdict: 'within', outcome: 'control-supply' },
          { from: 132, label: 'High line voltage', verdict: 'above', outcome: 'f-line-voltage-high' },
        ],
        bandsNote: LINE_NOTE,
      },
      {
        id: 'control-supply',
        kind: 'inspect',
        title: 'How is the ignition control powered?',
        instruction:
          "Look at the wiring diagram on the panel or at the control's terminals: does the control take line voltage itself, or only 24 V from the transformer?",
        why: 'A line-powered control needs its own line voltage, and it keeps voltage on the flame rod whenever it is powered.',
        energy: 'any',
        choices: [
          { value: 'low-voltage-only', label: '24 V only (the transformer feeds the control)', outcome: 'transformer-secondary' },
          { value: 'line-powered', label: 'Line-powered control (line voltage at the control)', outcome: 'control-line-voltage' },
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
        energy: 'energized',
        quantity: 'vac',
        points: ['control line input (L1)', 'control neutral'],
        bands: [
          { to: 108, label: 'Low or no line voltage at the control', verdict: 'below', outcome: 'f-no-power-to-control' },
          { from: 108, label: 'Line voltage present at the control', verdict: 'within', outcome: 'transformer-secondary' },
        ],
        bandsNote: LINE_NOTE,
      },
      // ── 24 V and the fuse ─────────────────────────────────────────────────────
      {
        id: 'transformer-secondary',
        kind: 'measure',
        title: '24 V at the transformer secondary',
        instruction: "Measure across the transformer's low-voltage terminals (R and C side).",
        cautions: [LINE_VOLTAGE],
        why: 'The whole control circuit — thermostat, safety switches, control and gas valve — runs on this 24 V.',
        energy: 'energized',
        quantity: 'vac',
        points: ['transformer secondary, R side', 'transformer secondary, common (C)'],
        bands: [
          { to: 18, label: 'Low or no 24 V', verdict: 'below', outcome: 'transformer-primary' },
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
        energy: 'energized',
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
        why: 'The fuse sits between the transformer and the thermostat circuit; a short anywhere downstream blows it.',
        energy: 'energized',
        quantity: 'vac',
        points: ['control fuse, load side (R past the fuse)', 'transformer common (C)'],
        bands: [
          { to: 18, label: 'Low or no 24 V past the fuse', verdict: 'below', outcome: 'f-blown-fuse' },
          { from: 18, to: 30, label: 'Normal 24 V past the fuse', verdict: 'within', outcome: 'thermostat-call' },
          { from: 30, label: 'High 24 V past the fuse', verdict: 'above', outcome: 'thermostat-call' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
      },
      // ── Thermostat call ───────────────────────────────────────────────────────
      {
        id: 'thermostat-call',
        kind: 'inspect',
        title: 'Is the thermostat calling for heat?',
        instruction:
          'Set the thermostat to heat, a few degrees above room temperature. Does it show a call for heat (display on, heat indicator, a click)?',
        why: 'Without a call (R closed to W) the control has no reason to start.',
        energy: 'any',
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
        why: 'The thermostat closing R to W puts 24 V on W. Measuring at the furnace proves the thermostat and its wire together.',
        energy: 'energized',
        quantity: 'vac',
        points: ['furnace terminal W', 'furnace terminal C'],
        bands: [
          { to: 18, label: 'No call reaching the furnace', verdict: 'below', outcome: 'f-no-call-for-heat' },
          { from: 18, to: 30, label: 'Call present (24 V on W)', verdict: 'within', outcome: 'control-th-input' },
          { from: 30, label: 'Call present, voltage high', verdict: 'above', outcome: 'control-th-input' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
      },
      // ── Safety circuit ────────────────────────────────────────────────────────
      {
        id: 'control-th-input',
        kind: 'measure',
        title: '24 V at the control thermostat input',
        instruction: "With the call on, measure from the control's thermostat input (TH) to its common (TR).",
        why: 'The call passes through the high limit and the rollout switch in series before it reaches the control. 24 V here proves the whole safety circuit closed.',
        energy: 'energized',
        quantity: 'vac',
        points: ['control thermostat input (TH)', 'control common (TR)'],
        bands: [
          { to: 18, label: 'Call not reaching the control', verdict: 'below', outcome: 'high-limit-across' },
          { from: 18, to: 30, label: 'Call reaches the control', verdict: 'within', outcome: 'spark-observe' },
          { from: 30, label: 'Call reaches the control, voltage high', verdict: 'above', outcome: 'spark-observe' },
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
        energy: 'energized',
        quantity: 'vac',
        points: ['high limit, supply-side terminal', 'high limit, load-side terminal'],
        bands: [
          { to: 2, label: 'About 0 V: the high limit is closed', verdict: 'within', outcome: 'rollout-continuity' },
          { from: 2, label: 'Voltage across: the high limit is open', verdict: 'above', outcome: 'f-open-high-limit' },
        ],
        bandsNote: VAC_NOTE('the voltage across a switch in a 24 V series circuit: near 0 V closed, near 24 V open'),
      },
      {
        id: 'rollout-continuity',
        kind: 'measure',
        title: 'Rollout switch continuity',
        instruction:
          'With power locked out, disconnect one wire from each rollout switch and measure across its terminals with the meter on ohms. Look for a popped reset button and scorching near the burner opening, but do not press the reset.',
        cautions: [ROLLOUT],
        why: 'The high limit is closed, so the open point is the rollout switch or the wiring. A tripped rollout is a warning of a combustion hazard, not a part failure.',
        energy: 'locked-out',
        quantity: 'ohm',
        points: ['rollout switch, terminal 1 (wire removed)', 'rollout switch, terminal 2'],
        bands: [
          { to: 2, label: 'Continuity: the rollout switch is closed', verdict: 'within', outcome: 'f-safety-circuit-wiring-open' },
          { from: 2, label: 'Open (OL) or high: the rollout switch is open', verdict: 'above', outcome: 'f-tripped-rollout' },
        ],
        bandsNote:
          'Default bands: a closed switch reads a fraction of an ohm, an open one reads OL — common practice, no source. A lead can change them.',
      },
      // ── Spark ─────────────────────────────────────────────────────────────────
      {
        id: 'spark-observe',
        kind: 'inspect',
        title: 'Is there a spark, and where?',
        instruction:
          'Reset the control (remove the call for a few seconds), then call for heat again and watch the burner through the sight glass during the trial for ignition. Listen for the ticking of the spark.',
        cautions: [SPARK],
        why: 'Where the spark goes tells you which part to look at: a spark heard but not seen is escaping inside the lead or the control; one seen off the gap is escaping to the frame.',
        energy: 'energized',
        choices: [
          { value: 'at-gap', label: 'Spark jumps the gap at the burner', outcome: 'spark-gap' },
          { value: 'heard-not-seen', label: 'Ticking heard, no spark at the gap', outcome: 'spark-lead-inspect' },
          {
            value: 'arcing-elsewhere',
            label: 'Spark seen jumping to the frame or the burner away from the gap',
            outcome: 'arcing-inspect',
          },
          { value: 'none', label: 'No spark and no ticking', outcome: 'f-control-not-sparking' },
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
        energy: 'locked-out',
        choices: [
          { value: 'lead-broken', label: 'Conductor broken, burnt or terminal loose', outcome: 'f-broken-spark-lead' },
          { value: 'lead-intact', label: 'Lead intact', outcome: 'f-control-not-sparking' },
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
        energy: 'locked-out',
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
        energy: 'locked-out',
        quantity: 'length',
        points: ['spark rod tip', 'ground rod or burner'],
        bands: [
          { to: 0.09, label: 'Too close', verdict: 'below', outcome: 'f-spark-gap-or-rod' },
          { from: 0.09, to: 0.16, label: 'About 1/8 in', verdict: 'within', outcome: 'rod-condition' },
          { from: 0.16, label: 'Too wide', verdict: 'above', outcome: 'f-spark-gap-or-rod' },
        ],
        bandsNote:
          "Default bands around a gap of about 1/8 in (3.2 mm), ±1/32 in — common practice, no source. A lead can change them; the manufacturer's gap rules.",
      },
      {
        id: 'rod-condition',
        kind: 'inspect',
        title: 'Spark rod position and ceramic',
        instruction: 'Check that the spark rod sits over the burner port where the gas comes out and that its ceramic is whole.',
        cautions: [HOT_PARTS],
        why: 'The spark must be in the gas stream to light it.',
        energy: 'locked-out',
        choices: [
          { value: 'good', label: 'Rod in position, ceramic whole', outcome: 'valve-voltage' },
          { value: 'bent', label: 'Rod bent or out of the gas stream', outcome: 'f-spark-gap-or-rod' },
          { value: 'ceramic-cracked', label: 'Ceramic cracked', outcome: 'f-cracked-rod-ceramic' },
        ],
      },
      // ── Gas valve voltage ─────────────────────────────────────────────────────
      {
        id: 'valve-voltage',
        kind: 'measure',
        title: '24 V at the gas valve during the trial',
        instruction:
          'Put the meter leads on the gas valve terminals, reset the control and call for heat. The valve is powered only during the trial for ignition: read within the first seconds after the spark starts.',
        cautions: [SPARK],
        why: 'The spark is proven; now prove the control opens the valve. No voltage points to the control or the wiring; voltage with no gas points to the valve or the supply.',
        energy: 'energized',
        quantity: 'vac',
        points: ['gas valve terminal (from the control valve output)', 'gas valve common terminal'],
        bands: [
          { to: 18, label: 'Low or no valve voltage', verdict: 'below', outcome: 'control-valve-output' },
          { from: 18, to: 30, label: 'Normal valve voltage', verdict: 'within', outcome: 'connect-manometer' },
          { from: 30, label: 'High valve voltage', verdict: 'above', outcome: 'connect-manometer' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
        aids: ['voltage-drop'],
      },
      {
        id: 'control-valve-output',
        kind: 'measure',
        title: 'Valve output at the control during the trial',
        instruction: "Measure from the control's valve output terminal to its common during the trial, as close to the control as you can.",
        cautions: [SPARK],
        why: 'Comparing the control end with the valve end splits the fault between the control and the wiring in between.',
        energy: 'energized',
        quantity: 'vac',
        points: ['control valve output terminal', 'control common (TR)'],
        bands: [
          { to: 18, label: 'The control gives no valve voltage', verdict: 'below', outcome: 'f-no-valve-voltage-from-control' },
          { from: 18, to: 30, label: 'The control gives 24 V', verdict: 'within', outcome: 'f-valve-wiring-resistance' },
          { from: 30, label: 'The control gives high voltage', verdict: 'above', outcome: 'f-valve-wiring-resistance' },
        ],
        bandsNote: LOW_VOLTAGE_NOTE,
        aids: ['voltage-drop'],
      },
      // ── Gas reaching the burners ──────────────────────────────────────────────
      {
        id: 'connect-manometer',
        kind: 'action',
        title: 'Connect the manometer',
        instruction:
          "Close the unit's manual gas shutoff, open the gas valve's inlet pressure tap and connect a manometer. Reopen the shutoff and leak-test the connection.",
        cautions: [GAS],
        why: 'The valve gets its 24 V; the next question is whether gas at the right pressure reaches and leaves it.',
        energy: 'any',
        checklist: [
          'Manual gas shutoff closed before the tap is opened',
          'Manometer connected to the inlet pressure tap',
          'Shutoff reopened and the connection leak-tested',
        ],
        outcome: 'fuel-type',
      },
      {
        id: 'fuel-type',
        kind: 'inspect',
        title: 'Which gas does the rating plate name?',
        instruction: "Read the fuel on the unit's rating plate (and the conversion label, if the unit was converted).",
        why: 'Natural gas and LP run at very different pressures, so the pressure bands that follow depend on the fuel.',
        energy: 'any',
        choices: [
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
        why: 'A supply that is off, or drops when the valve opens, cannot give the burners enough gas.',
        energy: 'energized',
        quantity: 'pressure',
        points: ['gas valve inlet pressure tap', 'atmosphere (manometer open side)'],
        bands: [
          { to: 4.5, label: 'Low or no inlet pressure', verdict: 'below', outcome: 'f-no-gas-or-low-pressure' },
          { from: 4.5, to: 10.5, label: 'Normal natural-gas inlet pressure', verdict: 'within', outcome: 'manifold-pressure' },
          { from: 10.5, label: 'Above the usual natural-gas range: check the fuel', verdict: 'above', outcome: 'manifold-pressure' },
        ],
        bandsNote:
          "Default bands for natural gas — common practice, no source. A lead can change them; the rating plate and the gas valve's data rule.",
      },
      {
        id: 'manifold-pressure',
        kind: 'measure',
        title: 'Manifold (outlet) pressure during the trial',
        instruction:
          "Move the manometer to the valve's outlet pressure tap (gas shut off while you move it, leak-test after), then read it during the trial for ignition.",
        cautions: [GAS, SPARK],
        why: 'The outlet pressure shows whether the valve opens and regulates: inlet pressure with no outlet pressure while the valve has 24 V means the valve is not opening.',
        energy: 'energized',
        quantity: 'pressure',
        points: ['gas valve outlet (manifold) pressure tap', 'atmosphere (manometer open side)'],
        bands: [
          { to: 0.5, label: 'No outlet pressure: the valve does not open', verdict: 'below', outcome: 'f-gas-valve-not-opening' },
          { from: 0.5, to: 3, label: 'Low manifold pressure', verdict: 'below', outcome: 'f-manifold-pressure-low' },
          { from: 3, to: 4, label: 'About 3.5 inWC', verdict: 'within', outcome: 'burners-light' },
          { from: 4, label: 'High manifold pressure', verdict: 'above', outcome: 'f-manifold-pressure-high' },
        ],
        bandsNote:
          'Default bands around the usual natural-gas manifold setting of about 3.5 inWC (LP about 10 to 11 inWC) — common practice, no source. A lead can change them; the rating plate rules.',
      },
      {
        id: 'lp-inlet-pressure',
        kind: 'measure',
        title: 'LP inlet pressure',
        instruction: 'Read the inlet pressure with the gas on, then again during the trial for ignition; enter the lower reading.',
        cautions: [GAS],
        why: 'An empty tank, a closed tank valve or a failing regulator starves the burners; the pressure drop when the valve opens shows it.',
        energy: 'energized',
        quantity: 'pressure',
        points: ['gas valve inlet pressure tap', 'atmosphere (manometer open side)'],
        bands: [
          { to: 8, label: 'Low or no LP inlet pressure', verdict: 'below', outcome: 'f-no-gas-or-low-pressure' },
          { from: 8, to: 14, label: 'Normal LP inlet pressure', verdict: 'within', outcome: 'lp-manifold-pressure' },
          { from: 14, label: 'High LP inlet pressure: check the regulator', verdict: 'above', outcome: 'lp-manifold-pressure' },
        ],
        bandsNote:
          "Default bands for LP supplied at about 11 inWC — common practice, no source. A lead can change them; the rating plate and the gas valve's data rule.",
      },
      {
        id: 'lp-manifold-pressure',
        kind: 'measure',
        title: 'LP manifold (outlet) pressure during the trial',
        instruction:
          "Move the manometer to the valve's outlet pressure tap (gas shut off while you move it, leak-test after), then read it during the trial for ignition.",
        cautions: [GAS, SPARK],
        why: 'The outlet pressure shows whether the valve opens and regulates at the LP setting.',
        energy: 'energized',
        quantity: 'pressure',
        points: ['gas valve outlet (manifold) pressure tap', 'atmosphere (manometer open side)'],
        bands: [
          { to: 0.5, label: 'No outlet pressure: the valve does not open', verdict: 'below', outcome: 'f-gas-valve-not-opening' },
          { from: 0.5, to: 9.5, label: 'Low LP manifold pressure', verdict: 'below', outcome: 'f-manifold-pressure-low' },
          { from: 9.5, to: 11.5, label: 'About 10 to 11 inWC', verdict: 'within', outcome: 'burners-light' },
          { from: 11.5, label: 'High LP manifold pressure', verdict: 'above', outcome: 'f-manifold-pressure-high' },
        ],
        bandsNote:
          'Default bands around the usual LP manifold setting of about 10 to 11 inWC — common practice, no source. A lead can change them; the rating plate rules.',
      },
      {
        id: 'burners-light',
        kind: 'inspect',
        title: 'Do the burners light?',
        instruction: 'Watch the burners through the sight glass during the trial for ignition.',
        cautions: [SPARK],
        why: 'Spark, valve voltage and gas pressure are proven; whether the gas lights separates the burner and orifices from the flame-sensing side.',
        energy: 'energized',
        choices: [
          { value: 'none', label: 'No burner lights', outcome: 'burner-inspect' },
          { value: 'light', label: 'Burners light (then drop out after a few seconds, or stay lit)', outcome: 'carry-over' },
        ],
      },
      {
        id: 'burner-inspect',
        kind: 'inspect',
        title: 'Orifices and burner inlets',
        instruction:
          'Remove the burner assembly as the manufacturer describes and look into the orifices and the burner inlets for debris, rust scale, spider webs or insect nests.',
        cautions: [HOT_PARTS, GAS],
        why: 'Gas at the right pressure that never lights is often gas that cannot get out of the orifices or mix with air.',
        energy: 'locked-out',
        choices: [
          { value: 'orifices-blocked', label: 'Orifices or burner inlets blocked', outcome: 'f-blocked-orifices' },
          { value: 'nothing-found', label: 'Orifices and inlets clear', outcome: 'f-no-ignition-not-isolated' },
        ],
      },
      // ── Carry-over ────────────────────────────────────────────────────────────
      {
        id: 'carry-over',
        kind: 'inspect',
        title: 'Does the flame carry across to the sensing side?',
        instruction:
          'During the trial, watch the flame travel from the burner at the spark rod across every burner to the one at the flame rod.',
        cautions: [SPARK],
        why: 'The flame rod is usually on the far burner: if the flame never gets there, the control cannot prove it.',
        energy: 'energized',
        choices: [
          { value: 'carries', label: 'Flame reaches every burner and the flame rod', outcome: 'connect-microammeter' },
          { value: 'not-carrying', label: 'Flame stops before the flame rod', outcome: 'carry-over-inspect' },
        ],
      },
      {
        id: 'carry-over-inspect',
        kind: 'inspect',
        title: 'Carry-over and far burners',
        instruction: "Look at the carry-over (cross-lighting) slots between the burners and at the far burners' orifices.",
        cautions: [HOT_PARTS],
        why: 'Rust in the carry-over slots or a blocked orifice on a far burner stops the flame short of the rod.',
        energy: 'locked-out',
        choices: [
          { value: 'rusted', label: 'Carry-over rusted, scaled or blocked', outcome: 'f-rusted-carry-over' },
          { value: 'orifice-blocked', label: "A far burner's orifice or inlet blocked", outcome: 'f-blocked-orifices' },
          { value: 'clear', label: 'Carry-over and orifices clear', outcome: 'connect-microammeter' },
        ],
      },
      // ── Flame signal ──────────────────────────────────────────────────────────
      {
        id: 'connect-microammeter',
        kind: 'action',
        title: 'Put the meter in series in the flame-rod lead',
        instruction:
          "Set the meter to DC microamps. Disconnect the flame-rod lead at the control and connect the meter between the control's flame-sense terminal and the lead, so the flame current flows through the meter.",
        cautions: [ROD_VOLTAGE],
        why: 'Flame current is a few DC microamps; it can only be measured with the meter in series, and the connection must be made with no voltage on the rod.',
        energy: 'locked-out',
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
        why: 'The control proves flame by rectification: the flame conducts a small DC current from the rod to the grounded burner. A weak current points to the rod, the burner surface or the ground path.',
        energy: 'energized',
        quantity: 'udc',
        points: ['control flame-sense terminal', 'flame-rod lead, meter in series'],
        bands: [
          { to: 0.1, label: 'No flame signal', verdict: 'below', outcome: 'rod-inspect' },
          { from: 0.1, to: 2, label: 'Low flame signal', verdict: 'below', outcome: 'rod-inspect' },
          { from: 2, label: 'Good flame signal', verdict: 'within', outcome: 'f-control-not-sensing' },
        ],
        bandsNote:
          "Default bands: a few microamps is a good signal, below about 2 µA it is getting low — common practice, no source. The control's own minimum is lower and varies; a lead can change the bands and the manufacturer's data rule.",
      },
      // ── Rod, ceramic, burner surface and ground path ──────────────────────────
      {
        id: 'rod-inspect',
        kind: 'inspect',
        title: 'Flame rod condition',
        instruction:
          'Remove the flame rod. Look at the metal where the flame touches it, at the ceramic, and at where the rod sits in the flame.',
        cautions: [HOT_PARTS],
        why: 'An oxide or deposit film on the rod, a cracked ceramic leaking current to ground, or a rod out of the flame are the common causes of a weak signal.',
        energy: 'locked-out',
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
        energy: 'locked-out',
        choices: [
          { value: 'rusted', label: 'Rusted or scaled', outcome: 'f-burner-surface-rust' },
          { value: 'clean', label: 'Clean metal', outcome: 'ground-path' },
        ],
      },
      {
        id: 'ground-path',
        kind: 'measure',
        title: 'Ground path from the burner to the control',
        instruction:
          "Meter on ohms. Measure from the burner (where the flame touches it) to the control's ground terminal, and wiggle the ground lead and its connections while you read.",
        cautions: [HOT_PARTS],
        why: 'The flame current returns through the burner, its mounting and the ground lead: a loose or open ground lead breaks the circuit.',
        energy: 'locked-out',
        quantity: 'ohm',
        points: ['burner, where the flame touches it', 'control ground terminal'],
        bands: [
          { to: 2, label: 'Good ground path', verdict: 'within', outcome: 'f-control-not-sensing' },
          { from: 2, label: 'High, unsteady or open ground path', verdict: 'above', outcome: 'f-open-ground-lead' },
        ],
        bandsNote:
          'Default bands: a sound ground path reads a fraction of an ohm and stays steady when wiggled — common practice, no source. A lead can change them.',
      },
      // ── Findings ──────────────────────────────────────────────────────────────
      {
        id: 'f-no-line-power',
        kind: 'finding',
        title: 'No line power to the unit',
        explanation:
          'Line voltage does not reach the unit: a tripped breaker or blown fuse, the unit service switch off, or an open supply circuit.',
        remedy:
          'Find why power is off before restoring it: reset or replace the overcurrent device only after checking the circuit for a fault; turn on the service switch; have open supply wiring repaired by a licensed electrician.',
        cautions: [LINE_VOLTAGE],
        energy: 'any',
        parts: [],
        verification: ['Line voltage at the unit between 108 and 132 VAC', VERIFY_CYCLES],
        tags: ['power'],
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
        energy: 'any',
        verification: ['Line voltage at the unit between 108 and 132 VAC', VERIFY_CYCLES],
        tags: ['power'],
        expects: [{ step: 'line-voltage', from: 132, reason: 'A high-supply finding needs a high line reading' }],
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
        energy: 'any',
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
        energy: 'any',
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
        energy: 'any',
        parts: ['24 VAC control transformer, matching primary voltage and VA rating'],
        verification: ['24 VAC (18 to 30 V) at the secondary under load', 'Transformer load within its VA rating', VERIFY_CYCLES],
        tags: ['power'],
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
        energy: 'any',
        parts: ['Low-voltage fuse of the rating printed on the control'],
        verification: ['24 V past the fuse', 'Fuse intact after several heat cycles', VERIFY_CYCLES],
        tags: ['power'],
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
        energy: 'any',
        parts: ['Thermostat batteries or thermostat, as found'],
        verification: ['24 V from W to C at the furnace when the thermostat calls', VERIFY_CYCLES],
        tags: ['thermostat'],
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
        energy: 'any',
        parts: ['High limit of the exact rating (only if failed)'],
        verification: ['About 0 V across the high limit with the call on', 'Temperature rise within the rating plate range', VERIFY_CYCLES],
        tags: ['safety-circuit'],
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
        energy: 'any',
        parts: ['Rollout switch of the exact rating (only if it will not reset)'],
        verification: [
          'Cause of the rollout found and corrected, and recorded',
          'Vent draft and combustion checked',
          'No flame rollout watched through several full heat cycles',
          VERIFY_CYCLES,
        ],
        tags: ['safety-circuit', 'combustion'],
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
        energy: 'any',
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
        id: 'f-broken-spark-lead',
        kind: 'finding',
        title: 'Broken spark lead (sparking inside)',
        explanation:
          'The conductor inside the spark lead is broken or burnt, so the spark jumps the break inside the lead instead of the gap.',
        remedy: 'Replace the spark lead with one of the right length and type, routed away from metal edges and the flame-rod lead.',
        cautions: [SPARK],
        energy: 'any',
        parts: ['Spark (ignition) lead'],
        verification: ['Spark seen at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark'],
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
        energy: 'any',
        parts: ['Spark (ignition) lead with boot'],
        verification: ['No arcing away from the gap, watched in the dark', 'Spark seen at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark'],
        expects: [{ step: 'control-th-input', from: 18, reason: 'The control has its call, so it should spark' }],
      },
      {
        id: 'f-spark-gap-or-rod',
        kind: 'finding',
        title: 'Spark gap out of range or spark rod bent',
        explanation:
          'The spark gap is too wide or too close, or the rod is bent so the spark is not in the gas stream or goes to the frame.',
        remedy:
          "Straighten or replace the spark rod and set the gap (about 1/8 in is common; the manufacturer's gap rules). Replace a rod that will not hold its position.",
        cautions: [SPARK],
        energy: 'any',
        parts: ['Spark rod (if it will not hold its gap)'],
        verification: [
          'Gap measured within the band after the repair',
          'Burners light within the first seconds of the trial',
          VERIFY_CYCLES,
        ],
        tags: ['spark'],
        expects: [{ step: 'control-th-input', from: 18, reason: 'The control has its call, so it should spark' }],
      },
      {
        id: 'f-control-not-sparking',
        kind: 'finding',
        title: 'Control not sparking at the rod',
        explanation:
          "The control has its 24 V call and the spark lead is sound, but no spark reaches the rod: the control's spark circuit has failed or is breaking down inside.",
        remedy:
          "Reset the control once by removing the call for a few seconds to rule out the control's own lockout; if it still does not spark, replace the control with one that matches the unit.",
        cautions: [SPARK],
        energy: 'any',
        parts: ['DSI ignition control matching the unit'],
        verification: ['Spark at the gap on every trial', VERIFY_CYCLES],
        tags: ['spark', 'control'],
        expects: [{ step: 'control-th-input', from: 18, reason: 'The control has its call' }],
      },
      {
        id: 'f-no-valve-voltage-from-control',
        kind: 'finding',
        title: 'No valve voltage from the control',
        explanation: 'The control sparks but does not put 24 V on its valve output during the trial.',
        remedy: 'Confirm the control is not in its own lockout and is getting a proper call; then replace the control.',
        energy: 'any',
        parts: ['DSI ignition control matching the unit'],
        verification: ['24 V at the gas valve within the first seconds of the trial', VERIFY_CYCLES],
        tags: ['control', 'gas-valve'],
        expects: [
          { step: 'control-th-input', from: 18, reason: 'The control has its call' },
          { step: 'control-valve-output', to: 18, reason: 'No voltage at the control valve output' },
        ],
      },
      {
        id: 'f-valve-wiring-resistance',
        kind: 'finding',
        title: 'Low valve voltage from wiring resistance',
        explanation:
          'The control puts out 24 V but the valve gets much less: resistance in the wiring or a connection between them (a loose, corroded or burnt terminal, a broken strand).',
        remedy:
          'Clean or replace the terminals and repair or replace the wire between the control and the valve; the voltage-drop aid shows what a wire of that gauge and length should drop.',
        energy: 'any',
        parts: ['Valve wiring harness or terminals, as found'],
        verification: ['Valve voltage within about 1 V of the control output during the trial', VERIFY_CYCLES],
        tags: ['gas-valve', 'wiring'],
        expects: [
          { step: 'valve-voltage', to: 18, reason: 'Low voltage at the valve' },
          { step: 'control-valve-output', from: 18, reason: 'Normal voltage at the control' },
        ],
      },
      {
        id: 'f-gas-valve-not-opening',
        kind: 'finding',
        title: 'Gas valve not opening with 24 V',
        explanation: 'The valve has 24 V during the trial and gas at its inlet, but no gas leaves it.',
        remedy:
          "Check that the valve's own on/off control is on; if it is, replace the gas valve with the matching part for the fuel, and leak-test every joint.",
        cautions: [GAS],
        energy: 'any',
        parts: ['Gas valve matching the fuel and the unit'],
        verification: ['Manifold pressure set to the rating plate', 'Every gas joint leak-tested', VERIFY_CYCLES],
        tags: ['gas-valve', 'gas-supply'],
        expects: [
          { step: 'valve-voltage', from: 18, reason: 'The valve is powered' },
          { step: 'inlet-pressure', from: 4.5, reason: 'Gas reaches the valve' },
          { step: 'manifold-pressure', to: 0.5, reason: 'No gas leaves the valve' },
          { step: 'lp-inlet-pressure', from: 8, reason: 'LP reaches the valve' },
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
        energy: 'any',
        verification: ['Inlet pressure within the band, steady when the burners fire', VERIFY_CYCLES],
        tags: ['gas-supply'],
        expects: [
          { step: 'inlet-pressure', to: 4.5, reason: 'Low or no gas at the inlet' },
          { step: 'lp-inlet-pressure', to: 8, reason: 'Low or no LP at the inlet' },
        ],
      },
      {
        id: 'f-manifold-pressure-low',
        kind: 'finding',
        title: 'Manifold pressure low',
        explanation:
          'The supply is good but the valve delivers less than its set pressure: the regulator is set low or failing, so the flame is weak and may not carry across or hold the rod.',
        remedy: "Set the manifold pressure to the rating plate with the valve's regulator; replace the valve if it will not regulate.",
        cautions: [GAS],
        energy: 'any',
        parts: ['Gas valve (if it will not regulate)'],
        verification: ['Manifold pressure at the rating plate value', VERIFY_CYCLES],
        tags: ['gas-supply', 'gas-valve'],
        expects: [
          { step: 'inlet-pressure', from: 4.5, reason: 'The supply is good' },
          { step: 'manifold-pressure', from: 0.5, to: 3, reason: 'Low outlet pressure' },
          { step: 'lp-inlet-pressure', from: 8, reason: 'The LP supply is good' },
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
          'Set the manifold pressure to the rating plate; check the orifices match the fuel; replace the valve if it will not regulate.',
        cautions: [GAS],
        energy: 'any',
        parts: ['Gas valve (if it will not regulate)'],
        verification: ['Manifold pressure at the rating plate value', 'Flame steady on the burners and the rod', VERIFY_CYCLES],
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
        cautions: [GAS],
        energy: 'any',
        parts: ['Orifices of the size for the fuel (if damaged)'],
        verification: ['Every burner lights and carries across on each trial', 'Every gas joint leak-tested', VERIFY_CYCLES],
        tags: ['gas-supply', 'burner'],
        expects: [{ step: 'manifold-pressure', from: 3, reason: 'Gas leaves the valve at its set pressure' }],
      },
      {
        id: 'f-no-ignition-not-isolated',
        kind: 'finding',
        title: 'Burners do not light: not isolated by this tree',
        explanation:
          'Spark, valve voltage, gas pressure and orifices all check out, yet the burners do not light. The cause is outside what this tree isolates (for example the wrong orifices for the fuel or spark timing).',
        remedy:
          "Recheck the steps, compare the orifices with the fuel on the rating plate, and escalate to a lead or the manufacturer's technical support.",
        energy: 'any',
        verification: ['Cause found and recorded by the person it was escalated to', VERIFY_CYCLES],
        tags: ['escalate'],
        expects: [
          { step: 'valve-voltage', from: 18, reason: 'The valve is powered' },
          { step: 'manifold-pressure', from: 3, to: 4, reason: 'Gas leaves the valve at its set pressure' },
        ],
      },
      {
        id: 'f-rusted-carry-over',
        kind: 'finding',
        title: 'Rusted carry-over',
        explanation:
          'Rust or scale in the cross-lighting slots stops the flame from travelling across the burners to the flame rod, so the control never sees flame.',
        remedy:
          'Clean the carry-over slots and the burners with a wire brush; replace burners that are rusted through. Look for the water source (condensate, vent, humidifier) that rusted them.',
        energy: 'any',
        parts: ['Burners (if rusted through)'],
        verification: ['Flame carries across every burner within a second or two', 'Flame signal in the good band', VERIFY_CYCLES],
        tags: ['burner', 'flame-signal'],
        expects: [{ step: 'manifold-pressure', from: 3, to: 4, reason: 'Gas pressure is normal, so a weak flame is not the cause' }],
      },
      {
        id: 'f-dirty-flame-rod',
        kind: 'finding',
        title: 'Dirty or oxidized flame rod',
        explanation: 'A film of oxide or deposits on the flame rod resists the small flame current, so the signal is low or absent.',
        remedy:
          'Clean the rod with fine abrasive cloth or a fine abrasive pad — not soap-filled steel wool — and wipe it; replace the rod if it is pitted or will not clean.',
        energy: 'any',
        parts: ['Flame rod (if pitted)'],
        verification: ['Flame signal after the repair in the good band (2 µA or more)', VERIFY_CYCLES],
        tags: ['flame-signal'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A dirty rod gives a low or no flame signal' }],
      },
      {
        id: 'f-cracked-rod-ceramic',
        kind: 'finding',
        title: 'Cracked rod ceramic',
        explanation:
          'The ceramic insulator of a rod is cracked: on the spark rod the spark leaks to ground through it; on the flame rod the flame current leaks to ground without passing through the flame, and the signal is low.',
        remedy: "Replace the rod (or the rod assembly) and set it to the manufacturer's position and gap.",
        energy: 'any',
        parts: ['Spark rod or flame rod, as found'],
        verification: ['Spark at the gap on every trial', 'Flame signal after the repair in the good band (2 µA or more)', VERIFY_CYCLES],
        tags: ['spark', 'flame-signal'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A cracked flame-rod ceramic gives a low signal' }],
      },
      {
        id: 'f-flame-rod-out-of-flame',
        kind: 'finding',
        title: 'Flame rod bent or out of the flame',
        explanation: 'The flame rod is not where the flame envelops it, so little current flows.',
        remedy: "Set the rod back into the flame at the manufacturer's position, or replace it if bent or burnt.",
        energy: 'any',
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
        remedy: "Clean the burner surface to bare metal around the rod's flame, or replace the burner.",
        energy: 'any',
        parts: ['Burner (if rusted through)'],
        verification: ['Flame signal after the repair in the good band (2 µA or more)', VERIFY_CYCLES],
        tags: ['flame-signal', 'burner'],
        expects: [{ step: 'flame-signal', to: 2, reason: 'A poor return gives a low signal' }],
      },
      {
        id: 'f-open-ground-lead',
        kind: 'finding',
        title: 'Open or loose ground lead',
        explanation: 'The ground path from the burner back to the control is open, loose or corroded, so the flame current cannot return.',
        remedy: 'Clean and tighten the ground connections at the burner and the control; replace a broken ground lead.',
        energy: 'any',
        parts: ['Ground lead (if broken)'],
        verification: [
          'Ground path a fraction of an ohm, steady when wiggled',
          'Flame signal after the repair in the good band (2 µA or more)',
          VERIFY_CYCLES,
        ],
        tags: ['flame-signal', 'wiring'],
        expects: [
          { step: 'flame-signal', to: 2, reason: 'An open return gives a low or no signal' },
          { step: 'ground-path', from: 2, reason: 'The ground path reads high or open' },
        ],
      },
      {
        id: 'f-control-not-sensing',
        kind: 'finding',
        title: 'Control not sensing a good flame signal',
        explanation:
          'Everything upstream is proven — power, call, safety circuit, spark, valve, gas, carry-over, rod and ground path — yet the control does not hold the flame: its flame-sensing circuit has failed.',
        remedy:
          'Confirm the rod lead is connected to the right terminal and the control is grounded to the cabinet, then replace the control with one that matches the unit.',
        energy: 'any',
        parts: ['DSI ignition control matching the unit'],
        verification: [
          'Burners stay lit past the flame-proving window on every trial',
          'Flame signal in the good band (2 µA or more)',
          VERIFY_CYCLES,
        ],
        tags: ['flame-signal', 'control'],
        expects: [
          { step: 'control-th-input', from: 18, reason: 'The control has its call' },
          { step: 'ground-path', to: 2, reason: 'The ground path is sound' },
        ],
      },
    ],
  },
};
