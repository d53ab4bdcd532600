'use client';

import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { AttemptRow } from '@/lib/validations/practice';

const INK = 'rgb(var(--ink))';
const MUTED = 'rgb(var(--muted))';
const LINE = 'rgb(var(--line))';
const COPPER = 'rgb(var(--copper))';

/** Finished attempts in order: score (percent) and minutes per attempt, two lines told apart by dash and marker. */
export function progressPoints(rows: readonly AttemptRow[]) {
  return rows
    .filter((r) => r.finishedAt !== null && r.total !== null && r.max)
    .sort((a, b) => Date.parse(a.finishedAt!) - Date.parse(b.finishedAt!))
    .map((r, i) => ({
      n: i + 1,
      score: Math.round((r.total! / r.max!) * 100),
      minutes: Math.round(((r.seconds ?? 0) / 60) * 10) / 10,
      title: r.scenarioTitle,
    }));
}

export function ProgressChart({ rows }: { rows: readonly AttemptRow[] }) {
  const points = progressPoints(rows);
  if (points.length === 0) return <p className="text-muted">No finished attempt yet: the plot starts with the first score.</p>;
  return (
    <figure className="space-y-2">
      <figcaption className="text-base">
        Score and time over {points.length} finished attempt{points.length === 1 ? '' : 's'}; latest {points.at(-1)!.score} % in{' '}
        {points.at(-1)!.minutes} min.
      </figcaption>
      <div className="h-72 w-full" aria-hidden data-testid="progress-chart">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={points} margin={{ top: 12, right: 16, bottom: 4, left: 0 }}>
            <CartesianGrid stroke={LINE} strokeDasharray="3 3" />
            <XAxis
              dataKey="n"
              stroke={MUTED}
              tick={{ fill: INK, fontSize: 13 }}
              label={{ value: 'attempt', position: 'insideBottomRight', offset: -2, fill: INK, fontSize: 13 }}
            />
            <YAxis
              yAxisId="score"
              domain={[0, 100]}
              stroke={MUTED}
              tick={{ fill: INK, fontSize: 13 }}
              width={44}
              label={{ value: '%', angle: -90, position: 'insideLeft', fill: INK }}
            />
            <YAxis
              yAxisId="time"
              orientation="right"
              stroke={MUTED}
              tick={{ fill: INK, fontSize: 13 }}
              width={44}
              label={{ value: 'min', angle: 90, position: 'insideRight', fill: INK }}
            />
            <Tooltip contentStyle={{ background: 'rgb(var(--raised))', borderColor: LINE, color: INK }} />
            <Legend wrapperStyle={{ color: INK }} />
            <Line
              yAxisId="score"
              name="Score %"
              dataKey="score"
              stroke={COPPER}
              strokeWidth={3}
              dot={{ r: 5, fill: COPPER }}
              isAnimationActive={false}
            />
            <Line
              yAxisId="time"
              name="Minutes"
              dataKey="minutes"
              stroke={INK}
              strokeWidth={2}
              strokeDasharray="5 4"
              dot={{ r: 4, fill: INK }}
              legendType="square"
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <details className="rounded-lg border border-line bg-surface p-3">
        <summary className="min-h-touch cursor-pointer content-center font-semibold">Values as a table</summary>
        <table className="mt-2 w-full text-left">
          <thead className="text-sm text-muted">
            <tr>
              <th scope="col">#</th>
              <th scope="col">Scenario</th>
              <th scope="col">Score</th>
              <th scope="col">Minutes</th>
            </tr>
          </thead>
          <tbody>
            {points.map((p) => (
              <tr key={p.n} className="border-t border-line">
                <td className="font-mono">{p.n}</td>
                <td>{p.title}</td>
                <td className="font-mono">{p.score} %</td>
                <td className="font-mono">{p.minutes}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}
