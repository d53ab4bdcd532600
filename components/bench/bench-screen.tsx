'use client';

import clsx from 'clsx';
import { useCallback, useEffect, useImperativeHandle, useRef, useState, type Ref } from 'react';
import { BenchSchematic } from '@/components/bench/bench-schematic';
import type { BenchClient } from '@/components/bench/bench-client';
import { SequenceTimeline, type TimelineEntry } from '@/components/bench/sequence-timeline';
import { Caution } from '@/components/ui/caution';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { FormMessage } from '@/components/ui/field';
import type { BenchAction, BenchState, MeterMode, UnitProfile } from '@/lib/validations/practice';

// The bench: the schematic to tap, the meter, the buttons that work the furnace, the sequence on a
// timeline and every reading taken. Every reading and action goes to the server (which keeps the
// events the attempt is scored on); the screen only shows what the bench answered.

export const METER_MODES: readonly { mode: MeterMode; label: string; unit: string; hint: string }[] = [
  { mode: 'vac', label: 'V AC', unit: 'VAC', hint: 'Tap two test points: the V+ lead first, then COM.' },
  { mode: 'vdc', label: 'V DC', unit: 'VDC', hint: 'Tap two test points: the V+ lead first, then COM.' },
  { mode: 'ohm', label: 'Ω', unit: 'Ω', hint: 'Resistance is only meaningful with the power off. Tap two test points.' },
  { mode: 'udc', label: 'µA DC', unit: 'µA', hint: 'Break a lead for the meter in series: tap the flame-rod lead mark or ground-lead.' },
];

export interface Reading {
  n: number;
  mode: MeterMode | 'gauge';
  where: string;
  value: number | null;
  unit: string;
  time: number;
}

export interface Observation {
  n: number;
  what: string;
  result: string;
  time: number;
}

/** What was taken on the bench, as the screen tells a parent (the practice wizard fills its steps from it). */
export type BenchTaken =
  | {
      kind: 'measure';
      n: number;
      request: { mode: string; a?: string; b?: string; series?: string; gauge?: string };
      value: number | null;
      unit: string;
      time: number;
    }
  | { kind: 'observe'; n: number; what: string; result: string; time: number };

/** What a parent may ask of the screen: a look, listed and timed like one from the screen's own buttons. */
export interface BenchHandle {
  observe(what: string): Promise<{ result: string; time: number }>;
}

/** The gauges a practice bench reads, with their words. */
export const GAUGE_BUTTONS: readonly { id: string; label: string; unit: string }[] = [
  { id: 'inlet-pressure', label: 'Inlet pressure', unit: 'inWC' },
  { id: 'manifold-pressure', label: 'Manifold pressure', unit: 'inWC' },
  { id: 'spark-gap', label: 'Spark gap', unit: 'in' },
];

const OBSERVATION_WORDS: Record<string, string> = {
  'at-gap': 'Spark at the gap',
  'heard-not-seen': 'Spark heard, not seen at the gap',
  'to-frame': 'Spark arcing to the frame',
  none: 'None',
  'all-burners': 'Flame on all burners',
  partial: 'Flame on some burners only',
};

/** A result in words where the screen has them, else as the bench says it. */
export function resultWords(result: string): string {
  return OBSERVATION_WORDS[result] ?? result.replace(/-/g, ' ');
}

export function formatValue(value: number | null, mode: MeterMode): string {
  if (value === null || !Number.isFinite(value)) return 'OL';
  if (mode === 'ohm') return Math.abs(value) >= 1000 ? `${(value / 1000).toFixed(2)} k` : value.toFixed(1);
  return value.toFixed(mode === 'udc' ? 2 : 1);
}

