'use client';

import clsx from 'clsx';
import type { KeyboardEvent } from 'react';
import type { UnitProfile } from '@/lib/validations/practice';

// The bench's circuit, drawn for this app: the line side and the 24 V transformer on the left, the
// safety circuit along the top into the control's thermostat input, the control's outputs (inducer,
// pressure switch, gas valve) on its left, the rods and burner under it, and the 24 V common along
// the bottom. Every test point is a button; the two series points break a lead for a meter in series.

export interface PointPlace {
  id: string;
  x: number;
  y: number;
  /** Where the label goes from the point. */
  label: 'above' | 'below' | 'left' | 'right';
  /** Only on some units. */
  when?: (unit: UnitProfile) => boolean;
}

const induced = (u: UnitProfile) => u.draft === 'induced';
const twoRod = (u: UnitProfile) => u.ignition === 'two-rod';

export const TEST_POINTS: readonly PointPlace[] = [
  { id: 'line-hot', x: 60, y: 70, label: 'above' },
  { id: 'line-neutral', x: 60, y: 170, label: 'below' },
  { id: 'line-ground', x: 60, y: 270, label: 'below' },
  { id: 'chassis', x: 160, y: 300, label: 'right' },
  { id: 'xfmr-hot', x: 320, y: 70, label: 'below' },
  { id: 'xfmr-common', x: 320, y: 190, label: 'right' },
  { id: 'fuse-out', x: 450, y: 70, label: 'below' },
  { id: 'stat-w', x: 570, y: 70, label: 'below' },
  { id: 'limit-out', x: 690, y: 70, label: 'below' },
  { id: 'rollout-out', x: 820, y: 70, label: 'below' },
  { id: 'control-common', x: 770, y: 620, label: 'left' },
  { id: 'inducer-hot', x: 690, y: 180, label: 'above', when: induced },
  { id: 'ps-in', x: 690, y: 262, label: 'below', when: induced },
  { id: 'ps-out', x: 560, y: 262, label: 'below', when: induced },
  { id: 'valve-hot', x: 610, y: 380, label: 'above' },
  { id: 'valve-out', x: 740, y: 380, label: 'above' },
  { id: 'valve-common', x: 520, y: 480, label: 'right' },
  { id: 'flame-test-plus', x: 780, y: 205, label: 'right' },
  { id: 'flame-test-minus', x: 780, y: 290, label: 'right' },
  { id: 'spark-rod', x: 830, y: 560, label: 'below' },
  { id: 'flame-rod', x: 950, y: 560, label: 'below', when: twoRod },
  { id: 'burner', x: 1040, y: 630, label: 'below' },
  { id: 'ground-lead', x: 1120, y: 380, label: 'left' },
];

/** Where a lead can be broken for the meter in series (DC microamps). `ground-lead` is also a test point. */
export const SERIES_PLACES: readonly PointPlace[] = [{ id: 'flame-rod-lead', x: 950, y: 480, label: 'right', when: twoRod }];

/**
 * The drawing's size and the hit area of a test point: drawn at least 704 px wide (44rem), a hit
 * area of radius 40 is at least 48 px across; no two points are closer than two radii.
 */
const WIDTH = 1160;
const HEIGHT = 730;
const HIT_RADIUS = 40;

export type LeadRole = 'plus' | 'common' | 'series';

interface Props {
  unit: UnitProfile;
  /** µA DC: taps choose a lead to break instead of two test points. */
  series: boolean;
  leads: { plus: string | null; common: string | null; series: string | null };
  disabled?: boolean;
  onTap: (pointId: string) => void;
}

const LABEL_OFFSET: Record<PointPlace['label'], { dx: number; dy: number; anchor: 'start' | 'middle' | 'end' }> = {
  above: { dx: 0, dy: -24, anchor: 'middle' },
  below: { dx: 0, dy: 36, anchor: 'middle' },
  left: { dx: -22, dy: 6, anchor: 'end' },
  right: { dx: 22, dy: 6, anchor: 'start' },
};

function Wire({ d, dashed, thick }: { d: string; dashed?: boolean; thick?: boolean }) {
  return <path d={d} fill="none" className="stroke-ink" strokeWidth={thick ? 5 : 3} strokeDasharray={dashed ? '10 8' : undefined} />;
}

/** A switch contact drawn between two x positions on a horizontal wire. */
function Contact({ x1, x2, y, label, sub }: { x1: number; x2: number; y: number; label: string; sub?: string }) {
  return (
    <g>
      <circle cx={x1} cy={y} r={4} className="fill-ink" />
      <circle cx={x2} cy={y} r={4} className="fill-ink" />
      <path d={`M${x1} ${y} L${x2 - 4} ${y - 16}`} className="stroke-ink" strokeWidth={3} />
      <text x={(x1 + x2) / 2} y={y - 26} textAnchor="middle" className="fill-muted text-[15px] font-semibold">
        {label}
      </text>
      {sub && (
        <text x={(x1 + x2) / 2} y={y - 44} textAnchor="middle" className="fill-muted text-[13px]">
          {sub}
        </text>
      )}
    </g>
  );
}

