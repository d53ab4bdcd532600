import { checkBandCoverage, evaluateReading, findBand, gaugeScale, latestReadings } from '@/lib/bands';
import { measureStepSchema, type Band, type MeasureStep } from '@/lib/trees/schema';

const flame: MeasureStep = measureStepSchema.parse({
  id: 'flame',
  kind: 'measure',
  title: 'Flame signal',
  energy: 'energized',
  quantity: 'udc',
  points: ['a', 'b'],
  // Common practice, no source (TRADE.md): a few µA is good, below about 2 µA is getting low.
  bands: [
    { to: 0.1, label: 'none', verdict: 'below', outcome: 'none' },
    { from: 0.1, to: 2, label: 'low', verdict: 'below', outcome: 'low' },
    { from: 2, label: 'good', verdict: 'within', outcome: 'good' },
  ],
});

const volts: MeasureStep = measureStepSchema.parse({
  id: 'secondary',
  kind: 'measure',
  title: '24 V',
  energy: 'energized',
  quantity: 'vac',
  points: ['R', 'C'],
  bands: [
    { to: 18, label: 'low', verdict: 'below', outcome: 'low' },
    { from: 18, to: 30, label: 'ok', verdict: 'within', outcome: 'ok' },
    { from: 30, label: 'high', verdict: 'above', outcome: 'high' },
  ],
});

describe('findBand', () => {
  it('treats from as inclusive and to as exclusive', () => {
    expect(findBand(flame.bands, 2)?.index).toBe(2);
    expect(findBand(flame.bands, 1.999)?.index).toBe(1);
    expect(findBand(flame.bands, 0.1)?.index).toBe(1);
    expect(findBand(flame.bands, 0.0999)?.index).toBe(0);
  });

  it('opens missing limits to infinity', () => {
    expect(findBand(flame.bands, -5)?.index).toBe(0);
    expect(findBand(flame.bands, 1e9)?.index).toBe(2);
  });

  it('finds nothing for a gap or a non-finite value', () => {
    const gappy: Band[] = [
      { to: 1, label: 'a', verdict: 'below', outcome: 'x' },
      { from: 2, label: 'b', verdict: 'within', outcome: 'y' },
    ];
    expect(findBand(gappy, 1.5)).toBeNull();
    expect(findBand(flame.bands, Number.NaN)).toBeNull();
  });
});

describe('evaluateReading', () => {
  it('returns band, outcome and verdict', () => {
    const r = evaluateReading(flame, 0.8);
    expect(r).toMatchObject({ index: 1, outcome: 'low', verdict: 'below' });
    expect(r.band.label).toBe('low');
  });

  it('places the value on the gauge and clamps it', () => {
    // Finite limits 18 and 30, span 12, padded by 6 each side: scale 12 … 36.
    const scale = gaugeScale(volts);
    expect(scale.min).toBe(12);
    expect(scale.max).toBe(36);
    expect(evaluateReading(volts, 24).position).toBeCloseTo(0.5, 10);
    expect(evaluateReading(volts, 0).position).toBe(0);
    expect(evaluateReading(volts, 240).position).toBe(1);
    expect(evaluateReading(volts, 18).position).toBeCloseTo(0.25, 10);
  });

  it('throws when no band holds the value', () => {
    const broken = { ...volts, bands: [volts.bands[0]] };
    expect(() => evaluateReading(broken, 25)).toThrow(/No band/);
  });
});

describe('gaugeScale', () => {
  it('does not run a magnitude gauge below zero', () => {
    // Limits 0.1 and 2 would pad to below zero; microamps may read negative so they keep it,
    // but a pressure gauge starts at zero.
    const pressure = { ...flame, quantity: 'pressure' as const };
    expect(gaugeScale(pressure).min).toBe(0);
    expect(gaugeScale(flame).min).toBeCloseTo(0.1 - 0.95, 10);
  });

  it('gives contiguous segments from 0 to 1 in band order', () => {
    const { segments } = gaugeScale(volts);
    expect(segments.map((s) => [s.start, s.end])).toEqual([
      [0, 0.25],
      [0.25, 0.75],
      [0.75, 1],
    ]);
    expect(segments.map((s) => s.verdict)).toEqual(['below', 'within', 'above']);
  });

  it('handles a single limit and no limit', () => {
    const two = { ...volts, bands: [{ ...volts.bands[0] }, { ...volts.bands[2], from: 18 }] };
    expect(gaugeScale(two)).toMatchObject({ min: 0, max: 36 });
    const one = { ...volts, bands: [{ label: 'all', verdict: 'within' as const, outcome: 'x' }] };
    expect(gaugeScale(one)).toMatchObject({ min: 0, max: 1, segments: [{ start: 0, end: 1 }] });
  });
});

describe('checkBandCoverage', () => {
  const b = (from: number | undefined, to: number | undefined, label = 'x'): Band => ({ from, to, label, verdict: 'within', outcome: 'o' });

  it('accepts bands that cover the number line once', () => {
    expect(checkBandCoverage(flame.bands)).toEqual([]);
    expect(checkBandCoverage([b(undefined, undefined)])).toEqual([]);
  });

  it('finds a gap', () => {
    expect(checkBandCoverage([b(undefined, 1), b(2, undefined)])).toEqual([expect.stringMatching(/Gap .* from 1 to 2/)]);
  });

  it('finds an overlap', () => {
    expect(checkBandCoverage([b(undefined, 3), b(2, undefined)])).toEqual([expect.stringMatching(/overlaps .* between 2 and 3/)]);
  });

  it('finds a band that starts at or above its end', () => {
    const problems = checkBandCoverage([b(undefined, 1), b(1, 1), b(1, undefined)]);
    expect(problems).toContainEqual(expect.stringMatching(/starts at or above where it ends/));
  });

  it('requires open ends', () => {
    expect(checkBandCoverage([b(0, 1), b(1, undefined)])).toEqual([expect.stringMatching(/first band must be open below/)]);
    expect(checkBandCoverage([b(undefined, 1), b(1, 5)])).toEqual([expect.stringMatching(/last band must be open above/)]);
  });

  it('requires ascending order', () => {
    const problems = checkBandCoverage([b(undefined, 1), b(5, undefined), b(1, 5)]);
    expect(problems).toContainEqual(expect.stringMatching(/out of order/));
  });

  it('reports an open end in the middle as an overlap', () => {
    expect(checkBandCoverage([b(undefined, undefined), b(1, undefined)])).toContainEqual(
      expect.stringMatching(/open above, so it overlaps/),
    );
  });
});

describe('latestReadings', () => {
  it('keeps the last reading of each step in path order, OL as +infinity, and skips answers without a reading', () => {
    const readings = latestReadings([
      { stepId: 'transformer-secondary', value: 26.1 },
      { stepId: 'trial-observe', value: null },
      { stepId: 'rollout-continuity', value: null, overRange: true },
      { stepId: 'transformer-secondary', value: 24.3 },
    ]);
    expect(readings).toEqual({ 'transformer-secondary': 24.3, 'rollout-continuity': Number.POSITIVE_INFINITY });
  });
});
