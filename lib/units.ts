// Readings as a technician types them — "1 1/8 in", "3,5 \"wc", "1.2k ohm" — parsed into the
// quantity's canonical unit (CANONICAL_UNITS), converted for the unit picker, and formatted for display.
import { CANONICAL_UNITS, type Quantity } from '@/lib/trees/schema';

/**
 * Pascals per conventional inch of water column: 25.4 mm × 1000 kg/m³ × 9.80665 m/s²
 * (NIST SP 811, Appendix B.8, "inch of water, conventional"). Gauges read at other reference
 * temperatures (249.082 Pa at 39.2 °F, 248.84 Pa at 60 °F) differ by less than 0.1 %, well under
 * what a manometer on a furnace resolves; the app uses the conventional value throughout.
 */
export const PA_PER_INWC = 249.0889;
/** Exactly, by the 1959 international yard and pound agreement (NIST SP 811, Appendix B). */
export const MM_PER_INCH = 25.4;
/** NIST SP 811, Appendix B (pound-force per square inch, to 7 significant figures). */
export const PA_PER_PSI = 6894.757;

export type UnitSystem = 'us' | 'metric';

export interface UnitDef {
  /** Normalised symbol, as shown on the picker and stored as "unit as entered". */
  symbol: string;
  /** Spoken-style name for the picker and screen readers. */
  label: string;
  toCanonical: (v: number) => number;
  fromCanonical: (v: number) => number;
}

/**
 * How the number was written, so it can be shown back the way it was entered: "120.4" keeps one
 * decimal, "120" none, "1 1/8" stays a fraction.
 */
export interface EntryForm {
  /** Written as a fraction or a mixed number ("1/8", "1 1/8"). */
  fraction: boolean;
  /** Digits after the decimal separator as written ("120.40" → 2); null for a fraction. */
  decimals: number | null;
}

export type ParseResult =
  { ok: true; value: number; unit: string; canonicalUnit: string; form: EntryForm; overRange?: undefined } | { ok: false; message: string };

/**
 * An ohms entry of "OL" / "open": the meter is over range, an open circuit. It has no value; the
 * answer is saved as over range and falls in the band open towards +infinity.
 */
export interface OverRangeResult {
  ok: true;
  overRange: true;
  unit: string;
  canonicalUnit: string;
}

/** What `parseReading` answers when over-range entries are allowed. */
export type ReadingParse = ParseResult | OverRangeResult;

/** How an over-range (open-circuit) reading is shown wherever a reading is shown. */
export const OVER_RANGE_TEXT = 'OL (open circuit)';
/** The text an over-range reading is stored and typed as. */
export const OVER_RANGE_ENTRY = 'OL';

/**
 * Values a meter can plausibly show on this equipment, in canonical units (inclusive). Anything
 * outside is far more likely a slip (wrong unit, wrong meter function, a stray digit) than a reading,
 * so it is refused with the range in the message rather than stored.
 */
export const PLAUSIBLE_RANGES: Record<Quantity, { min: number; max: number; why: string }> = {
  // A meter on AC shows no sign; 600 V is the top of the usual meter category ratings and well
  // above the 120/240 V line supply of a furnace.
  vac: { min: 0, max: 600, why: 'a true AC reading is never negative; 600 V covers line voltage' },
  // A little negative allows for leads reversed on a DC check near zero.
  vdc: { min: -1, max: 600, why: 'small negatives for reversed leads; 600 V covers line voltage' },
  // Flame signals are a few microamps; a meter in series with reversed leads reads negative.
  // Flame signals run from a fraction of a microamp to a few tens (TRADE.md: a few µA is good);
  // 50 µA is already well beyond a flame, so 0.6 mA is a meter on the wrong range, not a reading.
  udc: { min: -50, max: 50, why: 'flame signals are a few microamps, tens at most; reversed leads read negative' },
  // An open circuit shows as a very high value on some meters; 100 MΩ covers insulation checks.
  ohm: { min: 0, max: 1e8, why: 'resistance is never negative; an open circuit reads very high' },
  // Gaps, rod positions and clearances inside a furnace cabinet.
  length: { min: 0, max: 120, why: 'gaps and clearances inside a furnace cabinet' },
  // Slight vacuum on a draft or vent reading; 60 inWC (over 2 psi) is above any appliance inlet.
  pressure: { min: -5, max: 60, why: 'slight vacuum allowed; 60 inWC is above any appliance inlet' },
};

