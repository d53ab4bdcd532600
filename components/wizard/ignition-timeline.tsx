import clsx from 'clsx';
import { DEFAULT_CONTROL_PROFILE, describeSequence, type ControlProfile } from '@/machines/ignition-sequence-machine';

function secondsText(ms: number) {
  return `${Math.round(ms / 100) / 10} s`;
}

/** The first trial of a DSI control's sequence from the call for heat, then what follows. */
export function IgnitionTimeline({ profile = DEFAULT_CONTROL_PROFILE }: { profile?: ControlProfile }) {
  const all = describeSequence(profile);
  const firstTrial = all.filter((e) => e.phase === 'pre-purge' || e.trial === 1);
  const lockout = all.find((e) => e.phase === 'lockout');
  return (
    <details className="rounded-lg border border-line bg-raised" open>
      <summary className="flex min-h-touch cursor-pointer items-center px-4 font-semibold">When to measure: the ignition sequence</summary>
      <div className="px-4 pb-4">
        <p className="mb-3 text-base">The valve is only powered during the trial for ignition: measure within its first seconds.</p>
        <ol className="relative space-y-2 border-l-2 border-line pl-4">
          {firstTrial.map((e, i) => (
            <li key={i} className={clsx('relative', e.valvePowered && 'font-semibold')}>
              <span
                aria-hidden
                className={clsx(
                  'absolute -left-[1.45rem] top-1.5 h-3 w-3 rounded-full border-2 border-ink',
                  e.valvePowered ? 'bg-ink' : 'bg-raised',
                )}
              />
              <span className="font-mono text-base text-muted">
                t = {secondsText(e.startsAtMs)}
                {e.endsAtMs !== null ? `–${secondsText(e.endsAtMs)}` : ''}
              </span>
              <span className="ml-2 inline-flex gap-1 align-middle text-base">
                {e.spark && <span className="rounded border border-ink px-1">spark</span>}
                {e.valvePowered && <span className="rounded border border-ink bg-ink px-1 text-surface">valve powered</span>}
              </span>
              <p className="text-base">{e.text}</p>
            </li>
          ))}
          {lockout && (
            <li className="relative">
              <span aria-hidden className="absolute -left-[1.45rem] top-1.5 h-3 w-3 rounded-full border-2 border-ink bg-raised" />
              <span className="font-mono text-base text-muted">after {profile.trials} trials</span>
              <p className="text-base">{lockout.text}</p>
            </li>
          )}
        </ol>
      </div>
    </details>
  );
}
