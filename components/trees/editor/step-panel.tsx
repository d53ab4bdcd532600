'use client';

// The side panel for one step: a react-hook-form form checked with the server's own step schema
// (lib/trees/schema.ts), every change handed to the editor at once so validation stays live.
// Bands are edited by their boundaries, so they stay contiguous: band i ends where band i+1 starts.
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import clsx from 'clsx';
import { useEffect } from 'react';
import { useForm, useWatch, type FieldValues, type Resolver } from 'react-hook-form';
import { ObserveFields, ProbeFields, TimelineField } from '@/components/trees/editor/bench-fields';
import { errorOf, Labeled, type Form } from '@/components/trees/editor/fields';
import { moveBoundary, removeBand, splitBand, splitPoint } from '@/components/trees/editor/graph-edit';
import {
  AIDS,
  CANONICAL_UNITS,
  QUANTITIES,
  SIGNAL_WORDS,
  stepIdSchema,
  choiceSchema,
  stepSchema,
  UNIT_FACTS,
  type Band,
  type Caution,
  type MeasureStep,
  type Step,
  type StepKind,
  type UnitFact,
} from '@/lib/trees/schema';

export interface StepPanelProps {
  step: Step;
  /** Every other step, for the outcome pickers. */
  others: { id: string; title: string }[];
  isStart: boolean;
  readOnly?: boolean;
  onChange: (step: Step) => void;
  onRename: (from: string, to: string) => string | null;
  onChangeKind: (kind: StepKind) => void;
  onDelete: () => void;
  onMakeStart: () => void;
  onClose: () => void;
}

type Choice = z.infer<typeof choiceSchema>;

const KINDS: { kind: StepKind; label: string }[] = [
  { kind: 'measure', label: 'Measure (a meter reading)' },
  { kind: 'inspect', label: 'Inspect (a choice)' },
  { kind: 'action', label: 'Action (do, then confirm)' },
  { kind: 'fact', label: 'Unit record (answered by the unit)' },
  { kind: 'finding', label: 'Finding (the cause and its repair)' },
];

const QUANTITY_LABEL: Record<(typeof QUANTITIES)[number], string> = {
  vac: 'AC volts',
  vdc: 'DC volts',
  udc: 'DC microamps (flame signal)',
  ohm: 'Resistance',
  length: 'Length',
  pressure: 'Gas pressure',
};

function TargetSelect({
  form,
  name,
  others,
  label,
  disabled,
}: {
  form: Form;
  name: string;
  others: StepPanelProps['others'];
  label: string;
  disabled?: boolean;
}) {
  return (
    <Labeled label={label} error={errorOf(form, name)}>
      {(id) => (
        <select id={id} className="input" disabled={disabled} {...form.register(name)}>
          <option value="">— not connected —</option>
          {others.map((o) => (
            <option key={o.id} value={o.id}>
              {o.id}
              {o.title ? ` · ${o.title}` : ''}
            </option>
          ))}
        </select>
      )}
    </Labeled>
  );
}

/** A list of one-line texts (parts, verification checks, checklist items). */
function TextList({
  form,
  name,
  label,
  addLabel,
  disabled,
}: {
  form: Form;
  name: string;
  label: string;
  addLabel: string;
  disabled?: boolean;
}) {
  const items = (useWatch({ control: form.control, name }) as string[] | undefined) ?? [];
  const set = (next: string[]) => form.setValue(name, next, { shouldDirty: true, shouldValidate: true });
  return (
    <fieldset className="space-y-2">
      <legend className="label">{label}</legend>
      {items.map((_, i) => (
        <div key={i} className="flex gap-2">
          <input aria-label={`${label} ${i + 1}`} className="input" disabled={disabled} {...form.register(`${name}.${i}`)} />
          <button
            type="button"
            className="btn-quiet px-3"
            disabled={disabled}
            aria-label={`Remove ${label.toLowerCase()} ${i + 1}`}
            onClick={() => set(items.filter((__, j) => j !== i))}
          >
            ✕
          </button>
        </div>
      ))}
      {errorOf(form, name) && (
        <p className="field-error" role="alert">
          <span aria-hidden>⚠</span> {errorOf(form, name)}
        </p>
      )}
      <button type="button" className="btn-secondary" disabled={disabled} onClick={() => set([...items, ''])}>
        {addLabel}
      </button>
    </fieldset>
  );
}