/** How a quantity is named in messages: "kPa is a pressure unit, this step measures AC volts". */
const QUANTITY_WORDS: Record<Quantity, { unitKind: string; measures: string }> = {
  vac: { unitKind: 'an AC voltage', measures: 'AC volts' },
  vdc: { unitKind: 'a DC voltage', measures: 'DC volts' },
  udc: { unitKind: 'a DC current', measures: 'DC microamps' },
  ohm: { unitKind: 'a resistance', measures: 'resistance in ohms' },
  length: { unitKind: 'a length', measures: 'length' },
  pressure: { unitKind: 'a pressure', measures: 'pressure' },
};

const scale = (factor: number) => ({
  toCanonical: (v: number) => v * factor,
  fromCanonical: (v: number) => v / factor,
});
const identity = { toCanonical: (v: number) => v, fromCanonical: (v: number) => v };

/**
 * A unit with the spellings that name it. `aliases` match ignoring case, spaces and dots;
 * `caseSensitive` spellings are the ones where case is the meaning (mV is not MV, MΩ is not mΩ).
 */
interface UnitSpec extends UnitDef {
  aliases: string[];
  caseSensitive?: string[];
}

const volts = (kind: 'AC' | 'DC'): UnitSpec[] => [
  {
    symbol: `V${kind}`,
    label: `volts ${kind}`,
    ...identity,
    aliases: ['v', `v${kind}`, `${kind}v`, 'volt', 'volts', `volts${kind}`, `volt${kind}`],
  },
  {
    symbol: `mV${kind}`,
    label: `millivolts ${kind}`,
    ...scale(1e-3),
    aliases: ['millivolt', 'millivolts', `millivolts${kind}`],
    caseSensitive: ['mV', 'mv', `mV${kind}`, `mV${kind.toLowerCase()}`, `mv${kind.toLowerCase()}`],
  },
];

