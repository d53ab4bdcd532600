import type { AttemptOutput, PracticeEventOutput, ScoreOutput } from '@/lib/validations/practice';

/** The score, line by line, each with why. */
export function ScoreCard({ score }: { score: ScoreOutput }) {
  return (
    <section aria-labelledby="score-title" className="card space-y-3" data-testid="score-card">
      <h2 id="score-title" className="flex flex-wrap items-baseline justify-between gap-2 text-xl font-bold">
        Score
        <span className="font-mono text-3xl" data-testid="score-total">
          {score.total} / {score.max}
        </span>
      </h2>
      <ul className="divide-y divide-line">
        {score.lines.map((l) => (
          <li key={l.key} className="py-2">
            <p className="flex justify-between gap-2 font-semibold">
              {l.label}
              <span className="font-mono">
                {l.points} / {l.max}
              </span>
            </p>
            <p className="text-base text-muted">{l.detail}</p>
          </li>
        ))}
      </ul>
    </section>
  );
}

function clock(seconds: number) {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

const ACTION_WORDS: Record<string, string> = {
  'power-on': 'Power on',
  'power-off': 'Power off',
  'call-for-heat': 'Call for heat',
  'end-call': 'Call ended',
  'reset-rollout': 'Rollout switch reset',
  wait: 'Waited',
};
const MODE_WORDS: Record<string, string> = { vac: 'VAC', vdc: 'VDC', ohm: 'Ω', udc: 'µA DC' };

export function describeEvent(e: PracticeEventOutput): { what: string; value: string | null } {
  if (e.kind === 'action')
    return { what: `${ACTION_WORDS[e.action] ?? e.action}${e.action === 'wait' && e.seconds ? ` ${e.seconds} s` : ''}`, value: null };
  if (e.kind === 'observe') return { what: `Looked at the ${e.what}`, value: e.result };
  const value = e.value === null ? 'OL' : `${Math.round(e.value * 1000) / 1000}`;
  if (e.mode === 'gauge') {
    const unit = e.gauge === 'spark-gap' ? 'in' : 'inWC';
    return { what: `Gauge: ${e.gauge}`, value: `${value} ${unit}` };
  }
  const where = e.mode === 'udc' ? `in series in ${e.series}` : e.lead ? `of the ${e.lead}, disconnected` : `${e.a} → ${e.b}`;
  return { what: `${MODE_WORDS[e.mode]} ${where}`, value: `${value} ${MODE_WORDS[e.mode]}` };
}

/** Every step of an attempt on the bench, in order, with the simulated clock. Consecutive waits are one line. */
export function AttemptPath({ attempt }: { attempt: Pick<AttemptOutput, 'events'> }) {
  const lines: { time: number; what: string; value: string | null }[] = [];
  for (const e of attempt.events) {
    const last = lines[lines.length - 1];
    if (e.kind === 'action' && e.action === 'wait' && last?.what.startsWith('Waited')) {
      const total = Number(/(\d+(?:\.\d+)?) s$/.exec(last.what)?.[1] ?? 0) + (e.seconds ?? 0);
      last.what = `Waited ${total} s`;
      continue;
    }
    lines.push({ time: e.time, ...describeEvent(e) });
  }
  return (
    <section aria-labelledby="path-title" className="card space-y-2">
      <h2 id="path-title" className="text-lg font-bold">
        The path on the bench
      </h2>
      {lines.length === 0 ? (
        <p className="text-muted">Nothing was done on the bench.</p>
      ) : (
        <ol className="divide-y divide-line" data-testid="attempt-path">
          {lines.map((l, i) => (
            <li key={i} className="flex flex-wrap justify-between gap-2 py-2 text-base">
              <span>
                <span className="font-mono text-muted">{clock(l.time)}</span> {l.what}
              </span>
              {l.value && <span className="font-mono font-semibold">{l.value}</span>}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

/** The steps of the tree the walk took, with each answer: what the apprentice answered from the bench. */
export function WalkPath({ walk }: { walk: NonNullable<AttemptOutput['walk']> }) {
  return (
    <section aria-labelledby="walk-title" className="card space-y-2">
      <h2 id="walk-title" className="text-lg font-bold">
        The walk: {walk.title} · v{walk.version}
      </h2>
      {walk.path.length === 0 ? (
        <p className="text-muted">No step was answered.</p>
      ) : (
        <ol className="divide-y divide-line" data-testid="walk-path">
          {walk.path.map((p) => (
            <li key={p.clientId} className="flex flex-wrap justify-between gap-2 py-2 text-base">
              <span>{p.stepTitle}</span>
              <span className="font-mono font-semibold">
                {p.kind === 'measure'
                  ? `${p.overRange ? 'OL' : (p.text ?? p.value)} ${p.unit ?? ''}${p.band ? ` · ${p.band}` : ''}`
                  : p.kind === 'inspect'
                    ? (p.choiceLabel ?? p.choice)
                    : p.confirmed
                      ? 'Done'
                      : '—'}
              </span>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
