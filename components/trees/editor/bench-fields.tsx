'use client';

// The step panel's fields that say, machine-readably, what the bench answers a step with: a measure
// step's probe (where the meter or gauge goes, in the bench's circuit vocabulary) and when in the
// sequence it is read; an inspect step's observation (what, when, which choice each result means)
// and the further looks after it; and whether the wizard shows the ignition sequence beside a step.
// The pick lists offer only what fits the step's quantity, as the validator requires; a probe left
// from an earlier quantity stays shown, and the validator's message says what to change.
import { useWatch } from 'react-hook-form';
import { errorOf, Labeled, type Form } from '@/components/trees/editor/fields';
import {
  gaugeChoicesFor,
  LEAD_CHOICES,
  MOMENT_CHOICES,
  OBSERVATION_CHOICES,
  POINT_CHOICES,
  PROBE_WAY_LABELS,
  probeWayOf,
  probeWaysFor,
  resultLabel,
  SERIES_CHOICES,
  type ProbeWay,
} from '@/lib/trees/probe-words';
import { showsIgnitionTimeline, type Observation, type Probe, type Quantity } from '@/lib/trees/schema';

const set = (form: Form, name: string, value: unknown) => form.setValue(name, value, { shouldDirty: true, shouldValidate: true });

/** A fresh probe of a way, on the first points that fit. */
function probeOf(way: ProbeWay, quantity: Quantity): Probe | undefined {
  switch (way) {
    case 'leads':
      return { a: POINT_CHOICES[0].id, b: POINT_CHOICES[1].id };
    case 'series':
      return { series: SERIES_CHOICES[0].id };
    case 'lead':
      return { lead: LEAD_CHOICES[0].id };
    case 'gauge': {
      const gauge = gaugeChoicesFor(quantity)[0];
      return gauge ? { gauge: gauge.id } : undefined;
    }
  }
}

function MomentSelect({ form, name, disabled, label }: { form: Form; name: string; disabled?: boolean; label: string }) {
  const at = useWatch({ control: form.control, name }) as string | undefined;
  return (
    <Labeled label={label} error={errorOf(form, name)}>
      {(id) => (
        <select
          id={id}
          className="input"
          disabled={disabled}
          value={at ?? ''}
          onChange={(e) => set(form, name, e.target.value || undefined)}
        >
          <option value="">Not said (as the unit stands)</option>
          {MOMENT_CHOICES.map((m) => (
            <option key={m.moment} value={m.moment}>
              {m.label}
            </option>
          ))}
        </select>
      )}
    </Labeled>
  );
}

