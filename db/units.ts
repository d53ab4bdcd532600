import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/knex';
import { getSite } from '@/db/sites';
import { isUuid } from '@/db/users';
import { notFound } from '@/lib/errors';
import type { UnitInput } from '@/lib/validations/field';

export interface Unit {
  id: string;
  siteId: string;
  siteName: string;
  siteAddress: string;
  label: string;
  ignition: 'two-rod' | 'single-rod';
  fuel: 'natural-gas' | 'lp';
  controlSupply: '24v' | 'line';
  draft: 'induced' | 'natural';
  transformerVa: number;
  installYear: number | null;
}

export interface UnitReading {
  answerId: string;
  callId: string;
  diagnosisId: string;
  stepId: string;
  stepTitle: string | null;
  quantity: string;
  value: number;
  text: string | null;
  unit: string | null;
  bandLabel: string | null;
  verdict: string | null;
  takenAt: Date;
}

const toUnit = (r: Record<string, unknown>): Unit => ({
  id: r.id as string,
  siteId: r.site_id as string,
  siteName: r.site_name as string,
  siteAddress: r.site_address as string,
  label: r.label as string,
  ignition: r.ignition as Unit['ignition'],
  fuel: r.fuel as Unit['fuel'],
  controlSupply: r.control_supply as Unit['controlSupply'],
  draft: (r.draft as Unit['draft']) ?? 'induced',
  transformerVa: r.transformer_va as number,
  installYear: (r.install_year as number | null) ?? null,
});

const unitQuery = (companyId: string, trx: Knex) =>
  trx('units as u')
    .join('sites as s', 's.id', 'u.site_id')
    .where('u.company_id', companyId)
    .select('u.*', 's.name as site_name', 's.address as site_address');

export async function listUnits({ companyId, siteId }: { companyId: string; siteId?: string }, trx: Knex = db): Promise<Unit[]> {
  const q = unitQuery(companyId, trx).orderBy(['s.name', 'u.label']);
  if (siteId) q.where('u.site_id', siteId);
  return (await q).map(toUnit);
}

export async function getUnit({ companyId, id }: { companyId: string; id: string }, trx: Knex = db): Promise<Unit> {
  if (!isUuid(id)) throw notFound('That unit');
  const row = await unitQuery(companyId, trx).where('u.id', id).first();
  if (!row) throw notFound('That unit');
  return toUnit(row);
}

export async function createUnit({ companyId, input }: { companyId: string; input: UnitInput }, trx: Knex = db): Promise<Unit> {
  await getSite({ companyId, id: input.siteId }, trx);
  const [row] = await trx('units')
    .insert({
      company_id: companyId,
      site_id: input.siteId,
      label: input.label,
      ignition: input.ignition,
      fuel: input.fuel,
      control_supply: input.controlSupply,
      draft: input.draft,
      transformer_va: input.transformerVa,
      install_year: input.installYear ?? null,
    })
    .returning('id');
  return getUnit({ companyId, id: row.id }, trx);
}

/** Corrects the facts of the unit record a tree branches on; the caller has checked the scope. */
export async function updateUnitFacts(
  { companyId, id, facts }: { companyId: string; id: string; facts: Partial<Pick<Unit, 'ignition' | 'fuel' | 'controlSupply' | 'draft'>> },
  trx: Knex = db,
): Promise<Unit> {
  await getUnit({ companyId, id }, trx);
  await trx('units')
    .where({ id, company_id: companyId })
    .update({
      ...(facts.ignition ? { ignition: facts.ignition } : {}),
      ...(facts.fuel ? { fuel: facts.fuel } : {}),
      ...(facts.controlSupply ? { control_supply: facts.controlSupply } : {}),
      ...(facts.draft ? { draft: facts.draft } : {}),
    });
  return getUnit({ companyId, id }, trx);
}

/** Every reading taken on the unit (answers with a value, not undone), oldest first. */
export async function listUnitReadings(
  { companyId, unitId }: { companyId: string; unitId: string },
  trx: Knex = db,
): Promise<UnitReading[]> {
  const rows = await trx('answers as a')
    .join('diagnoses as d', 'd.id', 'a.diagnosis_id')
    .join('service_calls as c', 'c.id', 'd.call_id')
    .join('tree_versions as v', 'v.id', 'd.tree_version_id')
    .where({ 'c.unit_id': unitId, 'a.company_id': companyId })
    .whereNull('a.undone_at')
    .whereNotNull('a.value')
    .orderBy('a.created_at')
    .select(
      'a.*',
      'd.call_id',
      trx.raw(`(SELECT s->>'title' FROM jsonb_array_elements(v.graph->'steps') s WHERE s->>'id' = a.step_id LIMIT 1) as step_title`),
    );
  return rows.map((r: Record<string, unknown>) => ({
    answerId: r.id as string,
    callId: r.call_id as string,
    diagnosisId: r.diagnosis_id as string,
    stepId: r.step_id as string,
    stepTitle: (r.step_title as string | null) ?? null,
    quantity: r.quantity as string,
    value: r.value as number,
    text: (r.text as string | null) ?? null,
    unit: (r.unit as string | null) ?? null,
    bandLabel: (r.band_label as string | null) ?? null,
    verdict: (r.verdict as string | null) ?? null,
    takenAt: r.created_at as Date,
  }));
}
