import { createRequire } from 'node:module';
import { all, create } from 'mathjs';
import { CANONICAL_UNITS, QUANTITIES, type Quantity } from '@/lib/trees/schema';
import {
  PA_PER_INWC,
  PA_PER_PSI,
  PLAUSIBLE_RANGES,
  UNITS_BY_QUANTITY,
  convert,
  displayUnitFor,
  formatReading,
  parseReading,
} from '@/lib/units';

// js-quantities ships no type declarations; loading it through require keeps the test type-safe
// with the small slice of its API used here, without a declaration file.
type QtyValue = { to(unit: string): { scalar: number } };
const Qty = createRequire(import.meta.url)('js-quantities') as (text: string) => QtyValue;

// A private mathjs instance, so defining inH2O does not leak into other test files.
const math = create(all);
// mathjs has no inch of water; 25.4 mmH2O (conventional, g_n and 1000 kg/m³) is 249.08891 Pa.
math.createUnit('inH2O', '25.4 mmH2O');

function expectRelClose(actual: number, expected: number, relTol: number): void {
  expect(Number.isFinite(actual)).toBe(true);
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relTol);
}

function parsed(quantity: Quantity, text: string, unit?: string) {
  const r = parseReading(quantity, text, unit);
  if (!r.ok) throw new Error(`expected "${text}" to parse, got: ${r.message}`);
  return r;
}

function refused(quantity: Quantity, text: string, unit?: string): string {
  const r = parseReading(quantity, text, unit);
  expect(r.ok).toBe(false);
  return r.ok ? '' : r.message;
}

describe('published constants', () => {
  it('uses the conventional inch of water', () => {
    // NIST SP 811, Appendix B.8: inch of water (conventional) = 249.0889 Pa
    expect(PA_PER_INWC).toBe(249.0889);
    // mathjs as an independent reference: 25.4 mmH2O in Pa
    expectRelClose(math.unit(1, 'inH2O').toNumber('Pa'), PA_PER_INWC, 1e-6);
  });

  it('uses the NIST psi', () => {
    // NIST SP 811, Appendix B: psi = 6894.757 Pa
    expect(PA_PER_PSI).toBe(6894.757);
    // mathjs as an independent reference
    expectRelClose(math.unit(1, 'psi').toNumber('Pa'), PA_PER_PSI, 1e-7);
  });
});

