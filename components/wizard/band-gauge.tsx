import clsx from 'clsx';
import { findBand, gaugePosition, gaugeScale } from '@/lib/bands';
import type { MeasureStep, Verdict } from '@/lib/trees/schema';
import { formatOptionsFor, formatReading, OVER_RANGE_TEXT, type EntryForm, type FormatOptions } from '@/lib/units';

// A reading against its bands: position on a horizontal scale, an icon and a word. Bands are told
// apart by pattern and by their labels, never by colour alone.
export const VERDICT_ICON: Record<Verdict, string> = { below: '▼', within: '●', above: '▲' };
export const VERDICT_WORD: Record<Verdict, string> = { below: 'Below', within: 'Within', above: 'Above' };

export interface BandGaugeProps {
  step: Pick<MeasureStep, 'id' | 'bands' | 'quantity'>;
  /** The reading in the quantity's canonical unit; omit to draw the bands alone. */
  value?: number;
  /** An ohms reading over range ("OL", open circuit): no value, it falls in the band open above. */
  overRange?: boolean;
  /** The unit to show numbers in: the one the reading was entered in. */
  unit?: string;
  /** How the reading was written: its value is shown to that precision, ticks as fractions if it was one. */
  form?: EntryForm;
  /** What the reading is: "Preview" while typing, nothing once saved. */
  caption?: string;
}

function limitText(step: BandGaugeProps['step'], value: number, unit: string | undefined, opts: FormatOptions) {
  return formatReading(step.quantity, value, unit, opts);
}

function rangeText(step: BandGaugeProps['step'], band: { from?: number; to?: number }, unit: string | undefined, opts: FormatOptions) {
  const at = (v: number) => limitText(step, v, unit, opts);
  if (band.from === undefined && band.to !== undefined) return `under ${at(band.to)}`;
  if (band.to === undefined && band.from !== undefined) return `${at(band.from)} and up`;
  if (band.from !== undefined && band.to !== undefined) return `${at(band.from)} to ${at(band.to)}`;
  return 'any value';
}

/** The band an over-range reading falls in: the last one open towards +infinity. */
function overRangeMatch(bands: BandGaugeProps['step']['bands']) {
  const index = bands.findLastIndex((b) => b.to === undefined);
  return index === -1 ? null : { band: bands[index], index };
}

