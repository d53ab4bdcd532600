// Control-circuit arithmetic the wizard offers beside a measure step: how much of the 24 V a run of
// thermostat or valve wire eats, and how loaded the control transformer is.

/** Gauges accepted: 0000 (written -3) through 40. */
export const AWG_MIN = -3;
export const AWG_MAX = 40;

/** International Annealed Copper Standard: resistivity of annealed copper at 20 °C, in µΩ·cm. */
export const IACS_RESISTIVITY_MICRO_OHM_CM = 1.7241;
/** Temperature coefficient of resistance of annealed copper, per °C, referred to 20 °C (IACS). */
export const COPPER_ALPHA_20C = 0.00393;

/**
 * Conductor temperatures the linear copper model is used for. Beyond them the single-coefficient
 * model drifts and no control wiring runs there anyway.
 */
export const CONDUCTOR_TEMP_RANGE_C = { min: -60, max: 150 } as const;

/** Class 2 limit for an inherently limited AC source over 20 V up to 30 V. */
export const CLASS_2_MAX_VA_20_TO_30_V = 100;

const CM_PER_INCH = 2.54;
const CM_PER_KFT = 1000 * 12 * CM_PER_INCH;

function requireFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number, got ${String(value)}`);
  }
}

function requireNonNegative(name: string, value: number): void {
  requireFinite(name, value);
  if (value < 0) throw new RangeError(`${name} cannot be negative, got ${value}`);
}

function requirePositive(name: string, value: number): void {
  requireFinite(name, value);
  if (value <= 0) throw new RangeError(`${name} must be greater than zero, got ${value}`);
}

function requireGauge(awg: number): void {
  if (typeof awg !== 'number' || !Number.isInteger(awg) || awg < AWG_MIN || awg > AWG_MAX) {
    throw new RangeError(`Unknown wire gauge ${String(awg)}: use a whole AWG number from 40 to 0, or -1, -2, -3 for 00, 000, 0000`);
  }
}

/** Diameter of a solid round conductor, ASTM B258: d = 0.005 in × 92^((36 − n)/39). */
export function awgDiameterInches(awg: number): number {
  requireGauge(awg);
  return 0.005 * Math.pow(92, (36 - awg) / 39);
}

/**
 * DC resistance of solid annealed copper per 1000 ft: IACS resistivity over the ASTM B258 cross-section,
 * corrected linearly from 20 °C with the IACS coefficient.
 */
export function copperResistanceOhmsPerKft(awg: number, tempC = 20): number {
  const dCm = awgDiameterInches(awg) * CM_PER_INCH;
  requireFinite('Conductor temperature', tempC);
  if (tempC < CONDUCTOR_TEMP_RANGE_C.min || tempC > CONDUCTOR_TEMP_RANGE_C.max) {
    throw new RangeError(`Conductor temperature ${tempC} °C is outside ${CONDUCTOR_TEMP_RANGE_C.min} to ${CONDUCTOR_TEMP_RANGE_C.max} °C`);
  }
  const areaCm2 = (Math.PI * dCm * dCm) / 4;
  const r20 = (IACS_RESISTIVITY_MICRO_OHM_CM * 1e-6 * CM_PER_KFT) / areaCm2;
  return r20 * (1 + COPPER_ALPHA_20C * (tempC - 20));
}

export interface WireRun {
  awg: number;
  /** Distance from the source to the load; the current goes out and back, so the loop is twice this. */
  oneWayLengthFt: number;
  currentA: number;
  /** Conductor temperature, default 20 °C. */
  tempC?: number;
}

export function voltageDrop({ awg, oneWayLengthFt, currentA, tempC = 20 }: WireRun): {
  loopResistanceOhms: number;
  dropVolts: number;
} {
  requireNonNegative('One-way length (ft)', oneWayLengthFt);
  requireNonNegative('Current (A)', currentA);
  const loopResistanceOhms = (copperResistanceOhmsPerKft(awg, tempC) * 2 * oneWayLengthFt) / 1000;
  return { loopResistanceOhms, dropVolts: currentA * loopResistanceOhms };
}

/**
 * Volts left at the load with the load's current taken as fixed (a fair model for a gas valve coil
 * or a relay at its rated voltage). When the drop would exceed the source the model no longer
 * holds — the load cannot draw that current — so that is refused rather than answered.
 */
export function voltageAtLoad({ sourceVolts, ...run }: WireRun & { sourceVolts: number }): {
  loopResistanceOhms: number;
  dropVolts: number;
  loadVolts: number;
  percentDrop: number;
} {
  requirePositive('Source voltage (V)', sourceVolts);
  const { loopResistanceOhms, dropVolts } = voltageDrop(run);
  if (dropVolts > sourceVolts) {
    throw new RangeError(
      `The wire would drop ${dropVolts.toFixed(2)} V of a ${sourceVolts} V source: this load cannot draw ${run.currentA} A through it`,
    );
  }
  return {
    loopResistanceOhms,
    dropVolts,
    loadVolts: sourceVolts - dropVolts,
    percentDrop: (dropVolts / sourceVolts) * 100,
  };
}

export interface TransformerLoadInput {
  ratingVa: number;
  /** Secondary voltage, default 24 V. */
  secondaryVolts?: number;
  /** Loads known by their VA (from a rating plate). */
  loadsVa?: { name: string; va: number }[];
  /** Loads known by their current (measured with a clamp meter), converted at the secondary voltage. */
  loadsA?: { name: string; amps: number }[];
  /** Rating of the low-voltage fuse, if there is one. */
  fuseAmps?: number;
}

export interface TransformerLoadResult {
  totalVa: number;
  currentA: number;
  ratingCurrentA: number;
  percentOfRating: number;
  overloaded: boolean;
  /** Whether the load current is within the fuse rating; null without a fuse. */
  fuseHolds: boolean | null;
  /**
   * Whether the rating is within the Class 2 power limit (100 VA for over 20 V up to 30 V). Only a
   * VA check — a listed Class 2 transformer also meets the standard's other conditions. null outside
   * 20–30 V, where the limit is different and not computed here.
   */
  class2Ok: boolean | null;
}

export function transformerLoad({ ratingVa, secondaryVolts = 24, loadsVa, loadsA, fuseAmps }: TransformerLoadInput): TransformerLoadResult {
  requirePositive('Transformer rating (VA)', ratingVa);
  requirePositive('Secondary voltage (V)', secondaryVolts);
  if (loadsVa === undefined && loadsA === undefined) {
    throw new RangeError('Give the loads, in VA (loadsVa) or in amps (loadsA)');
  }
  if (fuseAmps !== undefined) requirePositive('Fuse rating (A)', fuseAmps);

  let totalVa = 0;
  for (const load of loadsVa ?? []) {
    requireNonNegative(`Load "${load.name}" (VA)`, load.va);
    totalVa += load.va;
  }
  for (const load of loadsA ?? []) {
    requireNonNegative(`Load "${load.name}" (A)`, load.amps);
    totalVa += load.amps * secondaryVolts;
  }

  const currentA = totalVa / secondaryVolts;
  return {
    totalVa,
    currentA,
    ratingCurrentA: ratingVa / secondaryVolts,
    percentOfRating: (totalVa / ratingVa) * 100,
    overloaded: totalVa > ratingVa,
    fuseHolds: fuseAmps === undefined ? null : currentA <= fuseAmps,
    class2Ok: secondaryVolts > 20 && secondaryVolts <= 30 ? ratingVa <= CLASS_2_MAX_VA_20_TO_30_V : null,
  };
}