describe('parseReading: accepted forms', () => {
  it.each([
    // 1959 international yard and pound agreement / NIST SP 811 Appendix B: 1 in = 25.4 mm exactly
    ['7/64', undefined, 7 / 64, 'in'],
    ['1 1/8 in', undefined, 1.125, 'in'],
    ['1-1/8"', undefined, 1.125, 'in'],
    ['0.125"', undefined, 0.125, 'in'],
    ['3.2 mm', undefined, 3.2 / 25.4, 'mm'],
    ['.5 cm', undefined, 5 / 25.4, 'cm'],
    ['0,125 in', undefined, 0.125, 'in'],
    ['3.2', 'mm', 3.2 / 25.4, 'mm'],
    ['1/8', 'in', 0.125, 'in'],
    ['1 ft', undefined, 12, 'ft'],
  ] as const)('length %s (picker %s)', (text, unit, value, symbol) => {
    const r = parsed('length', text, unit);
    expect(r.value).toBeCloseTo(value, 12);
    expect(r.unit).toBe(symbol);
    expect(r.canonicalUnit).toBe('in');
  });

  it.each([
    ['26.4', 26.4],
    ['26.4 VAC', 26.4],
    ['26.4 V', 26.4],
    ['24 vac', 24],
    ['24V', 24],
    ['120 V AC', 120],
    ['250 mV', 0.25],
  ] as const)('AC volts %s', (text, value) => {
    const r = parsed('vac', text);
    expect(r.value).toBeCloseTo(value, 12);
    expect(r.canonicalUnit).toBe('VAC');
  });

  it('normalises AC volt spellings to the picker symbol', () => {
    expect(parsed('vac', '26.4 V').unit).toBe('VAC');
    expect(parsed('vac', '24 vac').unit).toBe('VAC');
    expect(parsed('vac', '250 mV').unit).toBe('mVAC');
    expect(parsed('vac', '26.4').unit).toBe('VAC');
  });

  it.each([
    ['12 VDC', 12, 'VDC'],
    ['12 V', 12, 'VDC'],
    ['12', 12, 'VDC'],
    ['120 mV', 0.12, 'mVDC'],
    ['-0.3', -0.3, 'VDC'],
  ] as const)('DC volts %s', (text, value, symbol) => {
    const r = parsed('vdc', text);
    expect(r.value).toBeCloseTo(value, 12);
    expect(r.unit).toBe(symbol);
  });

  it.each([
    ['4.2 \u00b5A', 4.2, 'µA'], // micro sign
    ['4.2 \u03bcA', 4.2, 'µA'], // Greek small mu
    ['4.2 uA', 4.2, 'µA'],
    ['4.2', 4.2, 'µA'],
    ['0.02 mA', 20, 'mA'], // 1 mA = 1000 µA (SI prefixes, NIST SP 811)
    ['-3', -3, 'µA'],
  ] as const)('DC microamps %s', (text, value, symbol) => {
    const r = parsed('udc', text);
    expect(r.value).toBeCloseTo(value, 9);
    expect(r.unit).toBe(symbol);
    expect(r.canonicalUnit).toBe('µA');
  });

  it.each([
    ['3.5 inWC', 3.5, 'inWC'],
    ['3.5 "wc', 3.5, 'inWC'],
    ['3.5 in wc', 3.5, 'inWC'],
    ['3.5 inH2O', 3.5, 'inWC'],
    ['3.5 iwc', 3.5, 'inWC'],
    ['3,5', 3.5, 'inWC'],
    ['3.5', 3.5, 'inWC'],
    // NIST SP 811 Appendix B.8: 1 inWC (conventional) = 249.0889 Pa
    ['871 Pa', 871 / 249.0889, 'Pa'],
    ['0.87 kPa', 870 / 249.0889, 'kPa'],
    ['8.7 mbar', 870 / 249.0889, 'mbar'],
    // NIST SP 811 Appendix B: 1 psi = 6894.757 Pa
    ['0.5 psi', (0.5 * 6894.757) / 249.0889, 'psi'],
  ] as const)('pressure %s', (text, value, symbol) => {
    const r = parsed('pressure', text);
    expect(r.value).toBeCloseTo(value, 9);
    expect(r.unit).toBe(symbol);
    expect(r.canonicalUnit).toBe('inWC');
  });

  it.each([
    ['12.5 Ω', 12.5, 'Ω'],
    ['12.5 \u2126', 12.5, 'Ω'], // the ohm sign, a different code point from Greek omega
    ['12.5 ohm', 12.5, 'Ω'],
    ['1.2 kΩ', 1200, 'kΩ'],
    ['1.2k ohm', 1200, 'kΩ'],
    ['1.2k', 1200, 'kΩ'],
    ['2 MΩ', 2e6, 'MΩ'],
  ] as const)('ohms %s', (text, value, symbol) => {
    const r = parsed('ohm', text);
    expect(r.value).toBeCloseTo(value, 6);
    expect(r.unit).toBe(symbol);
    expect(r.canonicalUnit).toBe('Ω');
  });

  it('lets a unit in the text win over the picker when both are of the quantity', () => {
    const r = parsed('length', '3.2 mm', 'in');
    expect(r.unit).toBe('mm');
    expect(r.value).toBeCloseTo(3.2 / 25.4, 12);
  });

  it('gives a bare number the picker unit, or the canonical one', () => {
    expect(parsed('pressure', '871', 'Pa').value).toBeCloseTo(871 / 249.0889, 9);
    expect(parsed('pressure', '35').value).toBe(35);
  });

  it('turns a typed -0 into 0', () => {
    expect(Object.is(parsed('vdc', '-0').value, 0)).toBe(true);
  });
});

