import { describe, expect, it } from 'vitest';
import { formatClock, safetyLapses, scoreAttempt, SCORING, type PracticeEvent } from '@/lib/practice/scoring';

const right = { id: 'f-dirty-flame-rod', title: 'Dirty flame rod' };
const wrong = { id: 'f-open-high-limit', title: 'High limit open' };

// Turning the power off and proving the line side dead before a lead is broken for a meter in series
// is lockout practice (OSHA 29 CFR 1910.147; "live, dead, live" per NFPA 70E Article 120, from memory
// for the section number); microamps are read in series in the flame-rod or ground lead (TRADE.md,
// common practice, no source).
const safeSeries: PracticeEvent[] = [
  { kind: 'action', time: 0, action: 'power-off' },
  { kind: 'measure', time: 5, mode: 'vac', a: 'line-hot', b: 'line-neutral', value: 0.1 },
  { kind: 'action', time: 10, action: 'power-on' },
  { kind: 'action', time: 12, action: 'call-for-heat' },
  { kind: 'measure', time: 40, mode: 'udc', series: 'flame-rod-lead', value: 0.6 },
];

describe('safety lapses', () => {
  it('accepts a meter put in series after power off and a dead reading on the line side', () => {
    expect(safetyLapses(safeSeries)).toEqual([]);
  });

  it('flags a meter put in series with no power-off check', () => {
    const events: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-on' },
      { kind: 'action', time: 2, action: 'call-for-heat' },
      { kind: 'measure', time: 30, mode: 'udc', series: 'flame-rod-lead', value: 0.6 },
    ];
    const lapses = safetyLapses(events);
    expect(lapses).toHaveLength(1);
    expect(lapses[0]).toMatch(/series in flame-rod-lead/);
  });

  it('does not count a reading taken with the power still on as verifying it dead', () => {
    const events: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-on' },
      { kind: 'measure', time: 5, mode: 'vac', a: 'line-hot', b: 'line-neutral', value: 0.2 },
      { kind: 'measure', time: 30, mode: 'udc', series: 'ground-lead', value: 3 },
    ];
    expect(safetyLapses(events)).toHaveLength(1);
  });

  it('does not count a live reading after power off as verifying it dead', () => {
    const events: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-off' },
      { kind: 'measure', time: 5, mode: 'vac', a: 'line-hot', b: 'line-neutral', value: 119.8 },
      { kind: 'action', time: 6, action: 'power-on' },
      { kind: 'measure', time: 30, mode: 'udc', series: 'ground-lead', value: 3 },
    ];
    expect(safetyLapses(events)).toHaveLength(1);
  });

  it('needs a new check when the meter moves to the other lead, none for more readings in the same lead', () => {
    const events: PracticeEvent[] = [
      ...safeSeries,
      { kind: 'measure', time: 45, mode: 'udc', series: 'flame-rod-lead', value: 0.7 },
      { kind: 'measure', time: 50, mode: 'udc', series: 'ground-lead', value: 0.7 },
    ];
    const lapses = safetyLapses(events);
    expect(lapses).toHaveLength(1);
    expect(lapses[0]).toMatch(/ground-lead/);
  });

  it('flags an ohmmeter on a rod with the power on, not one on the transformer', () => {
    const events: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-on' },
      { kind: 'measure', time: 5, mode: 'ohm', a: 'xfmr-hot', b: 'xfmr-common', value: 1.2 },
      { kind: 'measure', time: 9, mode: 'ohm', a: 'flame-rod', b: 'burner', value: null },
    ];
    const lapses = safetyLapses(events);
    expect(lapses).toHaveLength(1);
    expect(lapses[0]).toMatch(/flame-rod–burner/);
  });

  it('flags a lead disconnected for its resistance or a rod taken out for a look with the power on, not after a verified power-off', () => {
    const live: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-on' },
      { kind: 'measure', time: 5, mode: 'ohm', lead: 'spark-lead', value: 900 },
      { kind: 'observe', time: 9, what: 'flame-rod', result: 'dirty' },
      // Watching the flame with the power on handles nothing.
      { kind: 'observe', time: 12, what: 'flame', result: 'all-burners' },
    ];
    expect(safetyLapses(live)).toHaveLength(2);
    const dead: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-off' },
      { kind: 'measure', time: 3, mode: 'vac', a: 'line-hot', b: 'line-neutral', value: 0 },
      { kind: 'measure', time: 5, mode: 'ohm', lead: 'spark-lead', value: 900 },
      { kind: 'observe', time: 9, what: 'flame-rod', result: 'dirty' },
    ];
    expect(safetyLapses(dead)).toEqual([]);
  });

  // A manual-reset rollout trip is a sign of a combustion hazard: find the cause first (TRADE.md, common practice, no source).
  it('flags a rollout reset', () => {
    const lapses = safetyLapses([{ kind: 'action', time: 75, action: 'reset-rollout' }]);
    expect(lapses).toHaveLength(1);
    expect(lapses[0]).toMatch(/1:15/);
  });
});

