import { randomUUID } from 'node:crypto';
import { BASE_URL, unique, type ApiClient } from '@/tests/e2e/support/http';

// A whole visit through the API, for the report and e-mail tests: a site with a customer e-mail,
// a unit and a call, the default tree walked along the fouling-rod path (healthy readings up to a
// low flame signal, a dirty rod), then the repair, the reading after it and the checks.

interface ApiStep {
  id: string;
  kind: string;
  unit?: string;
  bands?: { from?: number; to?: number; label: string; verdict: string }[];
  choices?: { value: string }[];
}

function valueIn({ from, to }: { from?: number; to?: number }): number {
  if (from != null && to != null) return (from + to) / 2;
  if (from != null) return from + Math.max(1, Math.abs(from) * 0.5);
  if (to != null) return to > 0 ? to / 2 : to - 1;
  return 1;
}

const HEALTHY_CHOICES = ['lights-drops', 'calling', 'at-gap', 'good', 'carries', 'clean'];

function pick(step: ApiStep): number {
  if (step.kind === 'measure') {
    const bands = step.bands!;
    if (step.id === 'flame-signal') return bands.findIndex((b) => b.label === 'Low flame signal');
    return Math.max(
      0,
      bands.findIndex((b) => b.verdict === 'within'),
    );
  }
  if (step.kind === 'inspect') {
    if (step.id === 'rod-inspect') return step.choices!.findIndex((c) => c.value === 'dirty');
    return Math.max(
      0,
      step.choices!.findIndex((c) => HEALTHY_CHOICES.includes(c.value)),
    );
  }
  return 0;
}

async function answer(client: ApiClient, diagnosisId: string, step: ApiStep, k: number) {
  const body =
    step.kind === 'measure'
      ? { text: String(Number(valueIn(step.bands![k]).toFixed(4))), unit: step.unit }
      : step.kind === 'inspect'
        ? { choice: step.choices![k].value }
        : { confirmed: true };
  const res = await client.post(`/api/diagnoses/${diagnosisId}/answers`, { clientId: randomUUID(), stepId: step.id, ...body });
  if (res.status !== 200) throw new Error(`answer to ${step.id} answered ${res.status}: ${res.text}`);
  return res.json;
}

export interface Visit {
  callId: string;
  siteName: string;
  customerEmail: string;
  findingTitle: string;
  /** The readings as typed (text and unit), in order. */
  readings: { stepId: string; text: string; unit: string }[];
}

export async function verifiedVisit(client: ApiClient): Promise<Visit> {
  const siteName = unique('Larchmont house');
  const customerEmail = `${unique('owner')}@example.test`.toLowerCase();
  const site = await client.post('/api/sites', { name: siteName, address: '3 Weir Road', contactEmail: customerEmail });
  const unit = await client.post('/api/units', {
    siteId: site.json.id,
    label: 'Hall furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    transformerVa: 40,
  });
  const call = await client.post('/api/calls', { unitId: unit.json.id, complaint: 'Burners light, then go out.' });
  if (call.status !== 201) throw new Error(`call: ${call.status} ${call.text}`);
  const trees = await client.get('/api/trees');
  const tree = (trees.json as { slug: string; published: { id: string } | null }[]).find((t) => t.slug === 'no-heat-dsi' && t.published)!;
  const started = await client.post(`/api/calls/${call.json.id}/diagnoses`, { treeVersionId: tree.published!.id });
  const diagnosisId = started.json.id as string;
  const readings: Visit['readings'] = [];
  let step: ApiStep | null = started.json.step;
  let finding: { title: string } | null = null;
  for (let n = 0; step && n < 80 && !finding; n++) {
    const k = pick(step);
    const out = await answer(client, diagnosisId, step, k);
    if (step.kind === 'measure') readings.push({ stepId: step.id, text: out.answer.text, unit: out.answer.unit });
    finding = out.finding;
    step = out.next;
  }
  if (!finding) throw new Error('the walk did not reach a finding');
  for (let n = 0; step && n < 20; n++) {
    const k = step.kind === 'measure' ? step.bands!.findIndex((b) => b.verdict === 'within') : 0;
    const out = await answer(client, diagnosisId, step, k);
    if (step.kind === 'measure') readings.push({ stepId: step.id, text: out.answer.text, unit: out.answer.unit });
    if (out.diagnosis.phase === 'done') break;
    step = out.next;
  }
  return { callId: call.json.id, siteName, customerEmail, findingTitle: finding.title, readings };
}

/** Binary GET with the client's session (ApiClient reads bodies as text). */
export async function getBytes(client: ApiClient, urlPath: string): Promise<{ status: number; type: string | null; body: Buffer }> {
  const res = await fetch(BASE_URL + urlPath, { headers: { cookie: client.cookieHeader, 'x-forwarded-for': client.address } });
  return { status: res.status, type: res.headers.get('content-type'), body: Buffer.from(await res.arrayBuffer()) };
}
