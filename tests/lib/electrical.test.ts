import { all, create } from 'mathjs';
import { awgDiameterInches, copperResistanceOhmsPerKft, transformerLoad, voltageAtLoad, voltageDrop } from '@/lib/electrical';

const math = create(all);

function expectRelClose(actual: number, expected: number, relTol: number): void {
  expect(Number.isFinite(actual)).toBe(true);
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relTol);
}

describe('awgDiameterInches', () => {
  it.each([18, 14, 22, 0, -3])('follows the ASTM B258 formula for %i AWG', (awg) => {
    // ASTM B258: d = 0.005 in × 92^((36 − n)/39)
    expectRelClose(awgDiameterInches(awg), 0.005 * 92 ** ((36 - awg) / 39), 1e-12);
  });

  it('anchors the scale at its defining sizes', () => {
    // ASTM B258: the series is defined by 36 AWG = 0.0050 in and 0000 AWG = 0.4600 in (from memory)
    expectRelClose(awgDiameterInches(36), 0.005, 1e-12);
    expectRelClose(awgDiameterInches(-3), 0.46, 1e-12);
  });

  it.each([
    // ASTM B258 table values, from memory (rounded to 0.1 mil)
    [18, 0.0403],
    [14, 0.0641],
    [12, 0.0808],
    [10, 0.1019],
    [22, 0.0253],
  ])('%i AWG is about %f in', (awg, inches) => {
    expect(Math.abs(awgDiameterInches(awg) - inches)).toBeLessThanOrEqual(0.00006);
  });

  it.each([41, -4, 18.5, Number.NaN, Number.POSITIVE_INFINITY])('refuses gauge %s', (awg) => {
    expect(() => awgDiameterInches(awg)).toThrow(/Unknown wire gauge/);
  });
});

describe('copperResistanceOhmsPerKft', () => {
  it.each([
    // computed from ASTM B258 + IACS (TRADE.md check values), within 0.5 %
    [22, 16.14],
    [20, 10.15],
    [18, 6.385],
    [14, 2.525],
  ])('%i AWG at 20 °C is %f Ω/kft', (awg, ohms) => {
    expectRelClose(copperResistanceOhmsPerKft(awg), ohms, 0.005);
    expectRelClose(copperResistanceOhmsPerKft(awg, 20), ohms, 0.005);
  });

  it.each([
    // NFPA 70 (NEC), Chapter 9, Table 8: solid uncoated copper, DC resistance at 75 °C.
    // Table 8 is published for real solid conductors rounded to three figures; our IACS + α model
    // corrected from 20 °C agrees with it within about 0.5 %, so 1 % is the tolerance.
    [18, 7.77],
    [16, 4.89],
    [14, 3.07],
    [12, 1.93],
  ])('%i AWG at 75 °C is %f Ω/kft', (awg, ohms) => {
    expectRelClose(copperResistanceOhmsPerKft(awg, 75), ohms, 0.01);
  });

  it('scales with temperature by the IACS coefficient', () => {
    // International Annealed Copper Standard: α = 0.00393 /°C at 20 °C
    const ratio = copperResistanceOhmsPerKft(18, 75) / copperResistanceOhmsPerKft(18, 20);
    expect(ratio).toBeCloseTo(1 + 0.00393 * 55, 12);
    expect(copperResistanceOhmsPerKft(18, -20)).toBeLessThan(copperResistanceOhmsPerKft(18, 20));
  });

  it('agrees with mathjs doing the unit arithmetic of ρL/A', () => {
    // International Annealed Copper Standard resistivity and ASTM B258 diameter, with mathjs
    // handling µΩ·cm, feet and inches independently of the module's own factors.
    for (const awg of [22, 18, 14, 10]) {
      const d = 0.005 * 92 ** ((36 - awg) / 39);
      const r = math.evaluate(`1.7241 uohm * cm * 1000 ft / (pi / 4 * (${d} inch)^2)`).toNumber('ohm');
      expectRelClose(copperResistanceOhmsPerKft(awg), r, 1e-9);
    }
  });

  it('refuses temperatures outside its model and bad gauges', () => {
    expect(() => copperResistanceOhmsPerKft(18, 500)).toThrow(/outside -60 to 150 °C/);
    expect(() => copperResistanceOhmsPerKft(18, Number.NaN)).toThrow(/finite/);
    expect(() => copperResistanceOhmsPerKft(50)).toThrow(/Unknown wire gauge/);
  });
});

