/**
 * Discharge of a bank modelled as an ideal capacitance C in series with its ESR (DESIGN §3.3).
 * Every function returns the time to reach vEnd and about 100 evenly spaced points { t, v }
 * for charts, where v is the terminal voltage the load sees.
 */

export interface DischargePoint {
  t: number;
  v: number;
}

export interface DischargeResult {
  /** time to reach vEnd (s); Infinity when it is never reached */
  seconds: number;
  points: DischargePoint[];
}

export interface ConstantPowerResult extends DischargeResult {
  /** what ended the discharge: the terminal voltage reached vEnd, or the load asked for more than the bank can deliver */
  limitedBy: "min-voltage" | "max-power";
}

const DEFAULT_POINTS = 100;
/** Most points a curve is drawn with: far more than a chart can show, so the loops stay bounded. */
export const MAX_CURVE_POINTS = 10_000;

function pointCount(points: number | undefined): number {
  const n = Math.floor(points ?? DEFAULT_POINTS);
  return n >= 2 ? Math.min(n, MAX_CURVE_POINTS) : 2;
}

function assertPositive(name: string, value: number): void {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be a positive number`);
}

function assertNonNegative(name: string, value: number): void {
  if (!(value >= 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be zero or a positive number`);
}

/** Constant current I: V(t) = V₀ − I·ESR − I·t/C. */
export function constantCurrentDischarge(input: {
  capacitance: number;
  esr: number;
  v0: number;
  current: number;
  vEnd: number;
  points?: number;
}): DischargeResult {
  const { capacitance: c, esr, v0, current: i, vEnd } = input;
  assertPositive("capacitance", c);
  assertNonNegative("esr", esr);
  assertNonNegative("v0", v0);
  assertNonNegative("current", i);
  assertNonNegative("vEnd", vEnd);
  const terminal = (t: number): number => v0 - i * esr - (i * t) / c;
  let seconds: number;
  if (terminal(0) <= vEnd) seconds = 0;
  else if (i === 0) seconds = Infinity;
  else seconds = ((v0 - i * esr - vEnd) * c) / i;
  const n = pointCount(input.points);
  const points: DischargePoint[] = [];
  if (Number.isFinite(seconds)) {
    for (let k = 0; k < n; k++) {
      const t = (seconds * k) / (n - 1);
      points.push({ t, v: k === n - 1 && seconds > 0 ? vEnd : Math.max(terminal(t), 0) });
    }
  } else {
    points.push({ t: 0, v: v0 }, { t: 1, v: v0 });
  }
  return { seconds, points };
}

/**
 * The antiderivative used by the constant-power closed form.
 * With a² = 4·P·ESR, the load current at capacitor voltage V is I = (V − √(V² − a²)) / (2·ESR),
 * so dt = −C/I·dV = −C·(V + √(V² − a²)) / (2P)·dV and
 * t(V₀ → V₁) = C/(2P)·[F(V₀) − F(V₁)], F(V) = V²/2 + V·√(V² − a²)/2 − (a²/2)·ln(V + √(V² − a²)).
 * With ESR = 0 this is t = C·(V₀² − V₁²)/(2P), i.e. V(t) = √(V₀² − 2·P·t/C).
 */
function antiderivative(v: number, a2: number): number {
  const root = Math.sqrt(Math.max(0, v * v - a2));
  const log = a2 > 0 ? 0.5 * a2 * Math.log(v + root) : 0;
  return 0.5 * v * v + 0.5 * v * root - log;
}

/** Capacitor voltage at which a constant-power discharge ends, and why. */
function constantPowerEnd(esr: number, power: number, vEnd: number): { vc: number; limitedBy: "min-voltage" | "max-power" } {
  if (esr === 0) return { vc: vEnd, limitedBy: "min-voltage" };
  const pr = power * esr;
  // The terminal voltage on the working branch is never below √(P·ESR) (reached at maximum power).
  if (vEnd > 0 && vEnd * vEnd >= pr) return { vc: vEnd + pr / vEnd, limitedBy: "min-voltage" };
  return { vc: 2 * Math.sqrt(pr), limitedBy: "max-power" };
}