function GroundSymbol({ x, y }: { x: number; y: number }) {
  return (
    <g className="stroke-ink" strokeWidth={3}>
      <path
        d={`M${x} ${y} L${x} ${y + 12} M${x - 14} ${y + 12} L${x + 14} ${y + 12} M${x - 9} ${y + 18} L${x + 9} ${y + 18} M${x - 4} ${y + 24} L${x + 4} ${y + 24}`}
      />
    </g>
  );
}

export function BenchSchematic({ unit, series, leads, disabled, onTap }: Props) {
  const points = TEST_POINTS.filter((p) => !p.when || p.when(unit));
  const seriesPlaces = SERIES_PLACES.filter((p) => !p.when || p.when(unit));
  const roleOf = (id: string): LeadRole | null =>
    series ? (leads.series === id ? 'series' : null) : leads.plus === id ? 'plus' : leads.common === id ? 'common' : null;

  const onKey = (id: string) => (e: KeyboardEvent) => {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      if (!disabled) onTap(id);
    }
  };

  const renderPoint = (p: PointPlace, kind: 'point' | 'break') => {
    const role = roleOf(p.id);
    const tappable = series ? kind === 'break' || p.id === 'ground-lead' : kind === 'point';
    const off = LABEL_OFFSET[p.label];
    const name = kind === 'break' ? `${p.id} (break the lead here)` : p.id;
    const state =
      role === 'plus' ? ', V+ lead here' : role === 'common' ? ', COM lead here' : role === 'series' ? ', meter in series here' : '';
    return (
      <g
        key={`${kind}-${p.id}`}
        role="button"
        tabIndex={tappable && !disabled ? 0 : -1}
        aria-label={`${name}${state}`}
        aria-disabled={!tappable || disabled}
        data-point={p.id}
        onClick={() => tappable && !disabled && onTap(p.id)}
        onKeyDown={onKey(p.id)}
        className={clsx('outline-none [&:focus-visible>.ring]:stroke-copper', tappable && !disabled ? 'cursor-pointer' : 'opacity-40')}
      >
        {/* The hit area: at least 48 px across however narrow the screen (see HIT_RADIUS). */}
        <circle cx={p.x} cy={p.y} r={HIT_RADIUS} fill="transparent" />
        <circle className="ring" cx={p.x} cy={p.y} r={20} fill="none" strokeWidth={4} stroke="transparent" />
        {kind === 'break' ? (
          <path
            d={`M${p.x - 12} ${p.y - 12} L${p.x + 12} ${p.y + 12} M${p.x + 12} ${p.y - 12} L${p.x - 12} ${p.y + 12}`}
            className="stroke-ink"
            strokeWidth={4}
          />
        ) : (
          <circle cx={p.x} cy={p.y} r={11} className={clsx('stroke-ink', role ? 'fill-copper' : 'fill-raised')} strokeWidth={3} />
        )}
        {role && (
          <g>
            <circle cx={p.x} cy={p.y} r={20} fill="none" className={role === 'common' ? 'stroke-ink' : 'stroke-copper'} strokeWidth={5} />
            <rect
              x={p.x > WIDTH - 80 ? p.x - 66 : p.x + 14}
              // Clear of the point's own label: below it when the label is above.
              y={p.label === 'above' ? p.y + 16 : p.y - 40}
              width={role === 'series' ? 46 : 52}
              height={24}
              rx={6}
              className={role === 'common' ? 'fill-ink' : 'fill-copper'}
            />
            <text
              x={p.x > WIDTH - 80 ? p.x - 40 : p.x + 40}
              y={p.label === 'above' ? p.y + 33 : p.y - 23}
              textAnchor="middle"
              className={clsx('text-[14px] font-bold', role === 'common' ? 'fill-surface' : 'fill-copper-ink')}
            >
              {role === 'plus' ? 'V+' : role === 'common' ? 'COM' : 'µA'}
            </text>
          </g>
        )}
        <text x={p.x + off.dx} y={p.y + off.dy} textAnchor={off.anchor} className="fill-ink font-mono text-[15px]">
          {p.id}
        </text>
      </g>
    );
  };

  return (
    // Narrower than 44rem (a phone) the drawing scrolls sideways rather than shrink its test points under a fingertip.
    <div className="overflow-x-auto rounded-lg border border-line bg-surface" data-testid="bench-schematic-frame">
      <p className="px-3 pt-2 text-base text-muted sm:hidden">Scroll sideways for the whole circuit.</p>
      <svg
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        className="h-auto w-full min-w-[44rem] select-none"
        role="group"
        aria-label={series ? 'Schematic: tap a lead to break for the meter in series' : 'Schematic: tap a test point for each meter lead'}
        data-testid="bench-schematic"
      >
        {/* Line side */}
        <text x={140} y={40} className="fill-muted text-[15px] font-semibold">
          Line 120 VAC
        </text>
        <Wire d="M60 70 L230 70 L230 85" />
        <Wire d="M60 170 L230 170 L230 155" />
        <Wire d="M60 270 L160 270 L160 300" />
        <GroundSymbol x={160} y={318} />
        {/* Transformer */}
        <path d="M230 85 q-18 10 0 20 q-18 10 0 20 q-18 10 0 20 q-18 10 0 10" fill="none" className="stroke-ink" strokeWidth={3} />
        <path d="M245 85 L245 155 M253 85 L253 155" className="stroke-ink" strokeWidth={2} />
        <path d="M270 85 q18 10 0 20 q18 10 0 20 q18 10 0 20 q18 10 0 10" fill="none" className="stroke-ink" strokeWidth={3} />
        <text x={250} y={215} textAnchor="middle" className="fill-muted text-[14px] font-semibold">
          transformer
        </text>
        <text x={250} y={233} textAnchor="middle" className="fill-muted text-[13px]">
          24 VAC
        </text>
        <Wire d="M270 85 L270 70 L320 70" />
        <Wire d="M270 155 L270 190 L320 190 L320 700 L770 700 L770 420" />
        {/* Fuse, thermostat, high limit, rollout */}
        <Wire d="M320 70 L365 70 M415 70 L480 70 M540 70 L600 70 M660 70 L720 70 M780 70 L880 70 L880 150" />
        <rect x={365} y={60} width={50} height={20} rx={4} className="fill-raised stroke-ink" strokeWidth={3} />
        <path d="M365 70 L415 70" className="stroke-ink" strokeWidth={2} />
        <text x={390} y={44} textAnchor="middle" className="fill-muted text-[15px] font-semibold">
          fuse
        </text>
        <Contact x1={484} x2={536} y={70} label="R–W" sub="thermostat" />
        <Contact x1={604} x2={656} y={70} label="high limit" />
        <Contact x1={724} x2={776} y={70} label="rollout" />
        {/* The control */}
        <rect x={740} y={150} width={220} height={270} rx={10} className="fill-raised stroke-ink" strokeWidth={3} />
        <text x={875} y={255} textAnchor="middle" className="fill-ink text-[17px] font-bold">
          ignition control
        </text>
        <text x={880} y={172} textAnchor="middle" className="fill-muted text-[13px]">
          TH
        </text>
        <text x={770} y={412} textAnchor="middle" className="fill-muted text-[13px]">
          TR
        </text>
        <text x={948} y={320} textAnchor="end" className="fill-muted text-[13px]">
          GND
        </text>
        <text x={760} y={180} className="fill-muted text-[13px]">
          flame test
        </text>
        {unit.controlSupply === 'line' && (
          <g>
            <Wire d="M120 70 L120 10 L1000 10 L1000 200 L960 200" dashed />
            <text x={1012} y={110} className="fill-muted text-[13px]">
              line-powered
            </text>
            <text x={1012} y={128} className="fill-muted text-[13px]">
              control
            </text>
          </g>
        )}
        {/* Inducer and pressure switch */}
        {induced(unit) && (
          <g>
            <Wire d="M740 180 L616 180 M564 180 L450 180 L450 700" />
            <circle cx={590} cy={180} r={26} className="fill-raised stroke-ink" strokeWidth={3} />
            <text x={590} y={186} textAnchor="middle" className="fill-ink text-[15px] font-bold">
              M
            </text>
            <text x={590} y={142} textAnchor="middle" className="fill-muted text-[14px] font-semibold">
              inducer
            </text>
            <Wire d="M740 262 L654 262 M606 262 L560 262 L515 262 L515 312 L740 312" />
            <Contact x1={606} x2={654} y={262} label="pressure sw." />
          </g>
        )}
        {/* Gas valve */}
        <Wire d="M740 380 L560 380" />
        <rect x={480} y={355} width={80} height={55} rx={6} className="fill-raised stroke-ink" strokeWidth={3} />
        <text x={520} y={388} textAnchor="middle" className="fill-ink text-[14px] font-bold">
          valve
        </text>
        <Wire d="M520 410 L520 700" />
        {/* Rods and burner */}
        <Wire d="M830 420 L830 549" thick />
        <text x={842} y={455} className="fill-muted text-[12px]">
          spark lead
        </text>
        {twoRod(unit) && <Wire d="M950 420 L950 549" />}
        <rect x={800} y={622} width={220} height={16} rx={4} className="fill-raised stroke-ink" strokeWidth={3} />
        <Wire d="M960 300 L1120 300 L1120 630 L1020 630" />
        <GroundSymbol x={910} y={638} />
        <text x={20} y={718} className="fill-muted text-[13px]">
          24 V common
        </text>
        {points.map((p) => renderPoint(p, 'point'))}
        {seriesPlaces.map((p) => renderPoint(p, 'break'))}
      </svg>
    </div>
  );
}
