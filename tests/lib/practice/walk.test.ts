import { probeText, readingAnswers, sameReading } from '@/lib/practice/walk';
import type { MeasureStep } from '@/lib/trees/schema';
import { PROBED_VERSION } from '@/tests/lib/practice/walk-fixture';

const secondary = PROBED_VERSION.graph.steps.find((s) => s.id === 'secondary') as MeasureStep;

describe('which bench reading answers a measure step', () => {
  it('takes the meter on the probe’s two points, in either order, on the step’s function only', () => {
    expect(readingAnswers(secondary, { mode: 'vac', a: 'xfmr-hot', b: 'xfmr-common' })).toBe(true);
    expect(readingAnswers(secondary, { mode: 'vac', a: 'xfmr-common', b: 'xfmr-hot' })).toBe(true);
    expect(readingAnswers(secondary, { mode: 'vdc', a: 'xfmr-hot', b: 'xfmr-common' })).toBe(false);
    expect(readingAnswers(secondary, { mode: 'vac', a: 'xfmr-hot', b: 'chassis' })).toBe(false);
  });

  it('matches a series, lead or gauge probe by its own kind, and without a probe any reading on the function', () => {
    const ua = { quantity: 'udc', probe: { series: 'flame-rod-lead' } } as const;
    expect(readingAnswers(ua, { mode: 'udc', series: 'flame-rod-lead' })).toBe(true);
    expect(readingAnswers(ua, { mode: 'udc', series: 'ground-lead' })).toBe(false);
    const lead = { quantity: 'ohm', probe: { lead: 'spark-lead' } } as const;
    expect(readingAnswers(lead, { mode: 'ohm', lead: 'spark-lead' })).toBe(true);
    expect(readingAnswers(lead, { mode: 'ohm', a: 'spark-rod', b: 'burner' })).toBe(false);
    const gap = { quantity: 'length', probe: { gauge: 'spark-gap' } } as const;
    expect(readingAnswers(gap, { mode: 'gauge', gauge: 'spark-gap' })).toBe(true);
    expect(readingAnswers(gap, { mode: 'gauge', gauge: 'inlet-pressure' })).toBe(false);
    expect(readingAnswers({ quantity: 'vac' }, { mode: 'vac', a: 'line-hot', b: 'line-neutral' })).toBe(true);
    expect(readingAnswers({ quantity: 'pressure' }, { mode: 'vac', a: 'line-hot', b: 'line-neutral' })).toBe(false);
  });

  it('compares an entry with the display: its last digit or half a percent, OL only with OL', () => {
    expect(sameReading(24.3, 24.3)).toBe(true);
    expect(sameReading(24.31, 24.3)).toBe(true);
    expect(sameReading(24.5, 24.3)).toBe(false);
    // A kilo-ohm display read back as "1.23 k": within half a percent of 1234 Ω.
    expect(sameReading(1230, 1234)).toBe(true);
    expect(sameReading(1200, 1234)).toBe(false);
    expect(sameReading(Number.POSITIVE_INFINITY, null)).toBe(true);
    expect(sameReading(0, null)).toBe(false);
    expect(sameReading(Number.POSITIVE_INFINITY, 5)).toBe(false);
  });

  it('says where to measure and when', () => {
    expect(probeText(secondary)).toBe('V AC across xfmr-hot and xfmr-common');
    expect(probeText({ quantity: 'udc', probe: { series: 'flame-rod-lead' }, at: 'after-proving' })).toBe(
      'µA DC with the meter in series in the flame-rod-lead once the flame is proven and the burners run',
    );
  });
});
