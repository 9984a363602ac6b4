/** Test helper: independent numerical references for the engine's closed forms. */

/** Independent RK4 integration of dV_C/dt = −I(V_C)/C under constant power, I from P = (V_C − I·R)·I. */
/** Returns the time to vEnd, or tMax when the bank lasts at least that long. */
export function rk4ConstantPower(c: number, r: number, v0: number, power: number, vEnd: number, dt: number, tMax = Infinity): number {
  const current = (vc: number): number => (r === 0 ? power / vc : (vc - Math.sqrt(vc * vc - 4 * power * r)) / (2 * r));
  const terminal = (vc: number): number => vc - current(vc) * r;
  const canDeliver = (vc: number): boolean => vc * vc >= 4 * power * r;
  let vc = v0;
  let t = 0;
  const f = (v: number): number => -current(v) / c;
  while (t < tMax) {
    const k1 = f(vc);
    const v2 = vc + (dt / 2) * k1;
    const v3Ok = canDeliver(v2);
    if (!v3Ok) break;
    const k2 = f(v2);
    const v3 = vc + (dt / 2) * k2;
    if (!canDeliver(v3)) break;
    const k3 = f(v3);
    const v4 = vc + dt * k3;
    if (!canDeliver(v4)) break;
    const k4 = f(v4);
    const next = vc + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    if (!canDeliver(next) || terminal(next) <= vEnd) {
      // linear interpolation of the crossing inside the last step
      if (canDeliver(next)) {
        const a = terminal(vc) - vEnd;
        const b = terminal(next) - vEnd;
        return t + (dt * a) / (a - b);
      }
      break;
    }
    vc = next;
    t += dt;
  }
  return t;
}