describe('parseReading: refusals say why', () => {
  it('refuses empty text', () => {
    expect(refused('vac', '')).toMatch(/empty/i);
    expect(refused('vac', '   ')).toMatch(/empty/i);
  });

  it('refuses text that is not a number', () => {
    expect(refused('vac', 'abc')).toMatch(/not a number/i);
    expect(refused('vac', '12 34')).toMatch(/not a number/i);
    expect(refused('vac', '-')).toMatch(/not a number/i);
  });

  it('refuses NaN and infinities', () => {
    expect(refused('vac', 'NaN')).toMatch(/NaN is not a number/);
    expect(refused('vac', '1e999')).toMatch(/infinite/i);
    expect(refused('vac', 'Infinity')).toMatch(/infinite/i);
    expect(refused('vdc', '-Infinity')).toMatch(/infinite/i);
  });

  it('refuses a unit of another quantity, naming both', () => {
    expect(refused('vac', '12 kPa')).toBe('kPa is a pressure unit, this step measures AC volts');
    expect(refused('vac', '12 VDC')).toMatch(/VDC is a DC voltage unit, this step measures AC volts/);
    expect(refused('udc', '24 V')).toMatch(/V is a voltage unit, this step measures DC microamps/);
    expect(refused('pressure', '3.5 in')).toMatch(/length unit.*inWC/);
  });

  it('refuses a text unit of another quantity even when the picker is right', () => {
    expect(refused('vac', '26.4 VDC', 'VAC')).toMatch(/DC voltage unit/);
  });

  it('refuses a picker unit of another quantity', () => {
    expect(refused('vac', '5', 'kPa')).toMatch(/pressure unit/);
  });

  it('refuses an unknown unit', () => {
    expect(refused('length', '3 furlongs')).toMatch(/"furlongs" is not a unit/);
  });

  it('refuses division by zero in a fraction', () => {
    expect(refused('length', '1/0')).toMatch(/division by zero/i);
    expect(refused('length', '1 1/0 in')).toMatch(/division by zero/i);
  });

  it('refuses a mixed number whose fraction is not a proper one', () => {
    expect(refused('length', '1 9/8')).toMatch(/less than 1/);
  });

  it('refuses a comma that could be a thousands separator', () => {
    expect(refused('ohm', '1,250')).toMatch(/ambiguous/);
  });

  it('reads 0.8 mA as 800 µA, which is beyond any flame signal', () => {
    // SI prefixes: 1 mA = 1000 µA
    expect(refused('udc', '0.8 mA')).toMatch(/0\.8 mA \(800 µA\) is outside the plausible range/);
    expect(convert('udc', 0.8, 'mA', 'µA')).toBeCloseTo(800, 9);
  });

  it('refuses an over-range display unless over range is asked for (see units-entry.test.ts)', () => {
    expect(refused('ohm', 'OL')).toMatch(/saved as an over-range answer, not as a number/);
    expect(refused('vac', 'OL')).toMatch(/OL is only for resistance/);
  });

  it.each([
    ['vac', '700', /0 to 600 VAC/],
    ['vac', '-5', /0 to 600 VAC/],
    ['vdc', '-2', /-1 to 600 VDC/],
    ['vdc', '601', /-1 to 600 VDC/],
    // Flame signals are a few µA (TRADE.md, common practice, no source): tens at most.
    ['udc', '-51', /-50 to 50 µA/],
    ['udc', '0.6 mA', /-50 to 50 µA/],
    ['udc', '51', /-50 to 50 µA/],
    ['ohm', '-1', /0 to 100000000 Ω/],
    ['ohm', '200 MΩ', /0 to 100000000 Ω/],
    ['length', '121', /0 to 120 in/],
    ['length', '-1 mm', /0 to 120 in/],
    ['pressure', '61', /-5 to 60 inWC/],
    ['pressure', '-6', /-5 to 60 inWC/],
    ['pressure', '3 psi', /-5 to 60 inWC/],
  ] as const)('refuses %s %s as implausible, stating the range', (quantity, text, range) => {
    const message = refused(quantity, text);
    expect(message).toMatch(/outside the plausible range/);
    expect(message).toMatch(range);
  });

  it('accepts the ends of each plausible range', () => {
    for (const q of QUANTITIES) {
      const { min, max } = PLAUSIBLE_RANGES[q];
      expect(parsed(q, String(min)).value).toBe(min);
      expect(parsed(q, String(max)).value).toBe(max);
    }
  });
});