function clockText(seconds: number) {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

interface Props {
  client: BenchClient;
  unit: UnitProfile;
  /** Taken readings and observations, for a parent that wants them (the finding form shows a count). */
  onActivity?: (count: number) => void;
  /** Each reading and look as it is taken. */
  onTaken?: (taken: BenchTaken) => void;
  /** Looks asked by a parent (the wizard's "Observe"). */
  handle?: Ref<BenchHandle>;
  /** Whether the readings are scored (an apprentice's attempt); a lead's own bench is not. */
  scored?: boolean;
}

export function BenchScreen({ client, unit, onActivity, onTaken, handle, scored = true }: Props) {
  const [state, setState] = useState<BenchState | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [mode, setMode] = useState<MeterMode>('vac');
  const [leads, setLeads] = useState<{ plus: string | null; common: string | null; series: string | null }>({
    plus: null,
    common: null,
    series: null,
  });
  const [display, setDisplay] = useState<{ text: string; unit: string } | null>(null);
  const [readings, setReadings] = useState<Reading[]>([]);
  const [observations, setObservations] = useState<Observation[]>([]);
  const [timeline, setTimeline] = useState<TimelineEntry[]>([]);
  const [confirmReset, setConfirmReset] = useState(false);
  const counter = useRef(0);

  useEffect(() => {
    let live = true;
    client
      .state()
      .then((s) => {
        if (!live) return;
        setState(s);
        setTimeline([{ time: s.time, sequenceState: s.powered ? s.sequenceState : 'off' }]);
      })
      .catch((e: Error) => live && setLoadError(e.message));
    return () => {
      live = false;
    };
  }, [client]);

  useEffect(() => {
    onActivity?.(readings.length + observations.length);
  }, [readings.length, observations.length, onActivity]);

  const record = useCallback((time: number, sequenceState: string) => {
    setTimeline((t) => (t.length && t[t.length - 1].sequenceState === sequenceState ? t : [...t, { time, sequenceState }]));
  }, []);

  const run = async (work: () => Promise<void>) => {
    setBusy(true);
    setError(null);
    try {
      await work();
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  const act = (action: BenchAction, seconds?: number) =>
    run(async () => {
      if (action === 'wait' && seconds) {
        // A long wait in small steps, so the timeline shows each state the sequence passes through.
        const step = seconds > 15 ? 5 : 1;
        let left = seconds;
        while (left > 0) {
          const chunk = Math.min(step, left);
          const reply = await client.act('wait', chunk);
          record(reply.time, reply.sequenceState);
          setState((s) => (s ? { ...s, time: reply.time, sequenceState: reply.sequenceState } : s));
          left -= chunk;
        }
        return;
      }
      const reply = await client.act(action, seconds);
      const powered = action === 'power-on' ? true : action === 'power-off' ? false : (state?.powered ?? false);
      const calling = action === 'call-for-heat' ? true : action === 'end-call' ? false : (state?.calling ?? false);
      setState((s) => (s ? { ...s, time: reply.time, sequenceState: reply.sequenceState, powered, calling } : s));
      record(reply.time, powered ? reply.sequenceState : 'off');
    });

  const chooseMode = (next: MeterMode) => {
    setMode(next);
    setLeads({ plus: null, common: null, series: null });
    setDisplay(null);
  };

  const tap = (id: string) => {
    setDisplay(null);
    if (mode === 'udc') {
      setLeads({ plus: null, common: null, series: id });
      return;
    }
    setLeads((l) => {
      if (!l.plus || l.common) return { plus: id, common: null, series: null };
      if (l.plus === id) return l;
      return { ...l, common: id };
    });
  };

  const ready = mode === 'udc' ? !!leads.series : !!leads.plus && !!leads.common;

  const read = () =>
    run(async () => {
      const request = mode === 'udc' ? { mode: 'udc' as const, series: leads.series! } : { mode, a: leads.plus!, b: leads.common! };
      const reply = await client.measure(request);
      const where = mode === 'udc' ? `in series in ${leads.series}` : `${leads.plus} → ${leads.common}`;
      setDisplay({ text: formatValue(reply.value, mode), unit: reply.unit });
      counter.current += 1;
      const n = counter.current;
      setReadings((r) => [{ n, mode, where, value: reply.value, unit: reply.unit, time: reply.time }, ...r]);
      setState((s) => (s ? { ...s, time: reply.time } : s));
      onTaken?.({ kind: 'measure', n, request, value: reply.value, unit: reply.unit, time: reply.time });
    });

  const readGauge = (id: string) =>
    run(async () => {
      if (!client.gauge) return;
      const reply = await client.gauge(id);
      const label = GAUGE_BUTTONS.find((g) => g.id === id)?.label ?? id;
      setDisplay({ text: reply.value === null ? 'OL' : String(reply.value), unit: reply.unit });
      counter.current += 1;
      const n = counter.current;
      setReadings((r) => [{ n, mode: 'gauge', where: label, value: reply.value, unit: reply.unit, time: reply.time }, ...r]);
      setState((s) => (s ? { ...s, time: reply.time } : s));
      onTaken?.({ kind: 'measure', n, request: { mode: 'gauge', gauge: id }, value: reply.value, unit: reply.unit, time: reply.time });
    });

  const look = async (what: string) => {
    const reply = await client.observe(what);
    counter.current += 1;
    const n = counter.current;
    setObservations((o) => [{ n, what, result: reply.result, time: reply.time }, ...o]);
    setState((s) => (s ? { ...s, time: reply.time } : s));
    onTaken?.({ kind: 'observe', n, what, result: reply.result, time: reply.time });
    return reply;
  };

  const observe = (what: string) =>
    run(async () => {
      await look(what);
    });

  useImperativeHandle(handle, () => ({
    observe: async (what: string) => {
      setBusy(true);
      setError(null);
      try {
        return await look(what);
      } catch (e) {
        setError((e as Error).message);
        throw e;
      } finally {
        setBusy(false);
      }
    },
  }));

  if (loadError) return <FormMessage message={`The bench could not be opened: ${loadError}`} />;
  if (!state) {
    return (
      <p role="status" className="card text-muted">
        Opening the bench…
      </p>
    );
  }

  const meter = METER_MODES.find((m) => m.mode === mode)!;
  const history = [
    ...readings.map((r) =>
      r.mode === 'gauge'
        ? { n: r.n, time: r.time, text: `Gauge: ${r.where}`, value: `${r.value === null ? 'OL' : r.value} ${r.unit}` }
        : {
            n: r.n,
            time: r.time,
            text: `${METER_MODES.find((m) => m.mode === r.mode)!.label} ${r.where}`,
            value: `${formatValue(r.value, r.mode)} ${r.unit}`,
          },
    ),
    ...observations.map((o) => ({ n: o.n, time: o.time, text: `Look at the ${o.what}`, value: resultWords(o.result) })),
  ].sort((a, b) => b.n - a.n);

  return (
    <div className="space-y-4" data-testid="bench">
      <Caution
        signal="WARNING"
        text="Line voltage at the unit and at a line-powered control, about 10 kV at the spark rod during a trial, and AC on the flame rod whenever the control is powered. On a real unit: power off, lock out and verify dead with a meter before touching rods, leads or the burner."
      />
      <div className="flex flex-wrap items-center gap-3 text-base" aria-live="polite">
        <span className="rounded-lg border border-line px-3 py-2 font-semibold" data-testid="bench-power">
          Power {state.powered ? 'on' : 'off'}
        </span>
        <span className="rounded-lg border border-line px-3 py-2">Call for heat {state.calling ? 'on' : 'off'}</span>
        <span className="rounded-lg border border-line px-3 py-2 font-mono">t = {clockText(state.time)}</span>
      </div>

      <BenchSchematic unit={unit} series={mode === 'udc'} leads={leads} disabled={busy} onTap={tap} />

      <SequenceTimeline entries={timeline} now={state.time} />

      <div className="grid gap-4 md:grid-cols-2">
        <section aria-labelledby="meter-title" className="card space-y-3">
          <h2 id="meter-title" className="text-lg font-bold">
            Meter
          </h2>
          <div role="radiogroup" aria-label="Meter function" className="grid grid-cols-4 gap-2">
            {METER_MODES.map((m) => (
              <button
                key={m.mode}
                type="button"
                role="radio"
                aria-checked={mode === m.mode}
                className={clsx('btn px-2', mode === m.mode ? 'bg-ink text-surface' : 'border border-line bg-raised')}
                onClick={() => chooseMode(m.mode)}
              >
                {m.label}
              </button>
            ))}
          </div>
          <p className="text-base text-muted">{meter.hint}</p>
          {mode === 'udc' && (
            <Caution
              signal="WARNING"
              text="Breaking a lead means handling it: turn the power off and verify it dead with the meter before you put the meter in series, then power up and call for heat to read. Never put the meter in a lead that carries the spark; single-rod controls have their own test method."
            />
          )}
          <dl className="grid grid-cols-2 gap-2 text-base">
            {mode === 'udc' ? (
              <div className="col-span-2">
                <dt className="text-muted">Meter in series in</dt>
                <dd className="font-mono">{leads.series ?? '—'}</dd>
              </div>
            ) : (
              <>
                <div>
                  <dt className="text-muted">V+ lead</dt>
                  <dd className="font-mono">{leads.plus ?? '—'}</dd>
                </div>
                <div>
                  <dt className="text-muted">COM lead</dt>
                  <dd className="font-mono">{leads.common ?? '—'}</dd>
                </div>
              </>
            )}
          </dl>
          <output
            aria-live="polite"
            aria-label="Meter display"
            data-testid="meter-display"
            className="flex min-h-[4.5rem] items-baseline justify-end gap-2 rounded-lg border-2 border-ink bg-sunken px-4 py-2 font-mono text-4xl font-bold"
          >
            {display ? display.text : '----'}
            <span className="text-xl">{display ? display.unit : meter.unit}</span>
          </output>
          <button type="button" className="btn-primary w-full" disabled={!ready || busy} onClick={read}>
            Read the meter
          </button>
        </section>

        <section aria-labelledby="controls-title" className="card space-y-3">
          <h2 id="controls-title" className="text-lg font-bold">
            The furnace
          </h2>
          <div className="grid grid-cols-2 gap-2">
            <button type="button" className="btn-secondary" disabled={busy} onClick={() => act(state.powered ? 'power-off' : 'power-on')}>
              {state.powered ? 'Power off' : 'Power on'}
            </button>
            <button
              type="button"
              className="btn-secondary"
              disabled={busy}
              onClick={() => act(state.calling ? 'end-call' : 'call-for-heat')}
            >
              {state.calling ? 'End the call' : 'Call for heat'}
            </button>
            <button type="button" className="btn-secondary" disabled={busy} onClick={() => observe('spark')}>
              Look at the spark
            </button>
            <button type="button" className="btn-secondary" disabled={busy} onClick={() => observe('flame')}>
              Look at the flame
            </button>
          </div>
          {client.gauge && (
            <div>
              <p className="mb-2 text-base text-muted">Gauges</p>
              <div className="grid grid-cols-3 gap-2">
                {GAUGE_BUTTONS.map((g) => (
                  <button key={g.id} type="button" className="btn-secondary px-2" disabled={busy} onClick={() => readGauge(g.id)}>
                    {g.label}
                  </button>
                ))}
              </div>
            </div>
          )}
          <div>
            <p className="mb-2 text-base text-muted">Wait on the sequence</p>
            <div className="grid grid-cols-4 gap-2">
              {[1, 5, 15, 60].map((s) => (
                <button key={s} type="button" className="btn-secondary px-2" disabled={busy} onClick={() => act('wait', s)}>
                  {s} s
                </button>
              ))}
            </div>
          </div>
          <button type="button" className="btn-quiet w-full border border-line" disabled={busy} onClick={() => setConfirmReset(true)}>
            Reset the rollout switch…
          </button>
        </section>
      </div>

      {error && <FormMessage message={error} />}

      <section aria-labelledby="taken-title" className="card space-y-2">
        <h2 id="taken-title" className="text-lg font-bold">
          Taken so far: <span className="font-mono">{history.length}</span>
        </h2>
        {history.length === 0 ? (
          <p className="text-muted">
            {scored
              ? 'No reading yet. Every reading and look counts toward the score: take the ones the diagnosis needs.'
              : 'No reading yet. Take the readings and looks the step asks for; nothing here is scored or stored with a call.'}
          </p>
        ) : (
          <ol className="divide-y divide-line" data-testid="bench-history">
            {history.map((h) => (
              <li key={h.n} className="flex flex-wrap justify-between gap-2 py-2 text-base">
                <span>
                  <span className="font-mono text-muted">{clockText(h.time)}</span> {h.text}
                </span>
                <span className="font-mono font-semibold">{h.value}</span>
              </li>
            ))}
          </ol>
        )}
      </section>

      <ConfirmDialog
        open={confirmReset}
        title="Reset the rollout switch?"
        description={
          <Caution
            signal="DANGER"
            text="A tripped rollout switch means flame left the combustion chamber: a blocked vent or flue, a cracked heat exchanger or over-firing. Find and correct the cause before any reset. A reset before the cause is found counts against the safety score."
          />
        }
        confirmLabel="Reset it anyway"
        busy={busy}
        onCancel={() => setConfirmReset(false)}
        onConfirm={() => {
          setConfirmReset(false);
          void act('reset-rollout');
        }}
      />
    </div>
  );
}