const UNIT_SPECS: Record<Quantity, UnitSpec[]> = {
  vac: [...volts('AC').map((u) => (u.symbol === 'VAC' ? { ...u, aliases: [...u.aliases, 'vrms', 'v~', 'vac~'] } : u))],
  vdc: volts('DC'),
  udc: [
    {
      symbol: 'µA',
      label: 'microamps DC',
      ...identity,
      // Both micro signs (U+00B5 and Greek mu U+03BC) are folded to U+00B5 before matching.
      aliases: ['µa', 'ua', 'µadc', 'uadc', 'dcµa', 'dcua', 'microamp', 'microamps', 'microampere', 'microamperes'],
    },
    {
      symbol: 'mA',
      label: 'milliamps DC',
      ...scale(1000),
      aliases: ['milliamp', 'milliamps', 'milliampere', 'milliamperes'],
      caseSensitive: ['mA', 'ma', 'mAdc', 'mADC', 'madc'],
    },
  ],
  ohm: [
    { symbol: 'Ω', label: 'ohms', ...identity, aliases: ['Ω', 'ohm', 'ohms'] },
    {
      symbol: 'kΩ',
      label: 'kilohms',
      ...scale(1e3),
      aliases: ['kΩ', 'k', 'kohm', 'kohms', 'kilohm', 'kilohms', 'kiloohm', 'kiloohms'],
    },
    {
      symbol: 'MΩ',
      label: 'megohms',
      ...scale(1e6),
      aliases: ['megohm', 'megohms', 'megaohm', 'megaohms', 'meg', 'megs'],
      caseSensitive: ['MΩ', 'M', 'Mohm', 'Mohms', 'MOhm', 'MOhms', 'MOHM', 'MOHMS'],
    },
  ],
  length: [
    { symbol: 'in', label: 'inches', ...identity, aliases: ['in', '"', "''", 'inch', 'inches'] },
    {
      symbol: 'mm',
      label: 'millimetres',
      ...scale(1 / MM_PER_INCH),
      aliases: ['mm', 'millimeter', 'millimeters', 'millimetre', 'millimetres'],
    },
    {
      symbol: 'cm',
      label: 'centimetres',
      ...scale(10 / MM_PER_INCH),
      aliases: ['cm', 'centimeter', 'centimeters', 'centimetre', 'centimetres'],
    },
    { symbol: 'ft', label: 'feet', ...scale(12), aliases: ['ft', "'", 'foot', 'feet'] },
  ],
  pressure: [
    {
      symbol: 'inWC',
      label: 'inches of water column',
      ...identity,
      // "w.g." (water gauge) is the same unit under another trade name.
      aliases: [
        'inwc',
        '"wc',
        'iwc',
        'wc',
        'inh2o',
        '"h2o',
        'inchwc',
        'incheswc',
        'inchh2o',
        'inchesh2o',
        'inchofwater',
        'inchesofwater',
        'inchesofwatercolumn',
        'inwg',
        '"wg',
        'iwg',
        'incheswg',
        '"water',
        'inwater',
        'incheswater',
      ],
    },
    { symbol: 'Pa', label: 'pascals', ...scale(1 / PA_PER_INWC), aliases: ['pa', 'pascal', 'pascals'] },
    {
      symbol: 'kPa',
      label: 'kilopascals',
      ...scale(1000 / PA_PER_INWC),
      aliases: ['kpa', 'kilopascal', 'kilopascals'],
    },
    // hPa is numerically the millibar; it is normalised to mbar.
    {
      symbol: 'mbar',
      label: 'millibars',
      ...scale(100 / PA_PER_INWC),
      aliases: ['mbar', 'mb', 'millibar', 'millibars', 'hpa'],
    },
    // Gas pressures are gauge pressures, so "psig" is the same unit here.
    { symbol: 'psi', label: 'pounds per square inch', ...scale(PA_PER_PSI / PA_PER_INWC), aliases: ['psi', 'psig'] },
  ],
};

/** The unit picker's choices per quantity; the first entry is the canonical unit. */
export const UNITS_BY_QUANTITY: Record<Quantity, UnitDef[]> = Object.fromEntries(
  (Object.keys(UNIT_SPECS) as Quantity[]).map((q) => [
    q,
    UNIT_SPECS[q].map(({ symbol, label, toCanonical, fromCanonical }) => ({ symbol, label, toCanonical, fromCanonical })),
  ]),
) as Record<Quantity, UnitDef[]>;

const QUANTITY_LIST = Object.keys(UNIT_SPECS) as Quantity[];

/**
 * The picker's units for a step, from the magnitude of its band limits: a unit is offered when the
 * largest limit reads at least 0.5 in it (so no feet for a 1/8 in gap, no mA for a flame signal) and
 * the smallest non-zero limit at most 5000 (no mVAC for 24 or 120 V). The canonical unit, in which
 * the bands are written, is always offered. Typing any unit of the quantity still works.
 */
export function unitsForStep(step: { quantity: Quantity; bands: readonly { from?: number; to?: number }[] }): UnitDef[] {
  const all = UNITS_BY_QUANTITY[step.quantity];
  const limits = step.bands
    .flatMap((b) => [b.from, b.to])
    .filter((v): v is number => v !== undefined && Number.isFinite(v) && v !== 0)
    .map(Math.abs);
  if (limits.length === 0) return all;
  const smallest = Math.min(...limits);
  const largest = Math.max(...limits);
  return all.filter(
    (u, i) =>
      i === 0 ||
      (Math.abs(u.fromCanonical(largest)) >= UNIT_FIT.largestAtLeast && Math.abs(u.fromCanonical(smallest)) <= UNIT_FIT.smallestAtMost),
  );
}