function Cautions({ form, disabled }: { form: Form; disabled?: boolean }) {
  const cautions = (useWatch({ control: form.control, name: 'cautions' }) as Caution[] | undefined) ?? [];
  const set = (next: typeof cautions) => form.setValue('cautions', next, { shouldDirty: true, shouldValidate: true });
  return (
    <fieldset className="space-y-3">
      <legend className="label">Cautions</legend>
      <p className="text-sm text-muted">
        The wizard adds the deference to local codes, the manufacturer&rsquo;s instructions and licensed practice to each.
      </p>
      {cautions.map((_, i) => (
        <div key={i} className="space-y-2 rounded-lg border border-line p-3">
          <div className="flex gap-2">
            <select
              aria-label={`Signal word of caution ${i + 1}`}
              className="input w-40"
              disabled={disabled}
              {...form.register(`cautions.${i}.signal`)}
            >
              {SIGNAL_WORDS.map((w) => (
                <option key={w}>{w}</option>
              ))}
            </select>
            <button
              type="button"
              className="btn-quiet ml-auto"
              disabled={disabled}
              onClick={() => set(cautions.filter((__, j) => j !== i))}
            >
              Remove
            </button>
          </div>
          <textarea
            aria-label={`Text of caution ${i + 1}`}
            rows={2}
            className="input py-2"
            disabled={disabled}
            {...form.register(`cautions.${i}.text`)}
          />
          {errorOf(form, `cautions.${i}.text`) && <p className="field-error">⚠ {errorOf(form, `cautions.${i}.text`)}</p>}
        </div>
      ))}
      <button
        type="button"
        className="btn-secondary"
        disabled={disabled}
        onClick={() => set([...cautions, { signal: 'WARNING', text: '' }])}
      >
        Add a caution
      </button>
    </fieldset>
  );
}

function numberText(v: number | undefined): string {
  return v === undefined ? '' : String(v);
}

