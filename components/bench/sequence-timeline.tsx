import clsx from 'clsx';

// The control's sequence as the bench ran it: each state from the time the bench reported it to the
// next, drawn to scale on the simulated clock, with a pattern per kind of state (not colour alone)
// and the same list as text for screen readers.

export interface TimelineEntry {
  time: number;
  sequenceState: string;
}

interface Look {
  label: string;
  /** Fill of the bar: plain, hatched (spark/valve), solid (flame), empty (off/standby). */
  fill: 'empty' | 'light' | 'hatched' | 'solid' | 'dark';
}

/** Words for the states of the ignition sequence (the last part of a nested state name decides). */
export function describeState(state: string): Look {
  const s = state.toLowerCase();
  // The bench says "off" whenever the control has no power: the unit switched off, or a supply fault (a blown fuse).
  if (s === 'off' || s.includes('unpowered')) return { label: 'Control not powered', fill: 'empty' };
  if (s.includes('lockout')) return { label: 'Lockout', fill: 'dark' };
  if (s.includes('safety-open')) return { label: 'Safety circuit open', fill: 'dark' };
  if (s.includes('proving')) return { label: 'Trial: valve open, proving flame', fill: 'hatched' };
  if (s.includes('spark')) return { label: 'Trial: sparking', fill: 'hatched' };
  if (s.includes('trial')) return { label: 'Trial for ignition', fill: 'hatched' };
  if (s.includes('inter-purge')) return { label: 'Purge between trials', fill: 'light' };
  if (s.includes('purge')) return { label: 'Pre-purge', fill: 'light' };
  if (s.includes('running')) return { label: 'Flame proven, running', fill: 'solid' };
  if (s.includes('idle')) return { label: 'Standby, no call', fill: 'empty' };
  if (s.includes('inducer') || s.includes('pressure')) return { label: 'Inducer, proving draft', fill: 'light' };
  return { label: state, fill: 'light' };
}

const FILL: Record<Look['fill'], string> = {
  empty: 'bg-surface',
  light: 'bg-sunken',
  hatched: 'bg-[repeating-linear-gradient(45deg,rgb(var(--ink)/0.75)_0_6px,transparent_6px_12px)]',
  solid: 'bg-copper',
  dark: 'bg-ink',
};

function clock(seconds: number) {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

export function SequenceTimeline({ entries, now }: { entries: readonly TimelineEntry[]; now: number }) {
  if (entries.length === 0) return null;
  const start = entries[0].time;
  const span = Math.max(1, now - start);
  const segments = entries.map((e, i) => {
    const end = i + 1 < entries.length ? entries[i + 1].time : now;
    return { ...e, end, look: describeState(e.sequenceState) };
  });
  const current = segments[segments.length - 1];
  return (
    <section aria-labelledby="timeline-title" className="card space-y-2" data-testid="sequence-timeline">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="timeline-title" className="text-lg font-bold">
          Sequence
        </h2>
        <p className="text-base" aria-live="polite">
          Now: <span className="font-semibold">{current.look.label}</span>
        </p>
      </div>
      <div aria-hidden className="flex h-8 w-full overflow-hidden rounded border border-line">
        {segments.map((seg, i) => (
          <div
            key={i}
            title={seg.look.label}
            className={clsx('h-full border-r border-line last:border-r-0', FILL[seg.look.fill])}
            style={{ width: `${Math.max(2, ((seg.end - seg.time) / span) * 100)}%` }}
          />
        ))}
      </div>
      <ol className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {segments.slice(-8).map((seg, i) => (
          <li key={i} className="flex items-center gap-1">
            <span aria-hidden className={clsx('inline-block h-3 w-5 rounded-sm border border-line', FILL[seg.look.fill])} />
            <span className="font-mono text-muted">{clock(seg.time)}</span> {seg.look.label}
          </li>
        ))}
      </ol>
    </section>
  );
}