/** The thresholds of `unitsForStep`, in the unit being judged. */
export const UNIT_FIT = { largestAtLeast: 0.5, smallestAtMost: 5000 } as const;

/** Folds the look-alike characters a tablet keyboard or a paste can produce. */
function foldCharacters(text: string): string {
  return text
    .replace(/\u03bc/g, '\u00b5') // Greek mu → micro sign
    .replace(/\u2126/g, '\u03a9') // ohm sign → Greek capital omega
    .replace(/[\u2033\u201c\u201d\u201e]/g, '"') // double prime, curly double quotes
    .replace(/[\u2032\u2018\u2019]/g, "'") // prime, curly single quotes
    .replace(/[\u2212\u2012\u2013\u2014]/g, '-') // minus sign and dashes
    .replace(/\u2044/g, '/') // fraction slash
    .replace(/\u00a0/g, ' ');
}

function unitKey(text: string): string {
  return foldCharacters(text).replace(/[\s.]/g, '');
}

function findInQuantity(quantity: Quantity, unitText: string): UnitDef | undefined {
  const key = unitKey(unitText);
  if (key === '') return undefined;
  const specs = UNIT_SPECS[quantity];
  const exact = specs.find((u) => u.symbol === key || u.caseSensitive?.includes(key));
  if (exact) return strip(exact);
  const lower = key.toLowerCase();
  const loose = specs.find(
    (u) => (!u.caseSensitive && u.symbol.toLowerCase() === lower) || u.aliases.some((a) => a.toLowerCase() === lower),
  );
  return loose ? strip(loose) : undefined;
}

function strip({ symbol, label, toCanonical, fromCanonical }: UnitSpec): UnitDef {
  return { symbol, label, toCanonical, fromCanonical };
}

/** Why a unit is refused for this quantity: it belongs to another quantity, or to none we know. */
function unitMismatchMessage(quantity: Quantity, unitText: string): string {
  const shown = unitText.trim();
  const owners = QUANTITY_LIST.filter((q) => q !== quantity && findInQuantity(q, unitText));
  const measures = QUANTITY_WORDS[quantity].measures;
  if (owners.length === 0) {
    const known = UNITS_BY_QUANTITY[quantity].map((u) => u.symbol).join(', ');
    return `"${shown}" is not a unit this app knows; for ${measures} use ${known}`;
  }
  const kind = owners.length > 1 && owners.every((q) => q === 'vac' || q === 'vdc') ? 'a voltage' : QUANTITY_WORDS[owners[0]].unitKind;
  const hint = quantity === 'pressure' && owners.includes('length') ? ' (inches of water: write inWC)' : '';
  return `${shown} is ${kind} unit, this step measures ${measures}${hint}`;
}

type NumberParse = { ok: true; value: number; rest: string; form: EntryForm } | { ok: false; message: string };

