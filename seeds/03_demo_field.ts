import type { Knex } from 'knex';
import { CANONICAL_UNITS, treeGraphSchema, type UnitFacts } from '@/lib/trees/schema';
import { scriptedWalk, type WalkScript } from '@/machines/scripted-walk';

// Demo only (SEED_DEMO=true): invented sites, units and service calls for the two demo companies,
// including past calls over several years whose readings show a flame rod slowly fouling.
// Runs once: skipped when the first demo company already has sites.

type Id = { id: string };

// Readings of a healthy DSI furnace; each visit says what it saw during the trial and what was wrong.
const HEALTHY: WalkScript = {
  'line-voltage': 121.4,
  'control-line-voltage': 120.8,
  'transformer-secondary': 26.3,
  'transformer-primary': 120.6,
  'fuse-output': 26.2,
  'thermostat-call': 'calling',
  'w-voltage': 25.9,
  'control-th-input': 25.7,
  'high-limit-across': 0.1,
  'rollout-continuity': 0.3,
  'inducer-runs': 'runs',
  'pressure-switch-across': 0.1,
  'pressure-hose-inspect': 'clear',
  'vent-inspect': 'clear',
  'spark-listen': 'ticking',
  'spark-observe': 'at-gap',
  'spark-gap': 0.125,
  'rod-condition': 'good',
  'valve-secondary': 25.8,
  'valve-voltage': 25.2,
  'control-valve-output': 25.6,
  'inlet-pressure': 7.1,
  'manifold-pressure': 3.5,
  'lp-inlet-pressure': 11.8,
  'lp-manifold-pressure': 10.4,
  'neutral-ground': 0.4,
  'hot-ground': 121.1,
  'flame-signal': 4.8,
  'control-flame-test': 'test-terminals',
  'control-flame-voltage': 4.6,
  'control-status-light': 'good',
  'carry-over': 'carries',
  'rod-inspect': 'good',
  'burner-surface': 'clean',
  'flame-lead-continuity': 0.2,
  'ground-path': 0.4,
};

type UnitRecord = { ignition: string; fuel: string; controlSupply: string; draft: string };