function Bands({ form, others, disabled, unit }: { form: Form; others: StepPanelProps['others']; disabled?: boolean; unit: string }) {
  const bands = (useWatch({ control: form.control, name: 'bands' }) as Band[] | undefined) ?? [];
  const set = (next: Band[]) => form.setValue('bands', next, { shouldDirty: true, shouldValidate: true });
  const commitBoundary = (i: number, text: string) => {
    const value = Number(text.replace(',', '.'));
    if (text.trim() === '' || !Number.isFinite(value)) return;
    set(moveBoundary(bands, i, value));
  };
  return (
    <fieldset className="space-y-2">
      <legend className="label">Bands ({unit}), lowest first</legend>
      <p className="text-sm text-muted">
        Each band runs from its lower boundary (included) up to the next (not included). The first is open below, the last open above.
      </p>
      {bands.map((band, i) => (
        <div key={i}>
          <div className="space-y-2 rounded-lg border border-line p-3" data-band={i}>
            <div className="flex items-baseline justify-between gap-2 text-sm text-muted">
              <span>
                Band {i + 1}: {band.from === undefined ? 'below' : `from ${band.from}`}{' '}
                {band.to === undefined ? '' : `${band.from === undefined ? '' : 'to '}${band.to}`}
                {band.from !== undefined && band.to === undefined ? ' and up' : ''} {unit}
              </span>
            </div>
            <div className="grid grid-cols-2 gap-2">
              <Labeled label="Label" error={errorOf(form, `bands.${i}.label`)}>
                {(id) => <input id={id} className="input" disabled={disabled} {...form.register(`bands.${i}.label`)} />}
              </Labeled>
              <Labeled label="Verdict">
                {(id) => (
                  <select id={id} className="input" disabled={disabled} {...form.register(`bands.${i}.verdict`)}>
                    <option value="below">Below normal</option>
                    <option value="within">Normal</option>
                    <option value="above">Above normal</option>
                  </select>
                )}
              </Labeled>
            </div>
            <label className="flex min-h-touch items-center gap-2 text-sm">
              <input
                type="checkbox"
                className="h-5 w-5"
                disabled={disabled}
                checked={band.askAgain !== undefined}
                onChange={(e) =>
                  set(
                    bands.map((b, j) =>
                      j === i
                        ? e.target.checked
                          ? { ...b, outcome: undefined, askAgain: 'Check the meter leads and function, then measure again.' }
                          : { ...b, askAgain: undefined, outcome: '' }
                        : b,
                    ),
                  )
                }
              />
              A reading here is not taken: ask to measure again
            </label>
            {band.askAgain !== undefined ? (
              <Labeled label="What the technician is told" error={errorOf(form, `bands.${i}.askAgain`)}>
                {(id) => <input id={id} className="input" disabled={disabled} {...form.register(`bands.${i}.askAgain`)} />}
              </Labeled>
            ) : (
              <TargetSelect form={form} name={`bands.${i}.outcome`} others={others} label="Leads to" disabled={disabled} />
            )}
            <div className="flex gap-2">
              <button
                type="button"
                className="btn-secondary"
                disabled={disabled}
                onClick={() => set(splitBand(bands, i, splitPoint(band)))}
              >
                Split band {i + 1}
              </button>
              {bands.length > 1 && (
                <button type="button" className="btn-quiet" disabled={disabled} onClick={() => set(removeBand(bands, i))}>
                  Remove band {i + 1}
                </button>
              )}
            </div>
          </div>
          {i < bands.length - 1 && (
            <div className="my-2 flex items-center gap-2 pl-3">
              <label htmlFor={`boundary-${i}`} className="text-sm font-semibold">
                Boundary {i + 1}–{i + 2}
              </label>
              <input
                id={`boundary-${i}`}
                key={`${i}:${numberText(band.to)}`}
                aria-label={`Boundary between band ${i + 1} and band ${i + 2}`}
                inputMode="decimal"
                className="input w-32"
                disabled={disabled}
                defaultValue={numberText(band.to)}
                onBlur={(e) => commitBoundary(i, e.target.value)}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') {
                    e.preventDefault();
                    commitBoundary(i, e.currentTarget.value);
                  }
                }}
              />
              <span className="text-sm text-muted">{unit}</span>
            </div>
          )}
        </div>
      ))}
      {errorOf(form, 'bands') && <p className="field-error">⚠ {errorOf(form, 'bands')}</p>}
    </fieldset>
  );
}