const MIXED = /^(\d+)(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)/;
const FRACTION = /^(\d+)\s*\/\s*(\d+)/;
const DECIMAL = /^(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?/;

function parseNumber(text: string): NumberParse {
  let s = text;
  let sign = 1;
  if (s[0] === '+' || s[0] === '-') {
    sign = s[0] === '-' ? -1 : 1;
    s = s.slice(1).trimStart();
  }
  if (/^(infinity|inf|∞)/i.test(s)) {
    return { ok: false, message: 'An infinite value is not a reading; enter the number the meter shows' };
  }
  if (/^nan\b/i.test(s)) return { ok: false, message: 'NaN is not a number; enter the number the meter shows' };

  const mixed = MIXED.exec(s);
  if (mixed) {
    const [whole, num, den] = [Number(mixed[1]), Number(mixed[2]), Number(mixed[3])];
    if (den === 0) return { ok: false, message: `Division by zero in the fraction ${num}/${den}` };
    if (num >= den) {
      return { ok: false, message: `In a mixed number the fraction must be less than 1 (${mixed[0].trim()})` };
    }
    return { ok: true, value: sign * (whole + num / den), rest: s.slice(mixed[0].length), form: FRACTION_FORM };
  }
  const fraction = FRACTION.exec(s);
  if (fraction) {
    const [num, den] = [Number(fraction[1]), Number(fraction[2])];
    if (den === 0) return { ok: false, message: `Division by zero in the fraction ${num}/${den}` };
    return { ok: true, value: (sign * num) / den, rest: s.slice(fraction[0].length), form: FRACTION_FORM };
  }
  const decimal = DECIMAL.exec(s);
  if (!decimal) return { ok: false, message: `"${text}" is not a number` };
  const literal = decimal[0];
  // "1,250" could be a thousand and a quarter or one and a quarter: refuse rather than guess.
  if (/^[1-9]\d{0,2},\d{3}(?![\d])/.test(literal) && !/[eE]/.test(literal)) {
    return {
      ok: false,
      message: `"${literal}" is ambiguous: write it without a thousands separator, with a point or a comma as the decimal separator`,
    };
  }
  const value = sign * Number(literal.replace(',', '.'));
  if (!Number.isFinite(value)) {
    return { ok: false, message: `${literal} is too large to be a reading (it is infinite as a number)` };
  }
  return { ok: true, value, rest: s.slice(literal.length), form: { fraction: false, decimals: decimalsOf(literal) } };
}

const FRACTION_FORM: EntryForm = { fraction: true, decimals: null };

/** Decimals as written: "120.40" → 2, "1.2e3" → 0, "5e-3" → 3. */
function decimalsOf(literal: string): number {
  const [mantissa, exponent] = literal.toLowerCase().split('e');
  const sep = mantissa.search(/[.,]/);
  const written = sep === -1 ? 0 : mantissa.length - sep - 1;
  return Math.min(9, Math.max(0, written - Number(exponent ?? 0)));
}

// What meters and technicians write for an open circuit: "OL", "O.L.", "0.L", "open", "open circuit", "over range".
const OVER_RANGE = /^(?:o\.?\s?l\.?|0\.l\.?|open(?:\s+circuit)?|over[\s-]?range)(?![a-z])/i;

/** An "OL" entry: the over-range answer on an ohms step, or a message saying why not. */
function parseOverRange(quantity: Quantity, text: string, unit: string | undefined, allowed: boolean): ReadingParse | null {
  const signed = /^[+-]\s*/.exec(text);
  const body = signed ? text.slice(signed[0].length) : text;
  const match = OVER_RANGE.exec(body);
  if (!match) return null;
  if (quantity !== 'ohm') {
    return {
      ok: false,
      message: `OL is only for resistance: on ${QUANTITY_WORDS[quantity].measures} set the meter to a higher range and enter the number it shows`,
    };
  }
  if (signed) return { ok: false, message: 'An open circuit (OL) has no sign: enter OL alone' };
  const rest = body.slice(match[0].length).trim();
  let chosen: UnitDef | undefined = UNITS_BY_QUANTITY.ohm[0];
  if (rest !== '') {
    chosen = findInQuantity('ohm', rest);
    if (!chosen) return { ok: false, message: unitMismatchMessage('ohm', rest) };
  } else if (unit !== undefined && unit.trim() !== '') {
    chosen = findInQuantity('ohm', unit) ?? chosen;
  }
  if (!allowed) {
    return {
      ok: false,
      message: 'OL means the meter is over range (an open circuit): it is saved as an over-range answer, not as a number',
    };
  }
  return { ok: true, overRange: true, unit: chosen.symbol, canonicalUnit: CANONICAL_UNITS.ohm };
}

export interface ParseOptions {
  /** Take "OL" / "open" on an ohms step as the over-range answer (otherwise it is refused with why). */
  overRange?: boolean;
}

/**
 * Parse a typed reading for a quantity. `unit` is the picker's choice; a unit written in the text
 * wins over it. The value comes back in the quantity's canonical unit. With `{ overRange: true }`,
 * "OL" on an ohms step comes back as an `OverRangeResult` (no value).
 */
export function parseReading(quantity: Quantity, text: string, unit?: string): ParseResult;
export function parseReading(quantity: Quantity, text: string, unit: string | undefined, options: ParseOptions): ReadingParse;
export function parseReading(quantity: Quantity, text: string, unit?: string, options: ParseOptions = {}): ReadingParse {
  if (!QUANTITY_LIST.includes(quantity)) return { ok: false, message: `Unknown quantity "${String(quantity)}"` };
  const canonicalUnit = CANONICAL_UNITS[quantity];
  const trimmed = foldCharacters(text ?? '').trim();
  if (trimmed === '') return { ok: false, message: 'Enter a reading: the value is empty' };
  const open = parseOverRange(quantity, trimmed, unit, options.overRange === true);
  if (open) return open;

  const num = parseNumber(trimmed);
  if (!num.ok) return num;

  const unitText = num.rest.trim();
  if (/^[\d.,/]/.test(unitText)) return { ok: false, message: `"${trimmed}" is not a number` };

  let chosen: UnitDef | undefined;
  if (unitText !== '') {
    chosen = findInQuantity(quantity, unitText);
    if (!chosen) return { ok: false, message: unitMismatchMessage(quantity, unitText) };
  } else if (unit !== undefined && unit.trim() !== '') {
    chosen = findInQuantity(quantity, unit);
    if (!chosen) return { ok: false, message: unitMismatchMessage(quantity, unit) };
  } else {
    chosen = UNITS_BY_QUANTITY[quantity][0];
  }

  // Adding 0 turns a typed "-0" into 0 so it never shows as "-0".
  const value = chosen.toCanonical(num.value) + 0;
  const range = PLAUSIBLE_RANGES[quantity];
  if (value < range.min || value > range.max) {
    const entered = `${formatNumber(num.value, 4)} ${chosen.symbol}`;
    const inCanonical = chosen.symbol === canonicalUnit ? '' : ` (${formatNumber(value, 4)} ${canonicalUnit})`;
    return {
      ok: false,
      message:
        `${entered}${inCanonical} is outside the plausible range for ${QUANTITY_WORDS[quantity].measures}, ` +
        `${formatNumber(range.min, 4)} to ${formatNumber(range.max, 4)} ${canonicalUnit}: check the meter function and the unit`,
    };
  }
  return { ok: true, value, unit: chosen.symbol, canonicalUnit, form: num.form };
}

function requireUnit(quantity: Quantity, unitText: string): UnitDef {
  const u = findInQuantity(quantity, unitText);
  if (!u) throw new RangeError(unitMismatchMessage(quantity, unitText));
  return u;
}

/** Convert a value between two units of one quantity (no plausibility check). */
export function convert(quantity: Quantity, value: number, fromUnit: string, toUnit: string): number {
  if (!Number.isFinite(value)) throw new RangeError(`Cannot convert ${value}: not a finite number`);
  const from = requireUnit(quantity, fromUnit);
  const to = requireUnit(quantity, toUnit);
  if (from.symbol === to.symbol) return value;
  return to.fromCanonical(from.toCanonical(value));
}

/**
 * At least `significant` significant figures, but never rounding away integer digits: a 1234 Ω
 * reading shows as 1234, not 1230. Trailing zeros are dropped.
 */
function formatNumber(value: number, significant: number): string {
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(9, Math.max(0, significant - 1 - magnitude));
  // Round on the shortest decimal form ("3.175" → 3.18) rather than on the binary value, which
  // toFixed sees as 3.17499… and rounds down, against what anyone reading the number expects.
  const plain = String(Math.abs(value));
  let s = plain.includes('e')
    ? value.toFixed(decimals)
    : (Math.sign(value) * Number(`${Math.round(Number(`${plain}e${decimals}`))}e-${decimals}`)).toFixed(decimals);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** "1/8", "1 1/8", "2": the value as a reduced fraction of 64ths, or null if not close to one. */
function inchFraction(value: number, tolerance: number): string | null {
  const sixtyFourths = Math.round(Math.abs(value) * 64);
  if (Math.abs(Math.abs(value) - sixtyFourths / 64) > tolerance) return null;
  const whole = Math.floor(sixtyFourths / 64);
  const rest = sixtyFourths % 64;
  const sign = value < 0 && sixtyFourths !== 0 ? '-' : '';
  if (rest === 0) return `${sign}${whole}`;
  const g = gcd(rest, 64);
  const frac = `${rest / g}/${64 / g}`;
  return whole === 0 ? `${sign}${frac}` : `${sign}${whole} ${frac}`;
}

export interface FormatOptions {
  /** Minimum significant figures (default 3). */
  significant?: number;
  /** For inches: show a fraction (to 1/64) when the value is that close to one. */
  fraction?: boolean;
  /** How close to a 64th, in inches, counts as "that close" (default 0.0005 in). */
  fractionTolerance?: number;
  /** Exactly this many decimals, trailing zeros kept: the precision a reading was entered with. */
  decimals?: number;
}

/** A canonical value shown in `unit` (default the canonical one), e.g. "26.4 VAC", "1/8 in". */
export function formatReading(quantity: Quantity, canonicalValue: number, unit?: string, opts: FormatOptions = {}): string {
  if (!Number.isFinite(canonicalValue)) throw new RangeError(`Cannot format ${canonicalValue}: not a finite number`);
  const target = unit ? requireUnit(quantity, unit) : UNITS_BY_QUANTITY[quantity][0];
  const shown = target.fromCanonical(canonicalValue);
  if (opts.fraction && target.symbol === 'in') {
    const frac = inchFraction(shown, opts.fractionTolerance ?? 0.0005);
    if (frac !== null) return `${frac} ${target.symbol}`;
  }
  if (opts.decimals !== undefined) return `${fixedNumber(shown, opts.decimals)} ${target.symbol}`;
  return `${formatNumber(shown, opts.significant ?? 3)} ${target.symbol}`;
}

/** The value with exactly `decimals` decimals, rounded on its shortest decimal form like formatNumber. */
function fixedNumber(value: number, decimals: number): string {
  const d = Math.min(9, Math.max(0, Math.trunc(decimals)));
  const plain = String(Math.abs(value));
  const rounded = plain.includes('e') ? Math.abs(value) : Number(`${Math.round(Number(`${plain}e${d}`))}e-${d}`);
  const s = (Math.sign(value) * rounded).toFixed(d);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** Format options that show a value the way a reading was entered: its fraction, or its decimals. */
export function formatOptionsFor(form: EntryForm | undefined): FormatOptions {
  if (!form) return { fraction: true };
  if (form.fraction) return { fraction: true };
  return { decimals: form.decimals ?? 0 };
}

/**
 * A typed reading as the wizard shows it back: in the unit it was entered in, to the precision it
 * was entered with ("120.4 VAC", "1 1/8 in", "3.5 inWC" for "3,5"), or "OL (open circuit)".
 * Null when the text is not a reading of the quantity.
 */
export function formatEntry(quantity: Quantity, text: string, unit?: string): string | null {
  const parsed = parseReading(quantity, text, unit, { overRange: true });
  if (!parsed.ok) return null;
  if (parsed.overRange) return OVER_RANGE_TEXT;
  return formatReading(quantity, parsed.value, parsed.unit, formatOptionsFor(parsed.form));
}

/**
 * The unit a quantity is shown in for a unit system. Electrical units are the same everywhere.
 * For metric pressure, a value of 10 kPa or more is shown in kPa, smaller ones in Pa.
 */
export function displayUnitFor(quantity: Quantity, system: UnitSystem, canonicalValue?: number): string {
  if (system === 'metric') {
    if (quantity === 'length') return 'mm';
    if (quantity === 'pressure') {
      const pa = canonicalValue === undefined ? 0 : Math.abs(canonicalValue * PA_PER_INWC);
      return pa >= 10_000 ? 'kPa' : 'Pa';
    }
  }
  return CANONICAL_UNITS[quantity];
}
