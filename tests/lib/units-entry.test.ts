import type { Band, MeasureStep, Quantity } from '@/lib/trees/schema';
import {
  formatEntry,
  formatOptionsFor,
  formatReading,
  OVER_RANGE_TEXT,
  parseReading,
  UNIT_FIT,
  UNITS_BY_QUANTITY,
  unitsForStep,
} from '@/lib/units';

// Demo bands for the checks below: their limits set the magnitude the unit picker judges by.
function step(quantity: Quantity, limits: number[]): Pick<MeasureStep, 'quantity' | 'bands'> {
  const edges = [undefined, ...limits, undefined];
  const bands: Band[] = edges.slice(0, -1).map((from, i) => ({
    from,
    to: edges[i + 1],
    label: `band ${i + 1}`,
    verdict: i === 0 ? 'below' : i === limits.length ? 'above' : 'within',
    outcome: 'next',
  }));
  return { quantity, bands };
}

const symbols = (s: Pick<MeasureStep, 'quantity' | 'bands'>) => unitsForStep(s).map((u) => u.symbol);

describe('parseReading with over range: "OL" on an ohms step', () => {
  it.each(['OL', 'ol', 'O.L.', 'O.L', '0.L', 'open', 'Open', 'open circuit', 'over range', 'over-range', '  OL  '])(
    '%s is the over-range answer, with no value',
    (text) => {
      const r = parseReading('ohm', text, 'Ω', { overRange: true });
      expect(r).toEqual({ ok: true, overRange: true, unit: 'Ω', canonicalUnit: 'Ω' });
      expect(r).not.toHaveProperty('value');
    },
  );

  it('keeps the range the meter showed it on ("OL MΩ"), or the picker’s', () => {
    expect(parseReading('ohm', 'OL MΩ', 'Ω', { overRange: true })).toMatchObject({ ok: true, overRange: true, unit: 'MΩ' });
    expect(parseReading('ohm', 'OL', 'kΩ', { overRange: true })).toMatchObject({ ok: true, overRange: true, unit: 'kΩ' });
  });

  it('refuses a sign or a unit of another quantity after OL, saying why', () => {
    expect(parseReading('ohm', '-OL', 'Ω', { overRange: true })).toEqual({
      ok: false,
      message: 'An open circuit (OL) has no sign: enter OL alone',
    });
    const volts = parseReading('ohm', 'OL V', 'Ω', { overRange: true });
    expect(volts.ok).toBe(false);
    expect(volts.ok ? '' : volts.message).toMatch(/V is a voltage unit, this step measures resistance/);
  });

  it.each(['vac', 'vdc', 'udc', 'length', 'pressure'] as const)('refuses OL on %s: it is only for resistance', (quantity) => {
    for (const text of ['OL', 'open']) {
      const r = parseReading(quantity, text, undefined, { overRange: true });
      expect(r.ok).toBe(false);
      expect(r.ok ? '' : r.message).toMatch(/^OL is only for resistance: on .+ set the meter to a higher range/);
    }
  });

  it('does not take words that only start like it', () => {
    expect(parseReading('ohm', 'olive', 'Ω', { overRange: true }).ok).toBe(false);
    expect(parseReading('ohm', 'opened', 'Ω', { overRange: true }).ok).toBe(false);
  });

  it('still parses numbers as before when over range is allowed', () => {
    expect(parseReading('ohm', '0.4', 'Ω', { overRange: true })).toMatchObject({ ok: true, value: 0.4, unit: 'Ω' });
    // SI prefix: 1.2 kΩ = 1200 Ω
    expect(parseReading('ohm', '1.2k', 'Ω', { overRange: true })).toMatchObject({ ok: true, value: 1200, unit: 'kΩ' });
  });
});