describe('voltageDrop and voltageAtLoad', () => {
  it('60 ft of 18 AWG at 0.5 A, 75 °C', () => {
    // Worked by hand from NFPA 70 (NEC) Chapter 9 Table 8, 18 AWG solid 7.77 Ω/kft at 75 °C:
    // loop = 2 × 60 ft = 120 ft = 0.120 kft; R = 7.77 × 0.120 = 0.9324 Ω; drop = 0.5 A × 0.9324 Ω = 0.4662 V.
    const { loopResistanceOhms, dropVolts } = voltageDrop({ awg: 18, oneWayLengthFt: 60, currentA: 0.5, tempC: 75 });
    expectRelClose(loopResistanceOhms, 0.9324, 0.01);
    expectRelClose(dropVolts, 0.4662, 0.01);
  });

  it('counts both conductors: 500 ft one way is a 1000 ft loop', () => {
    // computed from the 20 °C check values above (ASTM B258 + IACS): 18 AWG 6.385 Ω/kft
    const { loopResistanceOhms, dropVolts } = voltageDrop({ awg: 18, oneWayLengthFt: 500, currentA: 1 });
    expectRelClose(loopResistanceOhms, 6.385, 0.005);
    expectRelClose(dropVolts, 6.385, 0.005); // Ohm's law, V = I × R
  });

  it('is linear in length and current, and zero for no wire or no current', () => {
    const base = voltageDrop({ awg: 20, oneWayLengthFt: 40, currentA: 0.3 }).dropVolts;
    expect(voltageDrop({ awg: 20, oneWayLengthFt: 80, currentA: 0.3 }).dropVolts).toBeCloseTo(2 * base, 12);
    expect(voltageDrop({ awg: 20, oneWayLengthFt: 40, currentA: 0.9 }).dropVolts).toBeCloseTo(3 * base, 12);
    expect(voltageDrop({ awg: 20, oneWayLengthFt: 0, currentA: 0.3 }).dropVolts).toBe(0);
    expect(voltageDrop({ awg: 20, oneWayLengthFt: 40, currentA: 0 }).dropVolts).toBe(0);
  });

  it('leaves the rest of a 24 V source at the load', () => {
    // Worked by hand from NFPA 70 (NEC) Chapter 9 Table 8 as above: 24 − 0.4662 = 23.53 V; 0.4662 / 24 = 1.94 %
    const r = voltageAtLoad({ sourceVolts: 24, awg: 18, oneWayLengthFt: 60, currentA: 0.5, tempC: 75 });
    expect(r.loadVolts).toBeCloseTo(23.53, 1);
    expect(r.percentDrop).toBeCloseTo(1.94, 1);
    expect(r.loadVolts + r.dropVolts).toBeCloseTo(24, 12);
  });

  it.each([
    [{ awg: 18, oneWayLengthFt: -1, currentA: 0.5 }, /length.*negative/i],
    [{ awg: 18, oneWayLengthFt: Number.NaN, currentA: 0.5 }, /length.*finite/i],
    [{ awg: 18, oneWayLengthFt: 60, currentA: -0.5 }, /current.*negative/i],
    [{ awg: 18, oneWayLengthFt: 60, currentA: Number.POSITIVE_INFINITY }, /current.*finite/i],
    [{ awg: 17.5, oneWayLengthFt: 60, currentA: 0.5 }, /Unknown wire gauge/],
  ])('refuses %o', (run, message) => {
    expect(() => voltageDrop(run)).toThrow(RangeError);
    expect(() => voltageDrop(run)).toThrow(message);
  });

  it('refuses a source of no volts, and a drop larger than the source', () => {
    expect(() => voltageAtLoad({ sourceVolts: 0, awg: 18, oneWayLengthFt: 60, currentA: 0.5 })).toThrow(/Source voltage/);
    expect(() => voltageAtLoad({ sourceVolts: 24, awg: 30, oneWayLengthFt: 5000, currentA: 2 })).toThrow(/cannot draw/);
  });
});

