'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { useId, useMemo, useState } from 'react';
import { useForm, useWatch, type FieldValues, type Path, type UseFormSetError } from 'react-hook-form';
import type { z } from 'zod';
import { FUEL_LABELS, IGNITION_LABELS, SUPPLY_LABELS } from '@/components/calls/format';
import { SegmentOption, Segmented } from '@/components/calls/segmented';
import { Field, FormMessage, Select, TextInput } from '@/components/ui/field';
import type { FieldErrors } from '@/lib/errors';
import type { ActionResult, SiteOut as ApiSite, UnitOut as ApiUnit } from '@/lib/validations/api';
import { callSchema, siteSchema, unitSchema } from '@/lib/validations/field';

type Result<T> = ActionResult<T>;

/** A unit as the API sends it, without its site's name and address (the picker groups by site). */
export type PickerUnit = Omit<ApiUnit, 'siteName' | 'siteAddress'>;

export type PickerSite = ApiSite & { units: PickerUnit[] };

interface Props {
  sites: PickerSite[];
  /** Leads and admins assign anyone from this list; empty means the call is the user's own. */
  assignees: { id: string; name: string; role: string }[];
  me: { id: string; name: string };
  preselectUnitId?: string;
  createSite: (input: unknown) => Promise<Result<PickerSite | Omit<PickerSite, 'units'>>>;
  createUnit: (input: unknown) => Promise<Result<PickerUnit>>;
  createCall: (input: unknown) => Promise<Result<{ id: string }>>;
}

function applyServerErrors<T extends FieldValues>(setError: UseFormSetError<T>, fieldErrors: FieldErrors | undefined, fields: string[]) {
  for (const [field, messages] of Object.entries(fieldErrors ?? {})) {
    if (fields.includes(field)) setError(field as Path<T>, { message: messages[0] });
  }
}

type CallIn = z.input<typeof callSchema>;
type CallOut = z.output<typeof callSchema>;

