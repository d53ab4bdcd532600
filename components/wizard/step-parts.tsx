import clsx from 'clsx';
import type { EnergyState, MeasureStep } from '@/lib/trees/schema';

/** Whether the unit is powered and its gas on: shown large, as words and symbols, on every step. */
export function EnergyBadge({ energy }: { energy: EnergyState }) {
  const live = energy.electric === 'on';
  const gasOn = energy.gas === 'on';
  return (
    <div className="flex flex-wrap gap-2" data-testid="energy-badge" data-energy={live ? 'energized' : 'locked-out'} data-gas={energy.gas}>
      <p
        className={clsx(
          'inline-flex min-h-touch items-center gap-2 rounded-full border-2 px-4 text-base font-bold',
          live ? 'border-ink bg-ink text-surface' : 'border-ink bg-raised text-ink',
        )}
      >
        <svg aria-hidden viewBox="0 0 24 24" className="h-6 w-6 fill-current">
          {live ? (
            <path d="M13 2 4 14h6l-1 8 9-12h-6l1-8z" />
          ) : (
            <path d="M7 10V7a5 5 0 0 1 10 0v3h1.5A1.5 1.5 0 0 1 20 11.5v9a1.5 1.5 0 0 1-1.5 1.5h-13A1.5 1.5 0 0 1 4 20.5v-9A1.5 1.5 0 0 1 5.5 10H7zm2 0h6V7a3 3 0 0 0-6 0v3z" />
          )}
        </svg>
        <span>
          <span className="sr-only">Power: </span>
          {live ? 'Energized' : 'Locked out'}
        </span>
      </p>
      <p
        className={clsx(
          'inline-flex min-h-touch items-center gap-2 rounded-full border-2 px-4 text-base font-bold',
          gasOn ? 'border-ink bg-ink text-surface' : 'border-dashed border-ink bg-raised text-ink',
        )}
      >
        <svg aria-hidden viewBox="0 0 24 24" className="h-6 w-6 fill-current">
          {gasOn ? <path d="M12 2c1 4 6 6 6 12a6 6 0 0 1-12 0c0-3 2-5 3-7 0 2 1 3 2 3 0-3 0-5 1-8z" /> : <path d="M3 11h18v2H3z" />}
        </svg>
        <span>
          <span className="sr-only">Gas: </span>
          {gasOn ? 'Gas on' : 'Gas off'}
        </span>
      </p>
    </div>
  );
}

const METER_FUNCTION: Record<MeasureStep['quantity'], string> = {
  vac: 'AC volts',
  vdc: 'DC volts',
  udc: 'DC microamps',
  ohm: 'Ohms',
  length: 'Gauge or rule',
  pressure: 'Manometer',
};

/** The two named points the meter goes between (for microamps, the meter in series between them). */
export function TestPoints({ step }: { step: Pick<MeasureStep, 'points' | 'quantity'> }) {
  const series = step.quantity === 'udc';
  return (
    <div className="rounded-lg border border-line bg-sunken px-4 py-3" data-testid="test-points">
      <p className="text-base font-semibold uppercase tracking-wide text-muted">
        {METER_FUNCTION[step.quantity]} · {series ? 'meter in series' : 'test points'}
      </p>
      <p className="mt-1 break-words font-mono text-lg font-semibold sm:text-xl">
        {step.points[0]} <span aria-hidden>{series ? '→ meter →' : '⟷'}</span>
        <span className="sr-only">{series ? ' through the meter to ' : ' and '}</span> {step.points[1]}
      </p>
    </div>
  );
}

/**
 * The learner's note: open by default for apprentices, closed for everyone else so it never pushes
 * the instruction down. Either way it can be opened and closed.
 */
export function WhyThisStep({ why, defaultOpen = false }: { why?: string; defaultOpen?: boolean }) {
  if (!why) return null;
  return (
    <details className="group rounded-lg border border-line bg-raised" open={defaultOpen || undefined} data-testid="why-this-step">
      <summary className="flex min-h-touch cursor-pointer list-none items-center gap-2 px-4 font-semibold">
        <span aria-hidden className="transition-transform group-open:rotate-90">
          ▶
        </span>
        Why this step
      </summary>
      <p className="px-4 pb-4 text-base">{why}</p>
    </details>
  );
}
