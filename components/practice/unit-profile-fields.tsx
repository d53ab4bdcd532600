'use client';

import type { UseFormRegisterReturn } from 'react-hook-form';
import { FUEL_LABELS, IGNITION_LABELS, SUPPLY_LABELS } from '@/components/calls/format';
import { Field, Select } from '@/components/ui/field';

type UnitField = 'unit.ignition' | 'unit.fuel' | 'unit.controlSupply' | 'unit.draft';

/** The unit a bench simulates (a scenario's, a lead's own bench): the form's `unit` object. */
export function UnitProfileFields({ register }: { register: (name: UnitField) => UseFormRegisterReturn }) {
  const choices = (labels: Record<string, string>) =>
    Object.entries(labels).map(([v, l]) => (
      <option key={v} value={v}>
        {l}
      </option>
    ));
  return (
    <fieldset className="grid gap-4 sm:grid-cols-2">
      <legend className="label">The unit on the bench</legend>
      <Field label="Ignition">
        {(p) => (
          <Select {...p} {...register('unit.ignition')}>
            {choices(IGNITION_LABELS)}
          </Select>
        )}
      </Field>
      <Field label="Fuel">
        {(p) => (
          <Select {...p} {...register('unit.fuel')}>
            {choices(FUEL_LABELS)}
          </Select>
        )}
      </Field>
      <Field label="Control supply">
        {(p) => (
          <Select {...p} {...register('unit.controlSupply')}>
            {choices(SUPPLY_LABELS)}
          </Select>
        )}
      </Field>
      <Field label="Draft">
        {(p) => (
          <Select {...p} {...register('unit.draft')}>
            <option value="induced">Induced draft (inducer and pressure switch)</option>
            <option value="natural">Natural draft</option>
          </Select>
        )}
      </Field>
    </fieldset>
  );
}
