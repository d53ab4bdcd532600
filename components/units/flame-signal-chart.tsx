'use client';

import { useMemo } from 'react';
import { CartesianGrid, Legend, Line, LineChart, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatDate } from '@/components/calls/format';
import { useTimeZone } from '@/components/ui/time-zone';
import { lowLimitOf, summarizeFlame, timeAxis, type FlameBand, type FlamePoint } from '@/components/units/flame-summary';

const INK = 'rgb(var(--ink))';
const MUTED = 'rgb(var(--muted))';
const LINE = 'rgb(var(--line))';
const COPPER = 'rgb(var(--copper))';

interface Props {
  diagnosis: FlamePoint[];
  afterRepair: FlamePoint[];
  bands: FlameBand[];
}

/** The flame signal across visits: the fouling trend of a rod reads as a falling line towards the low band. */
export function FlameSignalChart({ diagnosis, afterRepair, bands }: Props) {
  const timeZone = useTimeZone();
  const low = lowLimitOf(bands);
  const summary = summarizeFlame(diagnosis, afterRepair, low, timeZone);
  const toPoints = (list: FlamePoint[]) => list.map((p) => ({ t: Date.parse(p.at), value: p.value })).sort((a, b) => a.t - b.t);
  const during = useMemo(() => toPoints(diagnosis), [diagnosis]);
  const after = useMemo(() => toPoints(afterRepair), [afterRepair]);
  const all = [...during, ...after];
  const axis = timeAxis(
    all.map((p) => p.t),
    timeZone,
  );
  const yMax = Math.max(6, Math.ceil(Math.max(...all.map((p) => p.value), 0) + 1));

  return (
    <figure className="space-y-3" aria-labelledby="flame-caption">
      <figcaption id="flame-caption" className="sr-only">
        Flame signal in DC microamps across visits
      </figcaption>
      <p className="text-base" id="flame-summary">
        {summary}
      </p>
      {axis && (
        <div className="h-72 w-full sm:h-80" aria-hidden>
          <ResponsiveContainer width="100%" height="100%">
            <LineChart margin={{ top: 12, right: 16, bottom: 4, left: 0 }}>
              <CartesianGrid stroke={LINE} strokeDasharray="3 3" />
              {low !== null && (
                <ReferenceArea
                  y1={0}
                  y2={low}
                  fill={MUTED}
                  fillOpacity={0.15}
                  stroke="none"
                  label={{ value: `Getting low: below ${low} µA`, position: 'insideBottomLeft', fill: INK, fontSize: 13 }}
                />
              )}
              {low !== null && <ReferenceLine y={low} stroke={INK} strokeDasharray="6 4" />}
              <XAxis
                type="number"
                dataKey="t"
                domain={axis.domain}
                ticks={axis.ticks}
                tickFormatter={axis.label}
                stroke={MUTED}
                tick={{ fill: INK, fontSize: 13 }}
                allowDuplicatedCategory={false}
              />
              <YAxis
                type="number"
                domain={[0, yMax]}
                stroke={MUTED}
                tick={{ fill: INK, fontSize: 13 }}
                width={48}
                label={{ value: 'µA', angle: -90, position: 'insideLeft', fill: INK, fontSize: 13 }}
              />
              <Tooltip
                labelFormatter={(t) => formatDate(Number(t), timeZone)}
                formatter={(v) => [`${v} µA`]}
                contentStyle={{ background: 'rgb(var(--raised))', borderColor: LINE, color: INK }}
              />
              <Legend wrapperStyle={{ color: INK }} />
              <Line
                name="During diagnosis"
                data={during}
                dataKey="value"
                type="linear"
                stroke={COPPER}
                strokeWidth={3}
                dot={{ r: 5, fill: COPPER, stroke: COPPER }}
                legendType="circle"
                isAnimationActive={false}
              />
              <Line
                name="After repair"
                data={after}
                dataKey="value"
                type="linear"
                stroke={INK}
                strokeWidth={2}
                strokeDasharray="4 4"
                dot={(props: { cx?: number; cy?: number; index?: number }) => (
                  <rect key={`after-${props.index}`} x={(props.cx ?? 0) - 5} y={(props.cy ?? 0) - 5} width={10} height={10} fill={INK} />
                )}
                legendType="square"
                isAnimationActive={false}
              />
            </LineChart>
          </ResponsiveContainer>
        </div>
      )}
      {axis && (
        <details className="rounded-lg border border-line bg-surface p-3">
          <summary className="min-h-touch cursor-pointer content-center font-semibold">Values as a table</summary>
          <table className="mt-2 w-full text-left">
            <caption className="sr-only">Flame signal readings</caption>
            <thead className="text-sm text-muted">
              <tr>
                <th scope="col" className="py-1 pr-3">
                  Date
                </th>
                <th scope="col" className="py-1 pr-3">
                  When
                </th>
                <th scope="col" className="py-1">
                  Flame signal
                </th>
              </tr>
            </thead>
            <tbody>
              {[...during.map((p) => ({ ...p, kind: 'During diagnosis' })), ...after.map((p) => ({ ...p, kind: 'After repair' }))]
                .sort((a, b) => a.t - b.t)
                .map((p, i) => (
                  <tr key={i} className="border-t border-line">
                    <td className="py-1 pr-3">{formatDate(p.t, timeZone)}</td>
                    <td className="py-1 pr-3">{p.kind}</td>
                    <td className="py-1 font-mono">
                      {p.value} µA{low !== null && p.value < low ? ' ▼ low' : ''}
                    </td>
                  </tr>
                ))}
            </tbody>
          </table>
        </details>
      )}
    </figure>
  );
}