describe('UNITS_BY_QUANTITY and convert', () => {
  it('lists the canonical unit first for every quantity', () => {
    for (const q of QUANTITIES) {
      expect(UNITS_BY_QUANTITY[q][0].symbol).toBe(CANONICAL_UNITS[q]);
      expect(UNITS_BY_QUANTITY[q][0].toCanonical(3.7)).toBe(3.7);
    }
  });

  it('round-trips every unit through the canonical one', () => {
    for (const q of QUANTITIES) {
      for (const u of UNITS_BY_QUANTITY[q]) {
        for (const v of [0, 0.125, 3.5, 26.4, 871]) {
          expectRelClose(u.toCanonical(u.fromCanonical(v)) || 0, v, 1e-12);
          expectRelClose(convert(q, convert(q, v, CANONICAL_UNITS[q], u.symbol), u.symbol, CANONICAL_UNITS[q]), v, 1e-12);
        }
      }
    }
  });

  it('round-trips a reading through formatReading and parseReading in every unit', () => {
    const samples: Record<Quantity, number> = { vac: 26.4, vdc: 12.2, udc: 4.2, ohm: 1234, length: 0.125, pressure: 3.5 };
    for (const q of QUANTITIES) {
      for (const u of UNITS_BY_QUANTITY[q]) {
        const shown = formatReading(q, samples[q], u.symbol, { significant: 6 });
        expectRelClose(parsed(q, shown).value, samples[q], 1e-5);
      }
    }
  });

  it('converts between two non-canonical units', () => {
    // NIST SP 811 Appendix B: psi = 6894.757 Pa, so 1 psi = 6.894757 kPa
    expect(convert('pressure', 1, 'psi', 'kPa')).toBeCloseTo(6.894757, 9);
    // 1959 international yard and pound agreement: 1 in = 2.54 cm, so 1 ft = 304.8 mm
    expect(convert('length', 1, 'ft', 'mm')).toBeCloseTo(304.8, 9);
  });

  it('throws on units of another quantity or non-finite values', () => {
    expect(() => convert('pressure', 1, 'in', 'Pa')).toThrow(RangeError);
    expect(() => convert('length', Number.NaN, 'in', 'mm')).toThrow(RangeError);
  });

  it('finds units by their spellings', () => {
    expect(parseReading('ohm', '2 MEGOHM')).toMatchObject({ ok: true, unit: 'MΩ', value: 2e6 });
    expect(parseReading('vdc', '5', 'MV').ok).toBe(false); // megavolts are not millivolts
    expect(parseReading('vdc', '5 mV')).toMatchObject({ ok: true, unit: 'mVDC', value: 0.005 });
  });
});

describe('against mathjs (independent reference)', () => {
  it.each([
    // NIST SP 811 Appendix B.8 (inWC, via mathjs's 25.4 mmH2O) and Appendix B (psi); Pa, kPa and mbar are SI
    [871, 'Pa'],
    [0.87, 'kPa'],
    [8.7, 'mbar'],
    [0.5, 'psi'],
    [1, 'psi'],
  ] as const)('%s %s in inches of water', (value, unit) => {
    const reference = math.unit(value, unit).toNumber('inH2O');
    // mathjs derives 249.08891 Pa from g_n; NIST rounds to 249.0889: they agree to 4e-8.
    expectRelClose(convert('pressure', value, unit, 'inWC'), reference, 1e-6);
    expectRelClose(parsed('pressure', `${value} ${unit}`).value, reference, 1e-6);
  });

  it.each(['Pa', 'kPa', 'mbar', 'psi'] as const)('3.5 inWC in %s', (unit) => {
    // NIST SP 811 Appendix B.8 / Appendix B, through mathjs
    expectRelClose(convert('pressure', 3.5, 'inWC', unit), math.unit(3.5, 'inH2O').toNumber(unit), 1e-6);
  });

  it('1 psi is 27.68 inWC', () => {
    // computed from the two rows above (NIST SP 811 psi and conventional inWC): 6894.757 / 249.0889
    expect(convert('pressure', 1, 'psi', 'inWC')).toBeCloseTo(27.68, 2);
    expectRelClose(convert('pressure', 1, 'psi', 'inWC'), math.unit(1, 'psi').toNumber('inH2O'), 1e-6);
  });

  it.each([
    [1, 'in', 'mm'],
    [0.125, 'in', 'mm'],
    [3.2, 'mm', 'in'],
    [0.5, 'cm', 'in'],
    [10, 'ft', 'cm'],
  ] as const)('length %s %s in %s', (value, from, to) => {
    // 1959 international yard and pound agreement; NIST SP 811 Appendix B: 1 in = 25.4 mm exactly
    const reference = math.unit(value, from === 'in' ? 'inch' : from).toNumber(to === 'in' ? 'inch' : to);
    expectRelClose(convert('length', value, from, to), reference, 1e-12);
  });

  it('electrical prefixes', () => {
    // SI prefixes, through mathjs
    expectRelClose(convert('udc', 0.8, 'mA', 'µA'), math.unit(0.8, 'mA').toNumber('uA'), 1e-12);
    expectRelClose(convert('ohm', 1.2, 'kΩ', 'Ω'), math.unit(1.2, 'kohm').toNumber('ohm'), 1e-12);
    expectRelClose(convert('ohm', 2, 'MΩ', 'Ω'), math.unit(2, 'Mohm').toNumber('ohm'), 1e-12);
    expectRelClose(convert('vdc', 120, 'mVDC', 'VDC'), math.unit(120, 'mV').toNumber('V'), 1e-12);
  });
});