function Choices({
  form,
  name,
  others,
  disabled,
  fact,
}: {
  form: Form;
  name: 'choices' | 'cases';
  others: StepPanelProps['others'];
  disabled?: boolean;
  fact?: UnitFact;
}) {
  const items = (useWatch({ control: form.control, name }) as Choice[] | undefined) ?? [];
  const set = (next: typeof items) => form.setValue(name, next, { shouldDirty: true, shouldValidate: true });
  const word = name === 'choices' ? 'Choice' : 'Case';
  return (
    <fieldset className="space-y-2">
      <legend className="label">{name === 'choices' ? 'Choices' : `Cases of ${fact}`}</legend>
      {items.map((_, i) => (
        <div key={i} className="space-y-2 rounded-lg border border-line p-3" data-choice={i}>
          <div className="grid grid-cols-2 gap-2">
            {fact ? (
              <Labeled label="Value">
                {(id) => (
                  <select id={id} className="input" disabled={disabled} {...form.register(`${name}.${i}.value`)}>
                    {UNIT_FACTS[fact].map((v) => (
                      <option key={v}>{v}</option>
                    ))}
                  </select>
                )}
              </Labeled>
            ) : (
              <Labeled label={`${word} ${i + 1} id`} error={errorOf(form, `${name}.${i}.value`)}>
                {(id) => <input id={id} className="input font-mono" disabled={disabled} {...form.register(`${name}.${i}.value`)} />}
              </Labeled>
            )}
            <Labeled label={`${word} ${i + 1} label`} error={errorOf(form, `${name}.${i}.label`)}>
              {(id) => <input id={id} className="input" disabled={disabled} {...form.register(`${name}.${i}.label`)} />}
            </Labeled>
          </div>
          <TargetSelect form={form} name={`${name}.${i}.outcome`} others={others} label={`${word} ${i + 1} leads to`} disabled={disabled} />
          {!fact && items.length > 2 && (
            <button type="button" className="btn-quiet" disabled={disabled} onClick={() => set(items.filter((__, j) => j !== i))}>
              Remove choice {i + 1}
            </button>
          )}
        </div>
      ))}
      {errorOf(form, name) && <p className="field-error">⚠ {errorOf(form, name)}</p>}
      {!fact && (
        <button
          type="button"
          className="btn-secondary"
          disabled={disabled}
          onClick={() => {
            let n = items.length + 1;
            while (items.some((c) => c.value === `choice-${n}`)) n++;
            set([...items, { value: `choice-${n}`, label: `Choice ${n}`, outcome: '' }]);
          }}
        >
          Add a choice
        </button>
      )}
    </fieldset>
  );
}