/** A measure step's probe and moment. */
export function ProbeFields({ form, quantity, disabled }: { form: Form; quantity: Quantity; disabled?: boolean }) {
  const probe = useWatch({ control: form.control, name: 'probe' }) as Probe | undefined;
  const way = probe ? probeWayOf(probe) : undefined;
  const fitting = probeWaysFor(quantity);
  // A probe of a way the quantity no longer takes stays listed, so the lead sees and changes it.
  const ways = way && !fitting.includes(way) ? [...fitting, way] : fitting;
  const gauges = gaugeChoicesFor(quantity);
  const current = (probe ?? {}) as Record<string, string | undefined>;
  const pointSelect = (key: 'a' | 'b', label: string) => (
    <Labeled label={label} error={errorOf(form, `probe.${key}`)}>
      {(id) => (
        <select
          id={id}
          className="input"
          disabled={disabled}
          value={current[key] ?? ''}
          onChange={(e) => set(form, 'probe', { ...probe, [key]: e.target.value })}
        >
          {POINT_CHOICES.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </select>
      )}
    </Labeled>
  );
  return (
    <fieldset className="space-y-2" data-testid="probe-fields">
      <legend className="label">Where the bench takes the reading</legend>
      <p className="text-sm text-muted">
        For practice on the bench and the isolation check. The test points above stay what the technician reads.
      </p>
      <Labeled label="How the reading is taken" error={errorOf(form, 'probe')}>
        {(id) => (
          <select
            id={id}
            className="input"
            disabled={disabled}
            value={way ?? ''}
            onChange={(e) => set(form, 'probe', e.target.value ? probeOf(e.target.value as ProbeWay, quantity) : undefined)}
          >
            <option value="">Not said (the bench cannot answer this step)</option>
            {ways.map((w) => (
              <option key={w} value={w} disabled={w === 'gauge' && gauges.length === 0}>
                {PROBE_WAY_LABELS[w]}
                {fitting.includes(w) ? '' : ' (does not fit this quantity)'}
              </option>
            ))}
          </select>
        )}
      </Labeled>
      {way === 'leads' && (
        <div className="grid gap-2 sm:grid-cols-2">
          {pointSelect('a', 'First lead on')}
          {pointSelect('b', 'Second lead on')}
        </div>
      )}
      {way === 'series' && (
        <Labeled label="In series in" error={errorOf(form, 'probe.series')}>
          {(id) => (
            <select
              id={id}
              className="input"
              disabled={disabled}
              value={current.series ?? ''}
              onChange={(e) => set(form, 'probe', { series: e.target.value })}
            >
              {SERIES_CHOICES.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label}
                </option>
              ))}
            </select>
          )}
        </Labeled>
      )}
      {way === 'lead' && (
        <Labeled label="The lead, end to end" error={errorOf(form, 'probe.lead')}>
          {(id) => (
            <select
              id={id}
              className="input"
              disabled={disabled}
              value={current.lead ?? ''}
              onChange={(e) => set(form, 'probe', { lead: e.target.value })}
            >
              {LEAD_CHOICES.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label}
                </option>
              ))}
            </select>
          )}
        </Labeled>
      )}
      {way === 'gauge' && (
        <Labeled label="The gauge" error={errorOf(form, 'probe.gauge')}>
          {(id) => (
            <select
              id={id}
              className="input"
              disabled={disabled}
              value={current.gauge ?? ''}
              onChange={(e) => set(form, 'probe', { gauge: e.target.value })}
            >
              {/* A gauge of another quantity stays listed until the lead picks one that fits. */}
              {current.gauge && !gauges.some((g) => g.id === current.gauge) && <option value={current.gauge}>{current.gauge}</option>}
              {gauges.map((g) => (
                <option key={g.id} value={g.id}>
                  {g.label}
                </option>
              ))}
            </select>
          )}
        </Labeled>
      )}
      <MomentSelect form={form} name="at" disabled={disabled} label="When in the sequence it is read" />
    </fieldset>
  );
}

/** One observation: what, when, and the choice each result means. */
function ObservationEditor({
  form,
  name,
  choices,
  disabled,
  title,
  onRemove,
}: {
  form: Form;
  name: string;
  choices: { value: string; label: string }[];
  disabled?: boolean;
  title: string;
  onRemove?: () => void;
}) {
  const observe = useWatch({ control: form.control, name }) as Observation | undefined;
  const kind = OBSERVATION_CHOICES.find((o) => o.kind === observe?.what);
  const mapped = observe?.choices ?? {};
  return (
    <div className="space-y-2 rounded-lg border border-line p-3" data-observation={name}>
      <div className="flex items-center gap-2">
        <p className="font-semibold">{title}</p>
        {onRemove && (
          <button type="button" className="btn-quiet ml-auto" disabled={disabled} onClick={onRemove}>
            Remove this look
          </button>
        )}
      </div>
      <Labeled label="What is observed" error={errorOf(form, `${name}.what`)}>
        {(id) => (
          <select
            id={id}
            className="input"
            disabled={disabled}
            value={observe?.what ?? ''}
            onChange={(e) => set(form, name, { what: e.target.value, ...(observe?.at ? { at: observe.at } : {}), choices: {} })}
          >
            {OBSERVATION_CHOICES.map((o) => (
              <option key={o.kind} value={o.kind}>
                {o.label}
              </option>
            ))}
          </select>
        )}
      </Labeled>
      <MomentSelect form={form} name={`${name}.at`} disabled={disabled} label="When" />
      {kind && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-semibold">Which choice each result means</legend>
          {kind.results.map((result) => (
            <Labeled key={result} label={resultLabel(result)}>
              {(id) => (
                <select
                  id={id}
                  className="input"
                  disabled={disabled}
                  value={mapped[result] ?? ''}
                  onChange={(e) => {
                    const next = { ...mapped };
                    if (e.target.value) next[result] = e.target.value;
                    else delete next[result];
                    set(form, `${name}.choices`, next);
                  }}
                >
                  <option value="">No choice of this step</option>
                  {/* A choice since renamed or removed stays shown; the problems list says so. */}
                  {mapped[result] && !choices.some((c) => c.value === mapped[result]) && (
                    <option value={mapped[result]}>{mapped[result]} (not a choice of this step)</option>
                  )}
                  {choices.map((c) => (
                    <option key={c.value} value={c.value}>
                      {c.label}
                    </option>
                  ))}
                </select>
              )}
            </Labeled>
          ))}
        </fieldset>
      )}
    </div>
  );
}