export function BandGauge({ step, value, overRange = false, unit, form, caption }: BandGaugeProps) {
  const scale = gaugeScale(step);
  const match = overRange ? overRangeMatch(step.bands) : value === undefined ? null : findBand(step.bands, value);
  const position = overRange ? 1 : value === undefined ? null : gaugePosition(scale, value);
  const offScale = overRange || (value !== undefined && (value < scale.min || value > scale.max));
  const ticks = [...new Set(step.bands.flatMap((b) => [b.from, b.to]).filter((v): v is number => v !== undefined))];
  const idBase = `g-${step.id}`;
  // Limits in the unit of the reading, as fractions when the reading was written as one.
  const limitOpts: FormatOptions = form && !form.fraction ? {} : { fraction: true };
  const shown = overRange
    ? OVER_RANGE_TEXT
    : value === undefined
      ? null
      : formatReading(step.quantity, value, unit, formatOptionsFor(form));
  const summary =
    match && shown
      ? `${caption ? `${caption}: ` : ''}${shown} — ${VERDICT_WORD[match.band.verdict]}: ${match.band.label} (${rangeText(step, match.band, unit, limitOpts)})`
      : `Bands: ${step.bands.map((b) => `${b.label} (${rangeText(step, b, unit, limitOpts)})`).join('; ')}`;

  return (
    <figure className="rounded-xl border border-line bg-raised p-3 sm:p-4" data-testid="band-gauge">
      {match && shown && (
        <p className="mb-2 flex flex-wrap items-baseline gap-x-3 gap-y-1" data-testid="gauge-verdict" data-verdict={match.band.verdict}>
          {caption && <span className="text-base font-semibold uppercase tracking-wide text-muted">{caption}</span>}
          <span className="font-mono text-2xl font-bold">{shown}</span>
          <span className="text-xl font-bold">
            <span aria-hidden className="mr-1">
              {VERDICT_ICON[match.band.verdict]}
            </span>
            {VERDICT_WORD[match.band.verdict]}
          </span>
          <span className="text-lg">— {match.band.label}</span>
        </p>
      )}
      <div className="relative mx-2 pb-7 pt-5" role="img" aria-labelledby={`${idBase}-desc`}>
        {/* Bars and marker stretch with the width; text sits on top in HTML so it never stretches. */}
        <svg viewBox="0 0 1000 40" preserveAspectRatio="none" className="block h-12 w-full" aria-hidden>
          <defs>
            <pattern id={`${idBase}-below`} width="12" height="12" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
              <rect width="12" height="12" className="fill-sunken" />
              <line x1="0" y1="0" x2="0" y2="12" className="stroke-muted" strokeWidth="5" />
            </pattern>
            <pattern id={`${idBase}-above`} width="12" height="12" patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
              <rect width="12" height="12" className="fill-sunken" />
              <line x1="0" y1="0" x2="0" y2="12" className="stroke-muted" strokeWidth="2" />
            </pattern>
          </defs>
          {scale.segments.map((s, i) => {
            const x = s.start * 1000;
            const w = Math.max(0, (s.end - s.start) * 1000);
            return (
              <rect
                key={i}
                data-band={i}
                x={x}
                y={1}
                width={w}
                height={38}
                fill={s.verdict === 'within' ? undefined : `url(#${idBase}-${s.verdict})`}
                className={clsx(s.verdict === 'within' && 'fill-copper-soft', 'stroke-ink')}
                strokeWidth={match?.index === i ? 4 : 1.5}
                vectorEffect="non-scaling-stroke"
              />
            );
          })}
        </svg>
        {scale.segments.map((s, i) =>
          s.end - s.start > 0.07 ? (
            <span
              key={i}
              aria-hidden
              className="pointer-events-none absolute top-5 flex h-12 -translate-x-1/2 items-center text-lg font-bold text-ink"
              style={{ left: `${((s.start + s.end) / 2) * 100}%` }}
            >
              {VERDICT_ICON[s.verdict]}
            </span>
          ) : null,
        )}
        {ticks.map((t) => (
          <span
            key={t}
            aria-hidden
            data-testid="gauge-tick"
            className="absolute bottom-0 -translate-x-1/2 whitespace-nowrap font-mono text-base leading-6 text-muted"
            style={{ left: `${gaugePosition(scale, t) * 100}%` }}
          >
            {limitText(step, t, unit, limitOpts).replace(/ [^ ]+$/, '')}
          </span>
        ))}
        {position !== null && (
          <span
            data-testid="gauge-marker"
            data-position={position.toFixed(3)}
            aria-hidden
            className="absolute top-0 flex -translate-x-1/2 flex-col items-center"
            style={{ left: `${position * 100}%` }}
          >
            <span className="text-base leading-5 text-ink">▼</span>
            <span className="h-12 w-1.5 rounded-sm bg-ink ring-2 ring-raised" />
          </span>
        )}
      </div>
      <figcaption id={`${idBase}-desc`} className="sr-only">
        {summary}
        {offScale ? ' (beyond the end of the scale)' : ''}
      </figcaption>
      <ol className="mt-2 grid gap-1 text-base sm:grid-cols-2" aria-label="Bands">
        {step.bands.map((b, i) => (
          <li
            key={i}
            className={clsx(
              'flex items-baseline gap-2 rounded px-2 py-1',
              match?.index === i ? 'bg-sunken font-bold ring-2 ring-ink' : 'text-muted',
            )}
          >
            <span aria-hidden>{VERDICT_ICON[b.verdict]}</span>
            <span>
              {b.label} <span className="whitespace-nowrap font-mono">({rangeText(step, b, unit, limitOpts)})</span>
              {match?.index === i && <span className="sr-only"> — this reading</span>}
            </span>
          </li>
        ))}
      </ol>
    </figure>
  );
}
