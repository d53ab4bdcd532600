// The isolation check over HTTP (GET /api/tree-versions/{id}/isolation-check): the demo company's
// published tree isolates every fault of the bench's library; leads and admins only; another
// company's version is not found; a bad unit profile is a 400 in words; a draft with a mis-wired band
// shows its miss. Works on a tree made here, so the demo's built-in tree stays as other tests expect it.
// @vitest-environment node
import { beforeAll, describe, expect, it } from 'vitest';
import { FAULTS, faultFits } from '@/lib/bench';
import { type ApiClient, DEMO, signedIn, unique } from '../support/http';

let lead: ApiClient;
let admin: ApiClient;
let technician: ApiClient;
let apprentice: ApiClient;
let trainer: ApiClient;
let otherAdmin: ApiClient;
let publishedId: string;
let otherPublishedId: string;

const publishedOf = async (client: ApiClient) =>
  (await client.get('/api/trees')).json.find((t: { slug: string }) => t.slug === 'no-heat-dsi').published.id as string;

beforeAll(async () => {
  [lead, admin, technician, apprentice, trainer, otherAdmin] = await Promise.all([
    signedIn(DEMO.lead),
    signedIn(DEMO.admin),
    signedIn(DEMO.technician),
    signedIn(DEMO.apprentice),
    signedIn(DEMO.trainer),
    signedIn(DEMO.otherAdmin),
  ]);
  publishedId = await publishedOf(lead);
  otherPublishedId = await publishedOf(otherAdmin);
});

describe('GET /api/tree-versions/{id}/isolation-check', () => {
  it("answers a lead with every fault of the library isolated by the demo company's published tree", async () => {
    const res = await lead.get(`/api/tree-versions/${publishedId}/isolation-check`);
    expect(res.status, res.text).toBe(200);
    expect(res.json.map((r: { faultId: string }) => r.faultId)).toEqual(FAULTS.map((f) => f.id));
    expect(res.json.filter((r: { ok: boolean }) => !r.ok)).toEqual([]);
    for (const row of res.json) {
      expect(row).toMatchObject({
        faultId: expect.any(String),
        expectedFindingTags: expect.any(Array),
        reachedStepId: expect.stringMatching(/^f-/),
      });
    }
    expect((await admin.get(`/api/tree-versions/${publishedId}/isolation-check`)).status).toBe(200);
  });

  it('runs on the unit profile asked for (a single-rod, natural-draft unit)', async () => {
    const res = await lead.get(`/api/tree-versions/${publishedId}/isolation-check?ignition=single-rod&draft=natural`);
    expect(res.status, res.text).toBe(200);
    const unit = { controlSupply: '24v', ignition: 'single-rod', fuel: 'natural-gas', draft: 'natural' } as const;
    expect(res.json.length).toBe(FAULTS.filter((f) => faultFits(f, unit)).length);
    expect(res.json.every((r: { ok: boolean; unit: unknown }) => r.ok && JSON.stringify(r.unit) === JSON.stringify(unit))).toBe(true);
    expect(
      res.json.find((r: { faultId: string }) => r.faultId === 'dirty-flame-rod').path.map((p: { stepId: string }) => p.stepId),
    ).toContain('control-flame-voltage');
  });

  it('refuses a technician, an apprentice and a trainer (403)', async () => {
    for (const client of [technician, apprentice, trainer]) {
      expect((await client.get(`/api/tree-versions/${publishedId}/isolation-check`)).status).toBe(403);
    }
  });

  it("answers 404 for another company's version, and for an id that is not one", async () => {
    expect((await lead.get(`/api/tree-versions/${otherPublishedId}/isolation-check`)).status).toBe(404);
    expect((await otherAdmin.get(`/api/tree-versions/${publishedId}/isolation-check`)).status).toBe(404);
    expect((await lead.get('/api/tree-versions/not-a-version/isolation-check')).status).toBe(404);
  });

  it('answers 400 in words for a unit profile it does not know', async () => {
    const res = await lead.get(`/api/tree-versions/${publishedId}/isolation-check?ignition=hot-surface`);
    expect(res.status).toBe(400);
    expect(res.json.error.fieldErrors.ignition.join(' ')).toMatch(/two-rod, single-rod/);
  });

  it('shows the miss of a draft with a mis-wired band, and refuses a draft with problems (422)', async () => {
    const graph = (await lead.get(`/api/tree-versions/${publishedId}/authoring`)).json.graph;
    const made = await lead.post('/api/trees', { title: unique('Isolation check tree'), symptom: 'No heat', equipmentKind: 'dsi-furnace' });
    expect(made.status, made.text).toBe(201);
    const fuse = graph.steps.find((s: { id: string }) => s.id === 'fuse-output');
    // The two bands past the fuse swapped: no 24 V goes on to the thermostat, 24 V to the blown fuse.
    [fuse.bands[0].outcome, fuse.bands[1].outcome] = [fuse.bands[1].outcome, fuse.bands[0].outcome];
    const saved = await lead.call('PUT', `/api/tree-versions/${made.json.id}`, { baseRevision: 1, graph });
    expect(saved.status, saved.text).toBe(200);
    const res = await lead.get(`/api/tree-versions/${made.json.id}/isolation-check`);
    expect(res.status, res.text).toBe(200);
    const rows = new Map(res.json.map((r: { faultId: string }) => [r.faultId, r]));
    expect(rows.get('blown-fuse')).toMatchObject({
      ok: false,
      reachedStepId: 'f-no-call-for-heat',
      reason: expect.stringMatching(/lacks the tags/),
    });
    expect(rows.get('open-high-limit')).toMatchObject({ ok: false, reachedStepId: 'f-blown-fuse' });
    // Faults found before the fuse still isolate.
    for (const id of ['no-line-power', 'open-transformer']) expect(rows.get(id), id).toMatchObject({ ok: true });

    fuse.bands[0].outcome = 'no-such-step';
    const broken = await lead.call('PUT', `/api/tree-versions/${made.json.id}`, { baseRevision: saved.json.revision, graph });
    // Saved with its problems (422 says so).
    expect(broken.status, broken.text).toBe(422);
    const refused = await lead.get(`/api/tree-versions/${made.json.id}/isolation-check`);
    expect(refused.status).toBe(422);
    expect(refused.json.error.fieldErrors['fuse-output'].join(' ')).toMatch(/no-such-step/);
  });
});