export function NewCallForm({ sites: initialSites, assignees, me, preselectUnitId, createSite, createUnit, createCall }: Props) {
  const router = useRouter();
  const [sites, setSites] = useState(initialSites);
  const preselectedSite = preselectUnitId ? initialSites.find((s) => s.units.some((u) => u.id === preselectUnitId)) : undefined;
  const [siteId, setSiteId] = useState<string | null>(preselectedSite?.id ?? null);
  const [message, setMessage] = useState<string | null>(null);
  const site = sites.find((s) => s.id === siteId) ?? null;
  const dispatcher = assignees.length > 0;

  const { register, handleSubmit, formState, setError, setValue, control, clearErrors } = useForm<CallIn, unknown, CallOut>({
    resolver: zodResolver(callSchema),
    defaultValues: { unitId: preselectedSite ? preselectUnitId : '', complaint: '', technicianId: dispatcher ? '' : me.id },
  });
  const unitId = useWatch({ control, name: 'unitId' });

  async function onSubmit(values: CallOut) {
    setMessage(null);
    const result = await createCall({ ...values, technicianId: values.technicianId || null });
    if (!result.ok) {
      setMessage(result.message);
      applyServerErrors(setError, result.fieldErrors, ['unitId', 'complaint', 'technicianId']);
      return;
    }
    router.push(`/calls/${result.data.id}`);
  }

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-6" aria-labelledby="new-call-title">
      <FormMessage message={message} />
      <SitePicker
        sites={sites}
        selected={siteId}
        onSelect={(id) => {
          setSiteId(id);
          setValue('unitId', '');
        }}
        onCreated={(created) => {
          setSites((list) => [...list, { ...created, units: [] }].sort((a, b) => a.name.localeCompare(b.name)));
          setSiteId(created.id);
          setValue('unitId', '');
        }}
        createSite={createSite}
      />

      <section aria-labelledby="unit-heading" className={clsx('card space-y-4', !site && 'opacity-60')}>
        <h2 id="unit-heading" className="text-xl font-bold">
          2. Unit
        </h2>
        {!site ? (
          <p className="text-muted">Pick or add the site first.</p>
        ) : (
          <>
            <fieldset aria-describedby="unit-error">
              <legend className="label">Units at {site.name}</legend>
              {site.units.length === 0 && <p className="text-muted">No units at this site yet: add one below.</p>}
              <div className="grid gap-2 sm:grid-cols-2">
                {site.units.map((u) => (
                  <label key={u.id} className="relative block cursor-pointer">
                    <input type="radio" value={u.id} className="peer sr-only" {...register('unitId')} />
                    <Tick />
                    <span className="flex min-h-touch flex-col rounded-lg border-2 border-line bg-raised px-4 py-2 peer-checked:border-copper peer-checked:bg-copper-soft peer-focus-visible:outline peer-focus-visible:outline-[3px] peer-focus-visible:outline-copper">
                      <span className="font-semibold">{u.label}</span>
                      <span className="text-sm text-muted">
                        {IGNITION_LABELS[u.ignition]} · {FUEL_LABELS[u.fuel]} · {u.transformerVa} VA
                        {u.installYear ? ` · ${u.installYear}` : ''}
                      </span>
                    </span>
                  </label>
                ))}
              </div>
              <p id="unit-error" className={clsx('field-error', !formState.errors.unitId && 'sr-only')} aria-live="polite">
                {formState.errors.unitId && (
                  <>
                    <span aria-hidden>⚠</span> {formState.errors.unitId.message}
                  </>
                )}
              </p>
            </fieldset>
            <NewUnit
              key={site.id}
              siteId={site.id}
              createUnit={createUnit}
              onCreated={(unit) => {
                setSites((list) => list.map((s) => (s.id === unit.siteId ? { ...s, units: [...s.units, unit] } : s)));
                setValue('unitId', unit.id);
                clearErrors('unitId');
              }}
            />
          </>
        )}
      </section>

      <section aria-labelledby="complaint-heading" className="card space-y-4">
        <h2 id="complaint-heading" className="text-xl font-bold">
          3. Complaint and technician
        </h2>
        <Field label="Complaint" error={formState.errors.complaint?.message} hint="What the customer reports, in their words.">
          {(a11y) => <textarea {...a11y} rows={3} className="input py-2" {...register('complaint')} />}
        </Field>
        {dispatcher ? (
          <Field label="Technician" error={formState.errors.technicianId?.message}>
            {(a11y) => (
              <Select {...a11y} {...register('technicianId')}>
                <option value="">Not assigned yet</option>
                {assignees.map((a) => (
                  <option key={a.id} value={a.id}>
                    {a.name} ({a.role})
                  </option>
                ))}
              </Select>
            )}
          </Field>
        ) : (
          <p>
            <span className="label">Technician</span>
            {me.name} (you)
          </p>
        )}
      </section>

      <div className="sticky bottom-0 -mx-4 border-t border-line bg-surface/95 px-4 py-3 backdrop-blur sm:static sm:mx-0 sm:border-0 sm:bg-transparent sm:p-0">
        <button type="submit" className="btn-primary w-full sm:w-auto" disabled={formState.isSubmitting || !unitId}>
          {formState.isSubmitting ? 'Opening…' : 'Open the call'}
        </button>
        {!unitId && <p className="mt-1 text-sm text-muted">Pick or add a unit to open the call.</p>}
      </div>
    </form>
  );
}