export function StepPanel({
  step,
  others,
  isStart,
  readOnly,
  onChange,
  onRename,
  onChangeKind,
  onDelete,
  onMakeStart,
  onClose,
}: StepPanelProps) {
  const form = useForm<FieldValues>({
    defaultValues: step as unknown as FieldValues,
    resolver: zodResolver(stepSchema) as unknown as Resolver<FieldValues>,
    mode: 'onChange',
  });
  const { register, watch, trigger } = form;

  useEffect(() => {
    void trigger();
    const sub = watch((values) => onChange(values as Step));
    return () => sub.unsubscribe();
  }, [watch, trigger, onChange]);

  const kind = step.kind;
  const quantity = (useWatch({ control: form.control, name: 'quantity' }) as (typeof QUANTITIES)[number] | undefined) ?? 'vac';
  const fact = useWatch({ control: form.control, name: 'fact' }) as UnitFact | undefined;
  const reference = useWatch({ control: form.control, name: 'reference' }) as MeasureStep['reference'];
  const measureOthers = others;
  const idError = errorOf(form, 'id');

  return (
    <form className="space-y-5" onSubmit={(e) => e.preventDefault()} aria-label={`Step ${step.id}`}>
      <div className="flex items-center gap-2">
        <h2 className="text-lg font-bold">Step</h2>
        {isStart ? (
          <span className="rounded bg-sunken px-2 py-1 text-sm font-semibold">Start step</span>
        ) : (
          <button type="button" className="btn-quiet text-sm" disabled={readOnly} onClick={onMakeStart}>
            Make this the start
          </button>
        )}
        <button type="button" className="btn-quiet ml-auto" onClick={onClose} aria-label="Close the step panel">
          ✕
        </button>
      </div>

      <Labeled label="Kind">
        {(id) => (
          <select id={id} className="input" value={kind} disabled={readOnly} onChange={(e) => onChangeKind(e.target.value as StepKind)}>
            {KINDS.map((k) => (
              <option key={k.kind} value={k.kind}>
                {k.label}
              </option>
            ))}
          </select>
        )}
      </Labeled>

      <Labeled label="Step id" error={idError}>
        {(id) => (
          <input
            id={id}
            className="input font-mono"
            disabled={readOnly}
            defaultValue={step.id}
            onBlur={(e) => {
              const next = e.target.value.trim();
              if (next === step.id) return;
              const parsed = stepIdSchema.safeParse(next);
              if (!parsed.success) {
                form.setError('id', { message: parsed.error.issues[0]?.message ?? 'Not a step id' });
                return;
              }
              const refused = onRename(step.id, next);
              if (refused) form.setError('id', { message: refused });
            }}
          />
        )}
      </Labeled>

      <Labeled label="Title" error={errorOf(form, 'title')}>
        {(id) => <input id={id} className="input" disabled={readOnly} {...register('title')} />}
      </Labeled>
      <Labeled label="Instruction">
        {(id) => <textarea id={id} rows={3} className="input py-2" disabled={readOnly} {...register('instruction')} />}
      </Labeled>

      {kind === 'measure' && (
        <>
          <Labeled label="Quantity">
            {(id) => (
              <select id={id} className="input" disabled={readOnly} {...register('quantity')}>
                {QUANTITIES.map((q) => (
                  <option key={q} value={q}>
                    {QUANTITY_LABEL[q]} ({CANONICAL_UNITS[q]})
                  </option>
                ))}
              </select>
            )}
          </Labeled>
          <div className="grid grid-cols-2 gap-2">
            <Labeled label="Test point 1" error={errorOf(form, 'points.0')}>
              {(id) => <input id={id} className="input" disabled={readOnly} {...register('points.0')} />}
            </Labeled>
            <Labeled label="Test point 2" error={errorOf(form, 'points.1')}>
              {(id) => <input id={id} className="input" disabled={readOnly} {...register('points.1')} />}
            </Labeled>
          </div>
          <ProbeFields form={form} quantity={quantity} disabled={readOnly} />
          <Bands form={form} others={others} disabled={readOnly} unit={CANONICAL_UNITS[quantity] ?? ''} />
          <fieldset className="space-y-2">
            <legend className="label">Relative bands</legend>
            <label className="flex min-h-touch items-center gap-2 text-sm">
              <input
                type="checkbox"
                className="h-5 w-5"
                disabled={readOnly}
                checked={reference !== undefined}
                onChange={(e) =>
                  form.setValue('reference', e.target.checked ? { step: measureOthers[0]?.id ?? '', fallback: 0 } : undefined, {
                    shouldDirty: true,
                    shouldValidate: true,
                  })
                }
              />
              Band limits are offsets from an earlier reading
            </label>
            {reference !== undefined && (
              <div className="grid grid-cols-2 gap-2">
                <Labeled label="Earlier reading (step)" error={errorOf(form, 'reference.step')}>
                  {(id) => (
                    <select id={id} className="input" disabled={readOnly} {...register('reference.step')}>
                      {measureOthers.map((o) => (
                        <option key={o.id} value={o.id}>
                          {o.id}
                        </option>
                      ))}
                    </select>
                  )}
                </Labeled>
                <Labeled label="Stands in when not read" error={errorOf(form, 'reference.fallback')}>
                  {(id) => (
                    <input
                      id={id}
                      inputMode="decimal"
                      className="input"
                      disabled={readOnly}
                      {...register('reference.fallback', { setValueAs: (v) => (v === '' ? undefined : Number(v)) })}
                    />
                  )}
                </Labeled>
              </div>
            )}
          </fieldset>
          <Labeled label="Where the bands come from">
            {(id) => (
              <input
                id={id}
                className="input"
                disabled={readOnly}
                {...register('bandsNote', { setValueAs: (v) => (v === '' ? undefined : v) })}
              />
            )}
          </Labeled>
          <fieldset>
            <legend className="label">Aids beside the reading</legend>
            {AIDS.map((aid) => (
              <label key={aid} className="flex min-h-touch items-center gap-2 text-sm">
                <input type="checkbox" className="h-5 w-5" value={aid} disabled={readOnly} {...register('aids')} />
                {aid === 'voltage-drop' ? 'Voltage drop' : 'Transformer load'}
              </label>
            ))}
          </fieldset>
        </>
      )}

      {kind === 'inspect' && (
        <>
          <Choices form={form} name="choices" others={others} disabled={readOnly} />
          <ObserveFields form={form} disabled={readOnly} />
        </>
      )}

      {(kind === 'measure' || kind === 'inspect' || kind === 'action') && (
        <TimelineField form={form} stepId={step.id} disabled={readOnly} />
      )}

      {kind === 'fact' && (
        <>
          <Labeled label="Fact of the unit record">
            {(id) => (
              <select
                id={id}
                className="input"
                disabled={readOnly}
                value={fact}
                onChange={(e) => {
                  const next = e.target.value as UnitFact;
                  form.setValue('fact', next, { shouldDirty: true });
                  form.setValue(
                    'cases',
                    UNIT_FACTS[next].map((value) => ({ value, label: value, outcome: '' })),
                    { shouldDirty: true, shouldValidate: true },
                  );
                }}
              >
                {(Object.keys(UNIT_FACTS) as UnitFact[]).map((f) => (
                  <option key={f}>{f}</option>
                ))}
              </select>
            )}
          </Labeled>
          {fact && <Choices form={form} name="cases" others={others} disabled={readOnly} fact={fact} />}
        </>
      )}

      {kind === 'action' && (
        <>
          <TextList form={form} name="checklist" label="Checklist" addLabel="Add a checklist item" disabled={readOnly} />
          <TargetSelect form={form} name="outcome" others={others} label="When done, leads to" disabled={readOnly} />
        </>
      )}

      {kind === 'finding' && (
        <>
          <Labeled label="Explanation" error={errorOf(form, 'explanation')}>
            {(id) => <textarea id={id} rows={2} className="input py-2" disabled={readOnly} {...register('explanation')} />}
          </Labeled>
          <Labeled label="Remedy" error={errorOf(form, 'remedy')}>
            {(id) => <textarea id={id} rows={2} className="input py-2" disabled={readOnly} {...register('remedy')} />}
          </Labeled>
          <TextList form={form} name="parts" label="Parts" addLabel="Add a part" disabled={readOnly} />
          <TextList form={form} name="verification" label="Verification checks" addLabel="Add a verification check" disabled={readOnly} />
        </>
      )}

      <Cautions form={form} disabled={readOnly} />

      <Labeled label="Why this step comes here (for learners)">
        {(id) => (
          <textarea
            id={id}
            rows={2}
            className="input py-2"
            disabled={readOnly}
            {...register('why', { setValueAs: (v) => (v === '' ? undefined : v) })}
          />
        )}
      </Labeled>

      <fieldset className="space-y-2">
        <legend className="label">Energy the step needs</legend>
        <div className="grid grid-cols-2 gap-2">
          {(['electric', 'gas'] as const).map((source) => (
            <Labeled key={source} label={source === 'electric' ? 'Electricity' : 'Gas'}>
              {(id) => (
                <select id={id} className="input" disabled={readOnly} {...register(`energy.${source}`)}>
                  <option value="on">On</option>
                  <option value="off">Off (isolated first)</option>
                  <option value="any">Either</option>
                </select>
              )}
            </Labeled>
          ))}
        </div>
        <p className="text-sm text-muted">Parts the step has someone open, remove or connect to:</p>
        {(['electric', 'gas'] as const).map((source) => (
          <label key={source} className="flex min-h-touch items-center gap-2 text-sm">
            <input type="checkbox" className="h-5 w-5" value={source} disabled={readOnly} {...register('handles')} />
            {source === 'electric' ? 'Handles parts fed by line or control voltage' : 'Handles parts of the gas train'}
          </label>
        ))}
      </fieldset>

      {!readOnly && (
        <button type="button" className={clsx('btn-secondary w-full')} onClick={onDelete}>
          Delete this step
        </button>
      )}
    </form>
  );
}
