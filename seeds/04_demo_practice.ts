import type { Knex } from 'knex';
import { FAULT_IDS } from '@/lib/bench/faults';

// Demo only (SEED_DEMO=true): the demo trainer's practice scenarios at Kestrel Valley, two of them
// assigned to the demo apprentice, so the trainer's and the apprentice's homes have work on them.
// Invented titles and notes; the faults are the bench's own library. Runs once: skipped when the
// company already has a scenario.

type Id = { id: string };

const day = (fromToday: number) => new Date(Date.now() + fromToday * 86_400_000).toISOString().slice(0, 10);

export async function seed(knex: Knex): Promise<void> {
  if (process.env.SEED_DEMO !== 'true') return;
  const kestrel = (await knex('companies').where({ name: 'Kestrel Valley Heating Co.' }).first('id')) as Id | undefined;
  if (!kestrel) return;
  if (await knex('practice_scenarios').where({ company_id: kestrel.id }).first('id')) return;
  const trainer = (await knex('users').where({ email: 'trainer@demo.test' }).first('id')) as Id;
  const apprentice = (await knex('users').where({ email: 'apprentice@demo.test' }).first('id')) as Id;

  const scenarios = [
    {
      title: 'Lights, then drops out',
      faultIds: ['dirty-flame-rod'],
      unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' },
      notes: 'The classic one. Watch one trial before you touch the meter, and lock out before the rod comes out.',
      dueOn: day(6),
      assign: true,
    },
    {
      title: 'No spark: one of three',
      faultIds: ['blown-fuse', 'pressure-hose-blocked', 'broken-spark-lead'],
      unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' },
      notes: 'The bench picks one of three faults. Work down from the 24 V supply; do not skip the pressure switch.',
      dueOn: day(13),
      assign: true,
    },
    {
      title: 'Spark, no flame (LP)',
      faultIds: ['no-gas', 'gas-valve-not-opening', 'valve-wiring-resistance'],
      unit: { controlSupply: '24v', ignition: 'two-rod', fuel: 'lp', draft: 'induced' },
      notes: 'For after the first two: judge the valve voltage against the transformer reading you took on the same walk.',
      dueOn: null,
      assign: false,
    },
  ];

  for (const s of scenarios) {
    for (const id of s.faultIds)
      if (!FAULT_IDS.includes(id)) throw new Error(`Demo scenario "${s.title}": no fault "${id}" in the bench's library`);
    const [row] = await knex('practice_scenarios')
      .insert({
        company_id: kestrel.id,
        trainer_id: trainer.id,
        title: s.title,
        fault_ids: s.faultIds,
        unit: JSON.stringify(s.unit),
        notes: s.notes,
        due_on: s.dueOn,
      })
      .returning('id');
    if (s.assign) {
      await knex('practice_assignments').insert({
        company_id: kestrel.id,
        scenario_id: row.id,
        apprentice_id: apprentice.id,
        assigned_by: trainer.id,
      });
    }
  }
}