describe('against js-quantities (independent reference)', () => {
  it('inches of water, within the temperature-reference difference', () => {
    // js-quantities' inH2O is water at 39.2 °F, 249.082 Pa (NIST SP 811 Appendix B.8), against our
    // conventional 249.0889 Pa: a relative difference of 2.8e-5, hence the 1e-4 tolerance.
    expectRelClose(Qty('1 inH2O').to('Pa').scalar, PA_PER_INWC, 1e-4);
    expectRelClose(convert('pressure', 871, 'Pa', 'inWC'), Qty('871 Pa').to('inH2O').scalar, 1e-4);
    expectRelClose(convert('pressure', 0.87, 'kPa', 'inWC'), Qty('0.87 kPa').to('inH2O').scalar, 1e-4);
    expectRelClose(convert('pressure', 8.7, 'mbar', 'inWC'), Qty('8.7 mbar').to('inH2O').scalar, 1e-4);
  });

  it('psi, within js-quantities rounding', () => {
    // NIST SP 811 Appendix B gives 6894.757 Pa; js-quantities rounds it to 6894.76 (4e-7 relative).
    expectRelClose(convert('pressure', 1, 'psi', 'Pa'), Qty('1 psi').to('Pa').scalar, 1e-6);
  });

  it('inches and millimetres exactly', () => {
    // 1959 international yard and pound agreement: 1 in = 25.4 mm
    expectRelClose(convert('length', 1.125, 'in', 'mm'), Qty('1.125 in').to('mm').scalar, 1e-12);
    expectRelClose(convert('length', 3.2, 'mm', 'in'), Qty('3.2 mm').to('in').scalar, 1e-12);
  });
});

describe('formatReading', () => {
  it('shows three significant figures without rounding away integer digits', () => {
    expect(formatReading('vac', 26.4)).toBe('26.4 VAC');
    expect(formatReading('udc', 4.2)).toBe('4.2 µA');
    expect(formatReading('ohm', 1234)).toBe('1234 Ω');
    expect(formatReading('ohm', 1234, 'kΩ')).toBe('1.23 kΩ');
    expect(formatReading('udc', 800, 'mA')).toBe('0.8 mA');
    expect(formatReading('vdc', 0)).toBe('0 VDC');
    expect(formatReading('vdc', -0.004)).toBe('-0.004 VDC');
  });

  it('shows pressure in the chosen unit', () => {
    // NIST SP 811 Appendix B.8: 3.5 × 249.0889 Pa = 871.8 Pa
    expect(formatReading('pressure', 3.5, 'Pa')).toBe('872 Pa');
    expect(formatReading('pressure', 3.5, 'kPa')).toBe('0.872 kPa');
  });

  it('shows inches as a fraction when asked and close to a 64th', () => {
    expect(formatReading('length', 0.125, 'in', { fraction: true })).toBe('1/8 in');
    expect(formatReading('length', 1.125, 'in', { fraction: true })).toBe('1 1/8 in');
    expect(formatReading('length', 7 / 64, 'in', { fraction: true })).toBe('7/64 in');
    expect(formatReading('length', 2, 'in', { fraction: true })).toBe('2 in');
    // 3.2 mm is 0.12598 in, a thousandth off 1/8: shown as a decimal
    expect(formatReading('length', 3.2 / 25.4, 'in', { fraction: true })).toBe('0.126 in');
    expect(formatReading('length', 0.125)).toBe('0.125 in');
    // 1959 international yard and pound agreement: 1/8 in = 3.175 mm
    expect(formatReading('length', 0.125, 'mm', { fraction: true })).toBe('3.18 mm');
  });

  it('refuses non-finite values', () => {
    expect(() => formatReading('vac', Number.NaN)).toThrow(RangeError);
  });
});

describe('displayUnitFor', () => {
  it('picks the unit per system', () => {
    expect(displayUnitFor('length', 'us')).toBe('in');
    expect(displayUnitFor('length', 'metric')).toBe('mm');
    expect(displayUnitFor('pressure', 'us')).toBe('inWC');
    expect(displayUnitFor('pressure', 'metric')).toBe('Pa');
    expect(displayUnitFor('pressure', 'metric', 50)).toBe('kPa');
    for (const q of ['vac', 'vdc', 'udc', 'ohm'] as const) {
      expect(displayUnitFor(q, 'us')).toBe(CANONICAL_UNITS[q]);
      expect(displayUnitFor(q, 'metric')).toBe(CANONICAL_UNITS[q]);
    }
  });
});
