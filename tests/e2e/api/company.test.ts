// The company's time zone over HTTP: the admin sets it, everyone reads it, a bad name is refused in
// words and changes nothing, and a client that does not know the setting leaves it as it is.
// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ApiClient, DEMO, signedIn } from '../support/http';

let admin: ApiClient;
let tech: ApiClient;
let before: { name: string; officeEmail: string; displayUnits: string; timeZone: string };

beforeAll(async () => {
  [admin, tech] = await Promise.all([signedIn(DEMO.admin), signedIn(DEMO.technician)]);
  before = (await admin.get('/api/company')).json;
});

afterAll(async () => {
  await admin.patch('/api/company', before);
});

describe('company time zone', () => {
  it('starts as the migration’s default for the demo company, and the other company has its own', async () => {
    expect(before.timeZone).toBe('America/Toronto');
    const other = await signedIn(DEMO.otherAdmin);
    expect((await other.get('/api/company')).json.timeZone).toBe('America/Vancouver');
  });

  it('is set by the admin and read by everyone; a patch without it keeps it', async () => {
    const set = await admin.patch('/api/company', { ...before, timeZone: 'America/Halifax' });
    expect(set.status, set.text).toBe(200);
    expect(set.json.timeZone).toBe('America/Halifax');
    expect((await tech.get('/api/company')).json.timeZone).toBe('America/Halifax');
    const { timeZone: _, ...old } = before;
    const kept = await admin.patch('/api/company', { ...old, name: before.name });
    expect(kept.status, kept.text).toBe(200);
    expect(kept.json.timeZone).toBe('America/Halifax');
  });

  it('refuses a zone that is not one, in words, and changes nothing', async () => {
    const current = (await admin.get('/api/company')).json;
    for (const timeZone of ['Atlantis/Capital', 'EST', '', 7]) {
      const res = await admin.patch('/api/company', { ...before, timeZone });
      expect(res.status, String(timeZone)).toBe(400);
      expect(res.json.error.fieldErrors.timeZone[0]).toMatch(/^Choose a time zone from the list/);
    }
    expect((await admin.get('/api/company')).json).toEqual(current);
    expect((await tech.patch('/api/company', { ...before, timeZone: 'UTC' })).status).toBe(403);
  });
});