describe('unitsForStep: units that fit the quantity and the magnitude of its bands', () => {
  it('a spark gap under 1 in: inches and mm, not feet or cm', () => {
    // Demo limits around a 1/8 in gap (about 1/8 in is common practice, no source).
    expect(symbols(step('length', [0.09375, 0.15625]))).toEqual(['in', 'mm']);
  });

  it('a clearance of several inches offers cm too, and feet only from half a foot', () => {
    expect(symbols(step('length', [2, 4]))).toEqual(['in', 'mm', 'cm']);
    expect(symbols(step('length', [6, 24]))).toEqual(['in', 'mm', 'cm', 'ft']);
  });

  it('line voltage and 24 V: volts, never millivolts', () => {
    // Demo limits near 120 V line and a 24 V control circuit (common practice, no source).
    expect(symbols(step('vac', [108, 132]))).toEqual(['VAC']);
    expect(symbols(step('vac', [18, 30]))).toEqual(['VAC']);
  });

  it('a near-zero voltage across a closed switch offers millivolts', () => {
    expect(symbols(step('vac', [2]))).toEqual(['VAC', 'mVAC']);
    expect(symbols(step('vdc', [0, 0.5]))).toEqual(['VDC', 'mVDC']);
  });

  it('a flame signal of a few microamps: µA only', () => {
    // Demo limits: a few µA is a good signal (common practice, no source).
    expect(symbols(step('udc', [0.1, 2]))).toEqual(['µA']);
  });

  it('continuity in ohms: Ω; an insulation check in megohms offers kΩ and MΩ', () => {
    expect(symbols(step('ohm', [2]))).toEqual(['Ω']);
    expect(symbols(step('ohm', [1e6, 1e7]))).toEqual(['Ω', 'kΩ', 'MΩ']);
  });

  it('manifold pressure of a few inWC: Pa, kPa and mbar, not psi; inlet up to 14 inWC adds psi', () => {
    // NIST SP 811 B.8: 4 inWC = 996 Pa = 0.996 kPa = 9.96 mbar; NIST SP 811 B: = 0.1445 psi, under the 0.5 threshold.
    expect(symbols(step('pressure', [0.5, 3, 4]))).toEqual(['inWC', 'Pa', 'kPa', 'mbar']);
    // 14 inWC × 249.0889 / 6894.757 = 0.506 psi (NIST SP 811): at least 0.5.
    expect(symbols(step('pressure', [8, 14]))).toEqual(['inWC', 'Pa', 'kPa', 'mbar', 'psi']);
  });

  it('always offers the canonical unit first, and every unit when the bands have no limits', () => {
    expect(unitsForStep(step('length', [1000]))[0].symbol).toBe('in');
    expect(unitsForStep(step('pressure', []))).toEqual(UNITS_BY_QUANTITY.pressure);
  });

  it('judges by the thresholds it names', () => {
    expect(UNIT_FIT).toEqual({ largestAtLeast: 0.5, smallestAtMost: 5000 });
    // 6 in is exactly 0.5 ft (12 in per foot, NIST SP 811): on the edge, offered.
    expect(symbols(step('length', [6]))).toContain('ft');
    expect(symbols(step('length', [5.9]))).not.toContain('ft');
  });
});

describe('readings shown as they were entered', () => {
  it('keeps the decimals typed: 120.4 stays 120.4, 120 stays 120, 120.40 keeps its zero', () => {
    expect(formatEntry('vac', '120.4', 'VAC')).toBe('120.4 VAC');
    expect(formatEntry('vac', '120', 'VAC')).toBe('120 VAC');
    expect(formatEntry('vac', '120.40', 'VAC')).toBe('120.40 VAC');
    expect(formatEntry('udc', '4.25', 'µA')).toBe('4.25 µA');
    expect(formatEntry('ohm', '1234.5', 'Ω')).toBe('1234.5 Ω');
  });

  it('keeps the unit typed or picked and normalises the decimal comma', () => {
    expect(formatEntry('pressure', '3,5', 'inWC')).toBe('3.5 inWC');
    expect(formatEntry('length', '3.2', 'mm')).toBe('3.2 mm');
    expect(formatEntry('vac', '250 mV', 'VAC')).toBe('250 mVAC');
  });

  it('shows a fraction as a fraction, reduced', () => {
    expect(formatEntry('length', '1 1/8', 'in')).toBe('1 1/8 in');
    expect(formatEntry('length', '2/16 in', 'mm')).toBe('1/8 in');
  });

  it('shows OL as an open circuit, and nothing for text that is not a reading', () => {
    expect(formatEntry('ohm', 'OL', 'Ω')).toBe(OVER_RANGE_TEXT);
    expect(OVER_RANGE_TEXT).toBe('OL (open circuit)');
    expect(formatEntry('vac', 'abc', 'VAC')).toBeNull();
  });

  it('records how the number was written', () => {
    const decimal = parseReading('vac', '120.40', 'VAC');
    expect(decimal.ok && decimal.form).toEqual({ fraction: false, decimals: 2 });
    const fraction = parseReading('length', '1 1/8', 'in');
    expect(fraction.ok && fraction.form).toEqual({ fraction: true, decimals: null });
    const exponent = parseReading('pressure', '1.2e3', 'Pa');
    expect(exponent.ok && exponent.form).toEqual({ fraction: false, decimals: 0 });
  });

  it('formats with exactly the decimals asked, trailing zeros kept', () => {
    expect(formatReading('vac', 120, 'VAC', { decimals: 2 })).toBe('120.00 VAC');
    expect(formatReading('vac', 120.44, 'VAC', { decimals: 1 })).toBe('120.4 VAC');
    expect(formatReading('vdc', -0.04, 'VDC', { decimals: 1 })).toBe('0.0 VDC');
    // 1959 international yard and pound agreement (NIST SP 811 B): 0.125 in = 3.175 mm, shown to 3 decimals as typed.
    expect(formatReading('length', 3.175 / 25.4, 'mm', { decimals: 3 })).toBe('3.175 mm');
    expect(formatOptionsFor({ fraction: false, decimals: 1 })).toEqual({ decimals: 1 });
    expect(formatOptionsFor({ fraction: true, decimals: null })).toEqual({ fraction: true });
  });
});
