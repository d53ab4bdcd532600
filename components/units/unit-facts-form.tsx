'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { FUEL_LABELS, IGNITION_LABELS, SUPPLY_LABELS } from '@/components/calls/format';
import { SegmentOption, Segmented } from '@/components/calls/segmented';
import { FormMessage } from '@/components/ui/field';
import type { ActionResult, UnitOut } from '@/lib/validations/api';

type Facts = Pick<UnitOut, 'ignition' | 'fuel' | 'controlSupply' | 'draft'>;

const OPTIONS: { [K in keyof Facts]: { legend: string; values: Record<Facts[K], string> } } = {
  ignition: { legend: 'Ignition', values: IGNITION_LABELS },
  fuel: { legend: 'Fuel', values: FUEL_LABELS },
  controlSupply: { legend: 'Control supply', values: SUPPLY_LABELS },
  draft: { legend: 'Draft', values: { induced: 'Induced draft', natural: 'Natural draft' } },
};

/**
 * The facts of the unit record the diagnosis branches on, corrected when the technician finds them
 * wrong at the unit. A diagnosis keeps the branches it has already taken; those still ahead follow
 * the corrected record.
 */
export function UnitFactsForm({
  unitId,
  facts,
  correct,
}: {
  unitId: string;
  facts: Facts;
  correct: (input: unknown) => Promise<ActionResult<UnitOut>>;
}) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [values, setValues] = useState<Facts>(facts);
  const [message, setMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const changed = (Object.keys(values) as (keyof Facts)[]).filter((k) => values[k] !== facts[k]);

  if (!open) {
    return (
      <div className="space-y-2">
        {saved && (
          <p role="status" className="font-semibold">
            <span aria-hidden>✓ </span>
            {saved}
          </p>
        )}
        <button type="button" className="btn-secondary" onClick={() => setOpen(true)}>
          Correct the unit record
        </button>
      </div>
    );
  }
  const save = () =>
    startTransition(async () => {
      setMessage(null);
      const patch = Object.fromEntries(changed.map((k) => [k, values[k]]));
      const result = await correct({ id: unitId, ...patch });
      if (!result.ok) {
        setMessage(result.message);
        return;
      }
      setSaved(`Unit record corrected: ${changed.map((k) => OPTIONS[k].legend.toLowerCase()).join(', ')}.`);
      setOpen(false);
      router.refresh();
    });
  return (
    <div
      role="group"
      aria-labelledby="unit-facts-heading"
      className="space-y-4 rounded-lg border border-dashed border-line p-4"
      id="record"
    >
      <h3 id="unit-facts-heading" className="font-bold">
        Correct the unit record
      </h3>
      <p className="text-base text-muted">
        The diagnosis takes these from the record instead of asking them. A diagnosis keeps the branches it has already taken; the branches
        still ahead follow the corrected record.
      </p>
      <FormMessage message={message} />
      {(Object.keys(OPTIONS) as (keyof Facts)[]).map((key) => (
        <Segmented key={key} legend={OPTIONS[key].legend}>
          {Object.entries(OPTIONS[key].values).map(([value, label]) => (
            <SegmentOption
              key={value}
              name={`unit-${key}`}
              value={value}
              label={label as string}
              checked={values[key] === value}
              onChange={() => setValues((v) => ({ ...v, [key]: value }))}
            />
          ))}
        </Segmented>
      ))}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" disabled={pending || changed.length === 0} onClick={save}>
          {pending ? 'Saving…' : 'Save the correction'}
        </button>
        <button type="button" className="btn-quiet" disabled={pending} onClick={() => (setValues(facts), setOpen(false))}>
          Cancel
        </button>
      </div>
    </div>
  );
}