/** An inspect step's observation and the further looks taken when its result maps to no choice. */
export function ObserveFields({ form, disabled }: { form: Form; disabled?: boolean }) {
  const observe = useWatch({ control: form.control, name: 'observe' }) as Observation | undefined;
  const more = (useWatch({ control: form.control, name: 'observeMore' }) as Observation[] | undefined) ?? [];
  const choices = (useWatch({ control: form.control, name: 'choices' }) as { value: string; label: string }[] | undefined) ?? [];
  const fresh = (): Observation => ({ what: OBSERVATION_CHOICES[0].kind, choices: {} });
  return (
    <fieldset className="space-y-2" data-testid="observe-fields">
      <legend className="label">What the bench observes</legend>
      <p className="text-sm text-muted">
        For practice on the bench and the isolation check: the look this step takes, and what each result means.
      </p>
      <label className="flex min-h-touch items-center gap-2 text-sm">
        <input
          type="checkbox"
          className="h-5 w-5"
          disabled={disabled}
          checked={observe !== undefined}
          onChange={(e) => {
            set(form, 'observe', e.target.checked ? fresh() : undefined);
            if (!e.target.checked) set(form, 'observeMore', undefined);
          }}
        />
        The bench answers this step by observing
      </label>
      {observe && <ObservationEditor form={form} name="observe" choices={choices} disabled={disabled} title="The look" />}
      {observe &&
        more.map((_, i) => (
          <ObservationEditor
            key={i}
            form={form}
            name={`observeMore.${i}`}
            choices={choices}
            disabled={disabled}
            title={`Then, if no choice fits: look ${i + 2}`}
            onRemove={() => {
              const next = more.filter((__, j) => j !== i);
              set(form, 'observeMore', next.length ? next : undefined);
            }}
          />
        ))}
      {observe && (
        <button type="button" className="btn-secondary" disabled={disabled} onClick={() => set(form, 'observeMore', [...more, fresh()])}>
          Add a further look
        </button>
      )}
    </fieldset>
  );
}

/** Whether the wizard shows the ignition sequence beside the step. */
export function TimelineField({ form, stepId, disabled }: { form: Form; stepId: string; disabled?: boolean }) {
  const timeline = useWatch({ control: form.control, name: 'timeline' }) as boolean | undefined;
  return (
    <label className="flex min-h-touch items-center gap-2 text-sm">
      <input
        type="checkbox"
        className="h-5 w-5"
        disabled={disabled}
        checked={showsIgnitionTimeline({ id: stepId, timeline })}
        onChange={(e) => set(form, 'timeline', e.target.checked)}
      />
      Show the ignition sequence beside this step
    </label>
  );
}