/**
 * Seconds a constant-power load P is carried from capacitor voltage v0 until the terminal voltage
 * falls to vEnd or P exceeds V_C²/(4·ESR). Closed form, no allocation (used in the arrangement search).
 */
export function constantPowerSeconds(capacitance: number, esr: number, v0: number, power: number, vEnd: number): number {
  if (power <= 0) return Infinity;
  const a2 = 4 * power * esr;
  if (v0 * v0 <= a2) return 0;
  const end = constantPowerEnd(esr, power, vEnd);
  if (v0 <= end.vc) return 0;
  return (capacitance / (2 * power)) * (antiderivative(v0, a2) - antiderivative(end.vc, a2));
}

/**
 * Constant power P (DESIGN §3.3). The time to the end is exact (closed form above, checked in the
 * tests against RK4 integration of dV_C/dt = −I/C); the chart points are the same closed form
 * inverted by bisection to `tolerance` (relative, default 1e-9).
 */
export function constantPowerDischarge(input: {
  capacitance: number;
  esr: number;
  v0: number;
  power: number;
  vEnd: number;
  points?: number;
  tolerance?: number;
}): ConstantPowerResult {
  const { capacitance: c, esr, v0, power, vEnd } = input;
  assertPositive("capacitance", c);
  assertNonNegative("esr", esr);
  assertPositive("v0", v0);
  assertPositive("power", power);
  assertNonNegative("vEnd", vEnd);
  const tolerance = input.tolerance ?? 1e-9;
  const a2 = 4 * power * esr;
  const end = constantPowerEnd(esr, power, vEnd);
  const terminal = (vc: number): number => {
    const root = Math.sqrt(Math.max(0, vc * vc - a2));
    return 0.5 * (vc + root); // V_C − I·ESR on the working branch
  };
  const seconds = constantPowerSeconds(c, esr, v0, power, vEnd);
  const n = pointCount(input.points);
  const points: DischargePoint[] = [];
  if (seconds === 0) {
    points.push({ t: 0, v: v0 * v0 <= a2 ? 0.5 * v0 : terminal(v0) }, { t: 0, v: Math.min(vEnd, terminal(v0)) });
    return { seconds, points, limitedBy: v0 * v0 <= a2 ? "max-power" : end.limitedBy };
  }
  const f0 = antiderivative(v0, a2);
  const k = c / (2 * power);
  points.push({ t: 0, v: terminal(v0) });
  let hi = v0;
  for (let p = 1; p < n - 1; p++) {
    const t = (seconds * p) / (n - 1);
    // find V_C in [end.vc, hi] with k·(F(v0) − F(V_C)) = t; F is increasing in V_C
    let lo = end.vc;
    let top = hi;
    for (let iter = 0; iter < 200 && top - lo > tolerance * v0; iter++) {
      const mid = 0.5 * (lo + top);
      if (k * (f0 - antiderivative(mid, a2)) > t) lo = mid;
      else top = mid;
    }
    const vc = 0.5 * (lo + top);
    hi = vc;
    points.push({ t, v: terminal(vc) });
  }
  points.push({ t: seconds, v: terminal(end.vc) });
  return { seconds, points, limitedBy: end.limitedBy };
}

/** Resistive discharge: V(t) = V₀·e^(−t/RC). */
export function resistiveDischarge(input: { capacitance: number; resistance: number; v0: number; vEnd: number; points?: number }): DischargeResult {
  const { capacitance: c, resistance: r, v0, vEnd } = input;
  assertPositive("capacitance", c);
  assertPositive("resistance", r);
  assertNonNegative("v0", v0);
  assertNonNegative("vEnd", vEnd);
  const tau = r * c;
  let seconds: number;
  if (v0 <= vEnd) seconds = 0;
  else if (vEnd === 0) seconds = Infinity;
  else seconds = tau * Math.log(v0 / vEnd);
  const n = pointCount(input.points);
  const horizon = Number.isFinite(seconds) ? seconds : 5 * tau;
  const points: DischargePoint[] = [];
  for (let k = 0; k < n; k++) {
    const t = (horizon * k) / (n - 1);
    points.push({ t, v: v0 * Math.exp(-t / tau) });
  }
  return { seconds, points };
}
