/**
 * Parse and format engineering values (SI units as plain numbers).
 *
 * Accepted input: a decimal number (optionally with an exponent, `1e-3`), optional spaces, then
 * an optional SI prefix (p n u µ μ m k M G) and an optional unit symbol: `470 µF`, `470u`,
 * `0.47 mF`, `2.2 mohm`, `12.5 kJ`, `1.5 kWh`.
 *
 * Decimal comma: a single comma is read as the decimal mark (`3,5 V` = 3.5 V), because many
 * shops write numbers that way. A comma followed by exactly three digits (`1,500`) is refused
 * as ambiguous (it could be a thousands separator), and a number may not contain both a comma
 * and a point.
 */

export type QuantityUnit = "F" | "V" | "Ω" | "A" | "J" | "W" | "s" | "kg" | "m³" | "Wh" | "m";

export type ParseQuantityResult = { ok: true; value: number; unit: QuantityUnit | null } | { ok: false; message: string };

export interface ParseQuantityOptions {
  /** accept 0 (refused by default) */
  allowZero?: boolean;
  /** accept negative values (refused by default) */
  allowNegative?: boolean;
}

const MICRO = "\u00b5"; // MICRO SIGN, the form we print
const GREEK_MU = "\u03bc"; // GREEK SMALL LETTER MU, also accepted
const OHM = "\u03a9"; // GREEK CAPITAL LETTER OMEGA, the form we print
const OHM_SIGN = "\u2126"; // OHM SIGN, also accepted

/** SI prefix → power of ten */
const PREFIXES: Record<string, number> = {
  p: -12,
  n: -9,
  u: -6,
  [MICRO]: -6,
  [GREEK_MU]: -6,
  m: -3,
  k: 3,
  M: 6,
  G: 9,
};

interface UnitSymbol {
  symbol: string;
  /** compare case-insensitively (`uf`, `mohm`) */
  anyCase?: boolean;
  /** power of ten of this symbol relative to the unit (`g` is -3 relative to kg) */
  exponent?: number;
  /** plain factor relative to the unit (`min` is 60 s) */
  factor?: number;
  /** may take an SI prefix */
  prefixed: boolean;
}

interface UnitDef {
  name: string; // plural, for messages: "farads"
  symbols: UnitSymbol[];
  /** a prefix alone (`470u`) is read as this unit */
  barePrefix: boolean;
}

const UNITS: Record<QuantityUnit, UnitDef> = {
  F: { name: "farads", barePrefix: true, symbols: [{ symbol: "F", anyCase: true, prefixed: true }] },
  V: { name: "volts", barePrefix: true, symbols: [{ symbol: "V", anyCase: true, prefixed: true }] },
  Ω: {
    name: "ohms",
    barePrefix: true,
    symbols: [
      { symbol: OHM, prefixed: true },
      { symbol: OHM_SIGN, prefixed: true },
      { symbol: "ohms", anyCase: true, prefixed: true },
      { symbol: "ohm", anyCase: true, prefixed: true },
    ],
  },
  A: { name: "amperes", barePrefix: true, symbols: [{ symbol: "A", anyCase: true, prefixed: true }] },
  J: { name: "joules", barePrefix: true, symbols: [{ symbol: "J", anyCase: true, prefixed: true }] },
  W: { name: "watts", barePrefix: true, symbols: [{ symbol: "W", anyCase: true, prefixed: true }] },
  s: {
    name: "seconds",
    barePrefix: true,
    symbols: [
      { symbol: "s", prefixed: true },
      { symbol: "min", prefixed: false, factor: 60 },
      { symbol: "h", prefixed: false, factor: 3600 },
    ],
  },
  kg: {
    name: "kilograms",
    barePrefix: false,
    symbols: [
      { symbol: "kg", prefixed: false },
      { symbol: "g", prefixed: false, exponent: -3 },
      { symbol: "mg", prefixed: false, exponent: -6 },
    ],
  },
  "m³": {
    name: "cubic metres",
    barePrefix: false,
    symbols: [
      { symbol: "m³", prefixed: false },
      { symbol: "m3", prefixed: false },
      { symbol: "L", anyCase: true, prefixed: false, exponent: -3 },
      { symbol: "mL", anyCase: true, prefixed: false, exponent: -6 },
      { symbol: "cm³", prefixed: false, exponent: -6 },
      { symbol: "cm3", prefixed: false, exponent: -6 },
      { symbol: "mm³", prefixed: false, exponent: -9 },
      { symbol: "mm3", prefixed: false, exponent: -9 },
    ],
  },
  Wh: { name: "watt-hours", barePrefix: true, symbols: [{ symbol: "Wh", anyCase: true, prefixed: true }] },
  // lengths (cell dimensions): `60.7 mm`, `0.0607 m`, `6 cm`; a bare `m` after a number is milli, so lengths always name their unit
  m: {
    name: "metres",
    barePrefix: false,
    symbols: [
      { symbol: "m", prefixed: true },
      { symbol: "cm", prefixed: false, exponent: -2 },
    ],
  },
};