describe('transformerLoad', () => {
  it('a 40 VA, 24 VAC transformer gives 1.67 A at full load', () => {
    // Ohm's law, VA = V × A: 40 / 24 = 1.67 A
    const r = transformerLoad({ ratingVa: 40, loadsVa: [] });
    expect(r.ratingCurrentA).toBeCloseTo(1.67, 2);
    // mathjs as an independent reference for VA / V
    expectRelClose(r.ratingCurrentA, math.evaluate('40 VA / (24 V)').toNumber('A'), 1e-12);
  });

  it('adds loads given in VA and in amps', () => {
    // Ohm's law, VA = V × A: 0.5 A at 24 V is 12 VA; with 10 VA that is 22 VA, 0.917 A, 55 % of 40 VA
    const r = transformerLoad({
      ratingVa: 40,
      loadsVa: [{ name: 'control board', va: 10 }],
      loadsA: [{ name: 'gas valve', amps: 0.5 }],
      fuseAmps: 3,
    });
    expect(r.totalVa).toBeCloseTo(22, 12);
    expect(r.currentA).toBeCloseTo(0.917, 3);
    expect(r.percentOfRating).toBeCloseTo(55, 9);
    expect(r.overloaded).toBe(false);
    expect(r.fuseHolds).toBe(true);
  });

  it('flags an overload and a fuse too small for the load', () => {
    // Ohm's law, VA = V × A: 48 VA at 24 V is 2 A
    const r = transformerLoad({
      ratingVa: 40,
      loadsVa: [
        { name: 'valve', va: 30 },
        { name: 'zone', va: 18 },
      ],
      fuseAmps: 1.5,
    });
    expect(r.totalVa).toBe(48);
    expect(r.currentA).toBeCloseTo(2, 12);
    expect(r.percentOfRating).toBeCloseTo(120, 9);
    expect(r.overloaded).toBe(true);
    expect(r.fuseHolds).toBe(false);
  });

  it('gives no fuse verdict without a fuse', () => {
    expect(transformerLoad({ ratingVa: 40, loadsA: [{ name: 'valve', amps: 0.5 }] }).fuseHolds).toBeNull();
  });

  it('checks the Class 2 limit of 100 VA for 20–30 V', () => {
    // NFPA 70 (NEC) Article 725 / Chapter 9 Table 11(A): AC over 20 V up to 30 V, at most 100 VA
    expect(transformerLoad({ ratingVa: 100, loadsVa: [] }).class2Ok).toBe(true);
    expect(transformerLoad({ ratingVa: 75, secondaryVolts: 28, loadsVa: [] }).class2Ok).toBe(true);
    expect(transformerLoad({ ratingVa: 101, loadsVa: [] }).class2Ok).toBe(false);
    expect(transformerLoad({ ratingVa: 150, loadsVa: [] }).class2Ok).toBe(false);
    // Outside 20–30 V the table has other limits, which this module does not compute.
    expect(transformerLoad({ ratingVa: 40, secondaryVolts: 12, loadsVa: [] }).class2Ok).toBeNull();
  });

  it('refuses bad inputs', () => {
    expect(() => transformerLoad({ ratingVa: 0, loadsVa: [] })).toThrow(/rating/);
    expect(() => transformerLoad({ ratingVa: Number.NaN, loadsVa: [] })).toThrow(RangeError);
    expect(() => transformerLoad({ ratingVa: 40, secondaryVolts: -24, loadsVa: [] })).toThrow(/Secondary voltage/);
    expect(() => transformerLoad({ ratingVa: 40, loadsVa: [{ name: 'valve', va: -5 }] })).toThrow(/"valve"/);
    expect(() => transformerLoad({ ratingVa: 40, loadsA: [{ name: 'valve', amps: Number.NaN }] })).toThrow(/"valve"/);
    expect(() => transformerLoad({ ratingVa: 40, loadsVa: [], fuseAmps: 0 })).toThrow(/Fuse/);
    expect(() => transformerLoad({ ratingVa: 40 })).toThrow(/loads/);
  });
});