export async function seed(knex: Knex): Promise<void> {
  if (process.env.SEED_DEMO !== 'true') return;
  const kestrel = await knex('companies').where({ name: 'Kestrel Valley Heating Co.' }).first('id');
  const ironbark = await knex('companies').where({ name: 'Ironbark Comfort Services' }).first('id');
  if (!kestrel || !ironbark) return;
  if (await knex('sites').where({ company_id: kestrel.id }).first('id')) return;

  const userId = async (email: string) => ((await knex('users').where({ email }).first('id')) as Id).id;
  const tech = await userId('technician@demo.test');
  const appr = await userId('apprentice@demo.test');
  const lead = await userId('lead@demo.test');
  const otherTech = await userId('technician@other.demo.test');

  async function publishedVersion(companyId: string) {
    const row = await knex('tree_versions as v')
      .join('fault_trees as t', 't.id', 'v.tree_id')
      .where({ 'v.company_id': companyId, 'v.status': 'published', 't.slug': 'no-heat-dsi' })
      .first('v.id', 'v.version', 'v.graph');
    return { id: row.id as string, version: row.version as number, graph: treeGraphSchema.parse(row.graph) };
  }
  const version = await publishedVersion(kestrel.id);

  async function site(companyId: string, name: string, address: string, contactEmail: string) {
    const [row] = await knex('sites').insert({ company_id: companyId, name, address, contact_email: contactEmail }).returning('id');
    return (row as Id).id;
  }
  async function unit(companyId: string, siteId: string, u: UnitRecord & { label: string; va: number; year: number }) {
    const [row] = await knex('units')
      .insert({
        company_id: companyId,
        site_id: siteId,
        label: u.label,
        ignition: u.ignition,
        fuel: u.fuel,
        control_supply: u.controlSupply,
        draft: u.draft,
        transformer_va: u.va,
        install_year: u.year,
      })
      .returning('id');
    units.set((row as Id).id, u);
    return (row as Id).id;
  }
  const units = new Map<string, UnitRecord>();

  interface PastVisit {
    unitId: string;
    on: string;
    complaint: string;
    by: string;
    script: WalkScript;
    repair: string;
    flameAfter: number;
    signedOffBy?: string;
  }

  async function pastCall(v: PastVisit) {
    const opened = new Date(v.on);
    const [call] = await knex('service_calls')
      .insert({
        company_id: kestrel.id,
        unit_id: v.unitId,
        complaint: v.complaint,
        technician_id: v.by,
        status: 'closed',
        created_by: v.by,
        repair_notes: v.repair,
        verification: JSON.stringify({
          cycles: 3,
          flameSignal: { text: `${v.flameAfter} µA`, value: v.flameAfter },
          checks: [
            { text: 'Three full heat cycles without a lockout', done: true },
            { text: 'Flame signal steady and in the good band after the repair', done: true },
          ],
        }),
        opened_at: opened,
        closed_at: new Date(opened.getTime() + 2 * 3600_000),
        closed_by: v.signedOffBy ?? v.by,
      })
      .returning('id');
    const record = units.get(v.unitId)!;
    // The visit went through the repair and its checks: the reading after the repair is its own answer.
    const { answers, finding } = scriptedWalk(
      version,
      { ...HEALTHY, 'after:flame-signal': v.flameAfter, ...v.script },
      { unit: record as UnitFacts, through: 'done' },
    );
    const [diagnosis] = await knex('diagnoses')
      .insert({
        company_id: kestrel.id,
        call_id: (call as Id).id,
        tree_version_id: version.id,
        user_id: v.by,
        status: 'verified',
        finding_step_id: finding.id,
        current_state: `done--${finding.id}`,
        energy: 'energized',
        gas: 'on',
        last_seq: answers.length,
        started_at: new Date(opened.getTime() + 10 * 60_000),
        finished_at: new Date(opened.getTime() + (12 + answers.length * 2) * 60_000),
        signed_off_by: v.signedOffBy ?? null,
        signed_off_at: v.signedOffBy ? new Date(opened.getTime() + 90 * 60_000) : null,
      })
      .returning('id');
    await knex('answers').insert(
      answers.map((a, i) => ({
        company_id: kestrel.id,
        diagnosis_id: (diagnosis as Id).id,
        client_id: knex.raw('gen_random_uuid()'),
        seq: i + 1,
        step_id: a.stepId,
        step_kind: a.step.kind,
        text: a.overRange ? 'OL' : a.auto ? 'From the unit record' : a.value !== undefined ? String(a.value) : null,
        value: a.value ?? null,
        over_range: a.overRange === true,
        auto: a.auto === true,
        unit: a.step.kind === 'measure' ? CANONICAL_UNITS[a.step.quantity] : null,
        quantity: a.step.kind === 'measure' ? a.step.quantity : null,
        band_index: a.bandIndex ?? null,
        band_label: a.bandLabel ?? null,
        verdict: a.verdict ?? null,
        choice: a.choice ?? null,
        confirmed: a.confirmed ?? null,
        user_id: v.by,
        created_at: new Date(opened.getTime() + (12 + i * 2) * 60_000),
      })),
    );
  }

  // ── Kestrel Valley Heating Co. ────────────────────────────────────────────────
  const oduya = await site(kestrel.id, 'Oduya residence', '41 Larchmont Rise, Fenwick', 'h.oduya@example.test');
  const bakery = await site(kestrel.id, 'Copperfield Bakery', '7 Wharf Street, Fenwick', 'accounts@copperfield-bakery.example.test');
  const hall = await site(kestrel.id, 'St. Aldric Parish Hall', '2 Chapel Green, Ashby Marsh', 'warden@st-aldric.example.test');
  const duplex = await site(kestrel.id, 'Marrow Lane duplex', '18–20 Marrow Lane, Fenwick', 'lettings@marrow-lane.example.test');

  const basement = await unit(kestrel.id, oduya, {
    label: 'Basement furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    draft: 'induced',
    va: 40,
    year: 2011,
  });
  const backRoom = await unit(kestrel.id, bakery, {
    label: 'Back-room furnace',
    ignition: 'single-rod',
    fuel: 'natural-gas',
    controlSupply: 'line',
    draft: 'induced',
    va: 75,
    year: 2016,
  });
  const hallTwo = await unit(kestrel.id, hall, {
    label: 'Hall furnace 2',
    ignition: 'two-rod',
    fuel: 'lp',
    controlSupply: '24v',
    draft: 'natural',
    va: 40,
    year: 2009,
  });
  const unitB = await unit(kestrel.id, duplex, {
    label: 'Unit B furnace',
    ignition: 'single-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    draft: 'induced',
    va: 40,
    year: 2019,
  });
  await unit(kestrel.id, duplex, {
    label: 'Unit A furnace',
    ignition: 'single-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    draft: 'induced',
    va: 40,
    year: 2019,
  });

  // The basement furnace's history: its flame signal falls visit after visit as the rod fouls.
  await pastCall({
    unitId: basement,
    on: '2021-01-14T08:30:00Z',
    complaint: 'No heat overnight; thermostat display on.',
    by: tech,
    script: { 'trial-observe': 'no-spark', 'fuse-output': 0.2 },
    repair: 'Found a chafed thermostat cable shorting R to C at the cabinet entry. Re-routed and sleeved the cable, replaced the 3 A fuse.',
    flameAfter: 5.1,
  });
  await pastCall({
    unitId: basement,
    on: '2022-02-03T13:10:00Z',
    complaint: 'Furnace runs a few minutes then stops; house cold.',
    by: tech,
    script: { 'trial-observe': 'no-spark', 'control-th-input': 0.4, 'high-limit-across': 25.6 },
    repair:
      'High limit open from overheating: filter completely clogged. Replaced the filter, checked the temperature rise, limit reset itself.',
    flameAfter: 4.2,
  });
  await pastCall({
    unitId: basement,
    on: '2023-12-19T09:45:00Z',
    complaint: 'No heat; control locks out after three tries.',
    by: tech,
    script: { 'trial-observe': 'lights-drops', 'flame-signal': 1.7, 'rod-inspect': 'dirty' },
    repair: 'Flame rod coated with a white oxide layer. Cleaned with fine abrasive cloth, checked the ground lead.',
    flameAfter: 3.6,
  });
  await pastCall({
    unitId: basement,
    on: '2025-01-08T10:20:00Z',
    complaint: 'Intermittent no heat, worse on cold mornings.',
    by: appr,
    script: { 'trial-observe': 'lights-drops', 'flame-signal': 1.2, 'rod-inspect': 'dirty' },
    repair: 'Rod fouled again within a year; replaced the flame rod and asked the customer about the new humidifier nearby.',
    flameAfter: 4.9,
    signedOffBy: tech,
  });
  await pastCall({
    unitId: unitB,
    on: '2024-11-02T15:00:00Z',
    complaint: 'No heat in unit B.',
    by: appr,
    script: { 'trial-observe': 'no-spark', 'spark-lead-inspect': 'lead-broken' },
    repair: 'Spark lead broken inside its insulation near the control. Replaced the lead and routed it clear of the sheet-metal edge.',
    flameAfter: 4.4,
    signedOffBy: tech,
  });

  const openCalls = [
    { unit_id: basement, complaint: 'No heat since this morning; the control light blinks a code.', technician_id: tech, hoursAgo: 2 },
    { unit_id: backRoom, complaint: 'Furnace tries to light, then shuts off; the ovens are fine.', technician_id: tech, hoursAgo: 5 },
    { unit_id: hallTwo, complaint: 'Hall is cold; furnace 2 never starts.', technician_id: appr, hoursAgo: 3 },
    { unit_id: unitB, complaint: 'Tenant reports no heat after a power cut.', technician_id: null, hoursAgo: 1 },
  ];
  await knex('service_calls').insert(
    openCalls.map(({ hoursAgo, ...c }) => ({
      ...c,
      company_id: kestrel.id,
      status: 'open',
      created_by: lead,
      opened_at: new Date(Date.now() - hoursAgo * 3600_000),
    })),
  );

  // ── Ironbark Comfort Services (the second company, for isolation) ───────────────
  const halden = await site(ironbark.id, 'Halden Court flats', '3 Halden Court, Brightwater', 'manager@halden-court.example.test');
  const haldenUnit = await unit(ironbark.id, halden, {
    label: 'Boiler-room furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    draft: 'induced',
    va: 40,
    year: 2014,
  });
  await knex('service_calls').insert({
    company_id: ironbark.id,
    unit_id: haldenUnit,
    complaint: 'No heat on the second floor.',
    technician_id: otherTech,
    status: 'open',
    created_by: otherTech,
  });
}