/**
 * Units recognised when the caller names none. Length is left out: there `m` after a number keeps
 * meaning milli (`470m` = 0.47), as it always has.
 */
const ALL_UNITS = (Object.keys(UNITS) as QuantityUnit[]).filter((u) => u !== "m");

const NUMBER_RE = /^([+-])?(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE]([+-]?\d{1,3}))?/;

interface SuffixMatch {
  unit: QuantityUnit;
  exponent: number;
  factor: number;
}

function matchSuffix(suffix: string, unit: QuantityUnit, allowBarePrefix: boolean): SuffixMatch | null {
  const def = UNITS[unit];
  let best: SuffixMatch | null = null;
  let bestLen = -1;
  for (const sym of def.symbols) {
    const tail = suffix.slice(suffix.length - sym.symbol.length);
    if (suffix.length < sym.symbol.length) continue;
    const same = sym.anyCase ? tail.toLowerCase() === sym.symbol.toLowerCase() : tail === sym.symbol;
    if (!same) continue;
    const head = suffix.slice(0, suffix.length - sym.symbol.length).trim();
    let prefixExp = 0;
    if (head !== "") {
      if (!sym.prefixed) continue;
      const p = PREFIXES[head];
      if (p === undefined) continue;
      prefixExp = p;
    }
    if (sym.symbol.length > bestLen) {
      bestLen = sym.symbol.length;
      best = { unit, exponent: prefixExp + (sym.exponent ?? 0), factor: sym.factor ?? 1 };
    }
  }
  if (best) return best;
  if (allowBarePrefix && def.barePrefix) {
    const p = PREFIXES[suffix];
    if (p !== undefined) return { unit, exponent: p, factor: 1 };
  }
  return null;
}

function refuse(input: string, unit: QuantityUnit | undefined): { ok: false; message: string } {
  return {
    ok: false,
    message: unit ? `"${input}" is not a value in ${UNITS[unit].name}` : `"${input}" is not a value with a known unit`,
  };
}

/** Parse an engineering value; see the module comment for the accepted forms. */
export function parseQuantity(input: string, unit?: QuantityUnit, options: ParseQuantityOptions = {}): ParseQuantityResult {
  const text = input.trim();
  if (text === "") {
    return { ok: false, message: unit ? `Enter a value in ${UNITS[unit].name}` : "Enter a value" };
  }
  const m = NUMBER_RE.exec(text);
  if (!m) return refuse(input, unit);
  const sign = m[1] === "-" ? -1 : 1;
  let mantissa = m[2] ?? "";
  const ownExp = m[3] ? Number(m[3]) : 0;
  if (mantissa.includes(",")) {
    if (/,\d{3}$/.test(mantissa)) {
      return {
        ok: false,
        message: `"${input}" is ambiguous: write the decimal mark as a point, without thousands separators`,
      };
    }
    mantissa = mantissa.replace(",", ".");
  }
  const suffix = text.slice(m[0].length).trim();

  let match: SuffixMatch | null = null;
  if (suffix === "") {
    match = { unit: unit ?? ("" as QuantityUnit), exponent: 0, factor: 1 };
  } else if (unit) {
    match = matchSuffix(suffix, unit, true);
  } else {
    for (const u of ALL_UNITS) {
      match = matchSuffix(suffix, u, false);
      if (match) break;
    }
    if (!match && PREFIXES[suffix] !== undefined) {
      match = { unit: "" as QuantityUnit, exponent: PREFIXES[suffix] ?? 0, factor: 1 };
    }
  }
  if (!match) return refuse(input, unit);

  // Build the decimal string and let Number() round once: 470e-6 is exactly the double nearest 0.00047.
  const magnitude = Number(`${mantissa}e${ownExp + match.exponent}`) * match.factor;
  const value = sign * magnitude;
  if (!Number.isFinite(value)) {
    return { ok: false, message: `"${input}" is too large` };
  }
  if (value < 0 && !options.allowNegative) {
    return { ok: false, message: `"${input}" must not be negative` };
  }
  if (value === 0 && !options.allowZero) {
    return { ok: false, message: `"${input}" must be greater than zero` };
  }
  const resultUnit = match.unit === ("" as QuantityUnit) ? (unit ?? null) : match.unit;
  return { ok: true, value: value === 0 ? 0 : value, unit: resultUnit };
}