describe('scoreAttempt', () => {
  it('gives full marks to the right finding on the shortest path, safely, in time', () => {
    const score = scoreAttempt({ events: safeSeries, chosenFinding: right, expectedFindings: [right], shortest: 2, seconds: 300 });
    expect(score.total).toBe(100);
    expect(score.max).toBe(100);
    expect(score.lines.map((l) => l.key)).toEqual(['finding', 'path', 'safety', 'time']);
    expect(score.lines.every((l) => l.detail.length > 10)).toBe(true);
  });

  it('explains each deduction line by line', () => {
    const events: PracticeEvent[] = [
      { kind: 'action', time: 0, action: 'power-on' },
      { kind: 'measure', time: 1, mode: 'vac', a: 'line-hot', b: 'line-neutral', value: 120 },
      { kind: 'measure', time: 2, mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common', value: 24 },
      { kind: 'observe', time: 3, what: 'spark', result: 'at-gap' },
      { kind: 'measure', time: 30, mode: 'udc', series: 'flame-rod-lead', value: 0.6 },
      { kind: 'action', time: 40, action: 'reset-rollout' },
    ];
    const score = scoreAttempt({ events, chosenFinding: wrong, expectedFindings: [right], shortest: 2, seconds: 20 * 60 });
    const byKey = Object.fromEntries(score.lines.map((l) => [l.key, l]));
    expect(byKey.finding.points).toBe(0);
    expect(byKey.finding.detail).toContain('Dirty flame rod');
    expect(score.measurements).toBe(4);
    expect(byKey.path.points).toBe(SCORING.path - 2 * SCORING.pathPerExtra);
    expect(byKey.path.detail).toContain('2 extra readings');
    expect(byKey.safety.points).toBe(0);
    expect(score.safetyLapses).toHaveLength(2);
    // 20 min is half way between full points at 10 and none at 30.
    expect(byKey.time.points).toBe(5);
    expect(score.total).toBe(0 + 16 + 0 + 5);
  });

  it('counts any of the findings that isolate the fault as right', () => {
    const score = scoreAttempt({ events: [], chosenFinding: wrong, expectedFindings: [right, wrong], shortest: 0, seconds: 60 });
    expect(score.lines[0].points).toBe(SCORING.finding);
    const none = scoreAttempt({ events: [], chosenFinding: wrong, expectedFindings: [], shortest: 0, seconds: 60 });
    expect(none.lines[0].points).toBe(0);
  });

  it('never goes below zero on a line', () => {
    const many: PracticeEvent[] = Array.from({ length: 40 }, (_, i) => ({ kind: 'observe', time: i, what: 'flame', result: 'none' }));
    const score = scoreAttempt({ events: many, chosenFinding: right, expectedFindings: [right], shortest: 3, seconds: 3600 });
    expect(score.lines.find((l) => l.key === 'path')?.points).toBe(0);
    expect(score.lines.find((l) => l.key === 'time')?.points).toBe(0);
    expect(score.total).toBe(SCORING.finding + SCORING.safety);
  });

  it('prints the clock as minutes and seconds', () => {
    expect(formatClock(0)).toBe('0:00');
    expect(formatClock(75.4)).toBe('1:15');
    expect(formatClock(3601)).toBe('60:01');
  });
});