function SitePicker({
  sites,
  selected,
  onSelect,
  onCreated,
  createSite,
}: {
  sites: PickerSite[];
  selected: string | null;
  onSelect: (id: string) => void;
  onCreated: (site: Omit<PickerSite, 'units'>) => void;
  createSite: Props['createSite'];
}) {
  const [query, setQuery] = useState('');
  const [adding, setAdding] = useState(false);
  const searchId = useId();
  const shown = useMemo(() => {
    const q = query.trim().toLowerCase();
    const list = q ? sites.filter((s) => `${s.name} ${s.address}`.toLowerCase().includes(q)) : sites;
    // The chosen site stays visible whatever the search says.
    return selected && !list.some((s) => s.id === selected) ? [...sites.filter((s) => s.id === selected), ...list] : list;
  }, [sites, query, selected]);

  return (
    <section aria-labelledby="site-heading" className="card space-y-4">
      <h2 id="site-heading" className="text-xl font-bold">
        1. Site
      </h2>
      <div>
        <label htmlFor={searchId} className="label">
          Find a site
        </label>
        <TextInput id={searchId} type="search" placeholder="Name or address" value={query} onChange={(e) => setQuery(e.target.value)} />
      </div>
      <fieldset>
        <legend className="sr-only">Sites</legend>
        {shown.length === 0 && <p className="text-muted">No site matches “{query}”. Add it below.</p>}
        <div className="grid max-h-80 gap-2 overflow-y-auto sm:grid-cols-2">
          {shown.map((s) => (
            <label key={s.id} className="relative block cursor-pointer">
              <input
                type="radio"
                name="site"
                value={s.id}
                checked={selected === s.id}
                onChange={() => onSelect(s.id)}
                className="peer sr-only"
              />
              <Tick />
              <span className="flex min-h-touch flex-col rounded-lg border-2 border-line bg-raised px-4 py-2 peer-checked:border-copper peer-checked:bg-copper-soft peer-focus-visible:outline peer-focus-visible:outline-[3px] peer-focus-visible:outline-copper">
                <span className="font-semibold">{s.name}</span>
                <span className="text-sm text-muted">{s.address}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {adding ? (
        <NewSite
          onCancel={() => setAdding(false)}
          createSite={createSite}
          onCreated={(site) => {
            setAdding(false);
            setQuery('');
            onCreated(site);
          }}
        />
      ) : (
        <button type="button" className="btn-secondary" onClick={() => setAdding(true)}>
          Add a new site
        </button>
      )}
    </section>
  );
}

type SiteIn = z.input<typeof siteSchema>;
type SiteOut = z.output<typeof siteSchema>;

function NewSite({
  onCancel,
  onCreated,
  createSite,
}: {
  onCancel: () => void;
  onCreated: (site: Omit<PickerSite, 'units'>) => void;
  createSite: Props['createSite'];
}) {
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError } = useForm<SiteIn, unknown, SiteOut>({
    resolver: zodResolver(siteSchema),
    defaultValues: { name: '', address: '', contactEmail: '' },
  });
  const save = handleSubmit(async (values) => {
    setMessage(null);
    const result = await createSite(values);
    if (!result.ok) {
      setMessage(result.message);
      applyServerErrors(setError, result.fieldErrors, ['name', 'address', 'contactEmail']);
      return;
    }
    onCreated(result.data);
  });
  return (
    <div role="group" aria-labelledby="new-site-heading" className="space-y-3 rounded-lg border border-dashed border-line p-4">
      <h3 id="new-site-heading" className="font-bold">
        New site
      </h3>
      <FormMessage message={message} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Site name" error={formState.errors.name?.message}>
          {(a11y) => <TextInput {...a11y} autoFocus {...register('name')} />}
        </Field>
        <Field label="Address" error={formState.errors.address?.message}>
          {(a11y) => <TextInput {...a11y} {...register('address')} />}
        </Field>
        <Field label="Customer e-mail" error={formState.errors.contactEmail?.message} hint="Optional; the report goes here.">
          {(a11y) => <TextInput {...a11y} type="email" {...register('contactEmail')} />}
        </Field>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-secondary" onClick={save} disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Adding…' : 'Add site'}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </div>
  );
}

type UnitIn = z.input<typeof unitSchema>;
type UnitOut = z.output<typeof unitSchema>;

function NewUnit({
  siteId,
  onCreated,
  createUnit,
}: {
  siteId: string;
  onCreated: (unit: PickerUnit) => void;
  createUnit: Props['createUnit'];
}) {
  const [open, setOpen] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<UnitIn, unknown, UnitOut>({
    resolver: zodResolver(unitSchema),
    defaultValues: {
      siteId,
      label: '',
      ignition: 'two-rod',
      fuel: 'natural-gas',
      controlSupply: '24v',
      draft: 'induced',
      transformerVa: 40,
      installYear: '',
    },
  });
  const save = handleSubmit(async (values) => {
    setMessage(null);
    const result = await createUnit(values);
    if (!result.ok) {
      setMessage(result.message);
      applyServerErrors(setError, result.fieldErrors, [
        'label',
        'ignition',
        'fuel',
        'controlSupply',
        'draft',
        'transformerVa',
        'installYear',
      ]);
      return;
    }
    reset();
    setOpen(false);
    onCreated(result.data);
  });
  if (!open) {
    return (
      <button type="button" className="btn-secondary" onClick={() => setOpen(true)}>
        Add a unit at this site
      </button>
    );
  }
  const e = formState.errors;
  return (
    <div role="group" aria-labelledby="new-unit-heading" className="space-y-4 rounded-lg border border-dashed border-line p-4">
      <h3 id="new-unit-heading" className="font-bold">
        New unit
      </h3>
      <FormMessage message={message} />
      <Field label="Unit label" error={e.label?.message} hint='Where it is, e.g. "Basement furnace".'>
        {(a11y) => <TextInput {...a11y} autoFocus {...register('label')} />}
      </Field>
      <Segmented legend="Ignition" error={e.ignition?.message}>
        {(['two-rod', 'single-rod'] as const).map((v) => (
          <SegmentOption
            key={v}
            value={v}
            label={IGNITION_LABELS[v]}
            detail={v === 'two-rod' ? 'igniter + flame rod' : 'one rod sparks and senses'}
            {...register('ignition')}
          />
        ))}
      </Segmented>
      <Segmented legend="Fuel" error={e.fuel?.message}>
        {(['natural-gas', 'lp'] as const).map((v) => (
          <SegmentOption key={v} value={v} label={FUEL_LABELS[v]} {...register('fuel')} />
        ))}
      </Segmented>
      <Segmented legend="Control supply" error={e.controlSupply?.message}>
        {(['24v', 'line'] as const).map((v) => (
          <SegmentOption
            key={v}
            value={v}
            label={SUPPLY_LABELS[v]}
            detail={v === '24v' ? 'transformer feeds the control' : '120 VAC to the control'}
            {...register('controlSupply')}
          />
        ))}
      </Segmented>
      <Segmented legend="Draft" error={e.draft?.message}>
        {(['induced', 'natural'] as const).map((v) => (
          <SegmentOption
            key={v}
            value={v}
            label={v === 'induced' ? 'Induced draft' : 'Natural draft'}
            detail={v === 'induced' ? 'inducer and pressure switch' : 'no inducer'}
            {...register('draft')}
          />
        ))}
      </Segmented>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Transformer rating (VA)" error={e.transformerVa?.message}>
          {(a11y) => <TextInput {...a11y} inputMode="numeric" className="font-mono" {...register('transformerVa')} />}
        </Field>
        <Field label="Install year" error={e.installYear?.message} hint="Optional.">
          {(a11y) => <TextInput {...a11y} inputMode="numeric" className="font-mono" {...register('installYear')} />}
        </Field>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-secondary" onClick={save} disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Adding…' : 'Add unit'}
        </button>
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </div>
  );
}

/** The chosen card's mark, so the choice does not rest on its colour alone. */
function Tick() {
  return (
    <span aria-hidden className="absolute right-3 top-2 hidden font-mono font-bold peer-checked:inline">
      ✓
    </span>
  );
}