const FORMAT_PREFIXES: [number, string][] = [
  [-12, "p"],
  [-9, "n"],
  [-6, MICRO],
  [-3, "m"],
  [0, ""],
  [3, "k"],
  [6, "M"],
  [9, "G"],
];

function roundSig(x: number, digits: number): number {
  return Number(x.toPrecision(digits));
}

function formatPrefixed(abs: number, symbol: string, digits: number, minExp: number, maxExp: number): string {
  let exp3 = Math.floor(Math.log10(abs) / 3) * 3;
  exp3 = Math.min(maxExp, Math.max(minExp, exp3));
  let mant = roundSig(abs / 10 ** exp3, digits);
  if (mant >= 1000 && exp3 < maxExp) {
    exp3 += 3;
    mant = roundSig(abs / 10 ** exp3, digits);
  }
  const prefix = FORMAT_PREFIXES.find(([e]) => e === exp3)?.[1] ?? "";
  return `${String(mant)} ${prefix}${symbol}`;
}

/**
 * Format a value with an SI prefix and `digits` significant figures (3 by default):
 * 0.00047 F → "470 µF", 1500 F → "1.5 kF". Mass is shown in kg or g, volume in m³, L, cm³
 * or mm³, time in s (or ms, µs, … below one second). The output parses back with parseQuantity.
 */
export function formatQuantity(value: number, unit: string, opts: { digits?: number } = {}): string {
  const digits = opts.digits ?? 3;
  const symbol = unit === "ohm" ? OHM : unit;
  if (!Number.isFinite(value)) return "—";
  if (value === 0) return `0 ${symbol}`;
  if (value < 0) return `-${formatQuantity(-value, unit, opts)}`;
  switch (symbol) {
    case "kg":
      if (value >= 1) return `${String(roundSig(value, digits))} kg`;
      if (value >= 1e-3) return `${String(roundSig(value * 1e3, digits))} g`;
      return `${String(roundSig(value * 1e6, digits))} mg`;
    case "m³":
      if (value >= 1) return `${String(roundSig(value, digits))} m³`;
      if (value >= 1e-3) return `${String(roundSig(value * 1e3, digits))} L`;
      if (value >= 1e-6) return `${String(roundSig(value * 1e6, digits))} cm³`;
      return `${String(roundSig(value * 1e9, digits))} mm³`;
    case "s":
      return formatPrefixed(value, "s", digits, -12, 0);
    default:
      return formatPrefixed(value, symbol, digits, -12, 9);
  }
}

/** A duration as people read it: "4.2 s", "12 min", "3.5 h", "670 days"; "—" when it never ends. */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "—";
  const sig = (x: number) => String(Number(x.toPrecision(2 + (x >= 100 ? 1 : 0))));
  if (seconds < 120) return formatQuantity(seconds, "s");
  if (seconds < 2 * 3600) return `${sig(seconds / 60)} min`;
  if (seconds < 48 * 3600) return `${sig(seconds / 3600)} h`;
  return `${sig(seconds / 86400)} days`;
}
