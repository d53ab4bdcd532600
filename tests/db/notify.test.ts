// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { db } from '@/db/knex';
import { saveNotificationSettings } from '@/db/outbox';
import { notify } from '@/lib/server/notify';

// Notifications through the outbox, against PostgreSQL: who gets one, who does not (the actor,
// whoever turned the kind off, other roles), and once per event and person.

const tag = randomUUID().slice(0, 8);
let companyId: string;
const ids: Record<string, string> = {};

beforeAll(async () => {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set; run through scripts/test.mjs.');
  const [company] = await db('companies')
    .insert({ name: `Notify Co ${tag}`, office_email: `office-${tag}@notify.test` })
    .returning('id');
  companyId = company.id;
  for (const [key, role] of [
    ['appr', 'apprentice'],
    ['tech', 'technician'],
    ['tech2', 'technician'],
    ['lead', 'lead'],
    ['lead2', 'lead'],
  ] as const) {
    const [u] = await db('users')
      .insert({ company_id: companyId, email: `${key}-${tag}@notify.test`, name: `${key} ${tag}`, role, password_hash: 'x' })
      .returning('id');
    ids[key] = u.id;
  }
  await saveNotificationSettings({ companyId, userId: ids.tech2, settings: { 'sign-off': false } });
});

afterAll(async () => {
  await db('companies').where({ id: companyId }).delete();
  await db.destroy();
});

const recipients = async (kind: string) =>
  (await db('outbox').where({ company_id: companyId, kind }).select('recipients'))
    .map((r: { recipients: string[] }) => r.recipients[0])
    .sort();

describe('notify', () => {
  it('an apprentice’s finding goes to the technicians who kept the kind on, once', async () => {
    const event = {
      kind: 'sign-off',
      companyId,
      actorId: ids.appr,
      callId: null as unknown as string,
      diagnosisId: randomUUID(),
      findingTitle: 'Dirty flame rod',
    } as const;
    expect(await notify(event)).toBe(1);
    expect(await notify(event)).toBe(0);
    expect(await recipients('sign-off')).toEqual([`tech-${tag}@notify.test`]);
    const [row] = await db('outbox').where({ company_id: companyId, kind: 'sign-off' }).select('subject', 'body');
    expect(row.subject).toBe('Sign-off needed: Dirty flame rod');
    expect(row.body).toContain(`appr ${tag} reached a finding`);
  });

  it('a technician’s own finding needs no sign-off: nobody is told', async () => {
    expect(
      await notify({
        kind: 'sign-off',
        companyId,
        actorId: ids.tech,
        callId: null as unknown as string,
        diagnosisId: randomUUID(),
        findingTitle: 'x',
      }),
    ).toBe(0);
  });

  it('an escalation goes to every lead; a review request to the other leads only', async () => {
    expect(
      await notify({
        kind: 'escalation',
        companyId,
        actorId: ids.tech,
        callId: null as unknown as string,
        diagnosisId: randomUUID(),
        note: 'No step fits',
      }),
    ).toBe(2);
    expect(await recipients('escalation')).toEqual([`lead-${tag}@notify.test`, `lead2-${tag}@notify.test`]);
    expect(
      await notify({ kind: 'tree-review', companyId, actorId: ids.lead, versionId: randomUUID(), treeTitle: 'No heat', version: 3 }),
    ).toBe(1);
    expect(await recipients('tree-review')).toEqual([`lead2-${tag}@notify.test`]);
  });

  it('a practice scenario goes to the apprentice it is assigned to', async () => {
    expect(
      await notify({
        kind: 'scenario',
        companyId,
        actorId: ids.lead,
        assignmentId: randomUUID(),
        apprenticeId: ids.appr,
        scenarioTitle: 'Cracked lead',
      }),
    ).toBe(1);
    expect(await recipients('scenario')).toEqual([`appr-${tag}@notify.test`]);
  });

  it('never throws: an unknown actor queues nothing', async () => {
    expect(
      await notify({ kind: 'escalation', companyId, actorId: randomUUID(), callId: randomUUID(), diagnosisId: randomUUID(), note: 'x' }),
    ).toBe(0);
  });
});
